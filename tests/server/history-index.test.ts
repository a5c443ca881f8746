import { CompiledQuery, type Compilable } from 'kysely';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { cellHistoryQuery } from '../../server/db/history.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

// How SQLite says which index a query uses: EXPLAIN QUERY PLAN (sqlite.org/eqp.html) prints
// "SEARCH history USING INDEX …" for an index lookup and "SCAN history" for a full table scan.

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

async function planOf(query: Compilable<unknown>): Promise<string> {
  const { sql: text, parameters } = query.compile();
  const result = await t.db.executeQuery<{ detail: string }>(CompiledQuery.raw(`explain query plan ${text}`, [...parameters]));
  return result.rows.map((r) => r.detail).join('\n');
}

describe('history lookups use an index', () => {
  it('when a cell’s history is asked for, then SQLite searches history_circuit_column and neither scans the table nor sorts', async () => {
    const plan = await planOf(cellHistoryQuery(t.db, 7, 'zs'));
    expect(plan).toMatch(/SEARCH history USING INDEX history_circuit_column \(circuit_id=\? AND column_key=\?\)/);
    expect(plan).not.toMatch(/SCAN history/);
    expect(plan).not.toMatch(/USE TEMP B-TREE FOR ORDER BY/);
  });

  it('when a circuit detail is checked for a change meanwhile, then the same index serves it', async () => {
    const query = t.db
      .selectFrom('history')
      .select('column_key')
      .where('circuit_id', '=', 7)
      .where('action', '=', 'field')
      .where('version', '>', 2)
      .where('column_key', 'in', ['ratingA', 'deviceType']);
    const plan = await planOf(query);
    expect(plan).toMatch(/SEARCH history USING INDEX history_circuit_column \(circuit_id=\? AND column_key=\?\)/);
  });
});
