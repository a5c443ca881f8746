import { CompiledQuery, sql, type Compilable } from 'kysely';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { cellHistoryQuery } from '../../server/db/history.ts';
import { createTestApp, testPostgresUrl, type TestApp } from '../helpers/test-app.ts';

// The PostgreSQL side of history-index.test.ts (which reads SQLite's EXPLAIN QUERY PLAN). On a
// test's three-row table PostgreSQL rightly prefers reading the whole table, so sequential scans
// are switched off for the one transaction: what is asked is whether the index *can* serve the
// query. EXPLAIN's "Index Scan using <index> on <table>" and "Sort" nodes: postgresql.org/docs/15/using-explain.html.

describe.skipIf(!testPostgresUrl)('history lookups use an index (PostgreSQL)', () => {
  let t: TestApp;
  beforeEach(async () => {
    t = await createTestApp();
  });
  afterEach(() => t.close());

  async function planOf(query: Compilable<unknown>): Promise<string> {
    const { sql: text, parameters } = query.compile();
    return t.db.transaction().execute(async (trx) => {
      await sql`set local enable_seqscan = off`.execute(trx);
      const result = await trx.executeQuery<{ 'QUERY PLAN': string }>(CompiledQuery.raw(`explain ${text}`, [...parameters]));
      return result.rows.map((r) => r['QUERY PLAN']).join('\n');
    });
  }

  it('when a cell’s history is asked for, then history_circuit_column serves it in id order (no sort)', async () => {
    const plan = await planOf(cellHistoryQuery(t.db, 7, 'zs'));
    expect(plan).toMatch(/Index Scan using history_circuit_column on history/);
    expect(plan).not.toMatch(/Sort/);
  });

  it('when a circuit detail is checked for a change meanwhile, then the same index serves it', async () => {
    const query = t.db
      .selectFrom('history')
      .select('column_key')
      .where('circuit_id', '=', 7)
      .where('action', '=', 'field')
      .where('version', '>', 2)
      .where('column_key', 'in', ['ratingA', 'deviceType']);
    expect(await planOf(query)).toMatch(/Index (Only )?Scan using history_circuit_column on history|Bitmap Index Scan on history_circuit_column/);
  });
});
