import fc from 'fast-check';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import {
  boardChangesResponseSchema,
  boardDetailResponseSchema,
  circuitResponseSchema,
  writeCellResponseSchema,
} from '../../shared/schemas/boards.ts';
import { boardToCheckInput, checkInputSchema } from '../../shared/schemas/check.ts';
import { readingKeys } from '../../shared/schemas/columns.ts';
import { storedValueFindingCode } from '../../shared/schemas/fit-circuit.ts';
import { loadBoardWithContext } from '../../server/db/boards.ts';
import { nextCircuitNumber } from '../../server/db/circuits.ts';
import { findingsFor } from '../../server/findings.ts';
import { mergeChanges } from '../../src/features/board-console/sync/merge.ts';
import type { BoardDetail } from '../../shared/schemas/boards.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

// The oracle here is the project's own published contract: the zod response schemas in
// shared/schemas/ that the client parses every answer with, and the checker's input schema that
// POST /api/check takes. A value the server makes must fit them.

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

/** The board as served parses with its response schema, and as the checker's input. */
async function expectBoardServedWhole(agent: Awaited<ReturnType<TestApp['signIn']>>) {
  const res = await agent.get(`/api/boards/${t.ids.board}`);
  expect(res.status).toBe(200);
  const board = boardDetailResponseSchema.parse(res.body);
  checkInputSchema.parse(boardToCheckInput(board));
  return board;
}

describe('the next circuit number', () => {
  it.each([
    [['1', '2', '12'], '13', 'one more than the highest (common practice: ways are numbered in order)'],
    [['1', '2', '4L1', '4L2', '4L3'], '5', 'a three-phase group counts as its way number'],
    [[], '1', 'an empty board starts at 1'],
    [['999999999999'], '1', 'one more would need 13 characters; the field takes 12, so the lowest free number'],
    [['1', '2', '999999999999'], '3', 'the lowest free number after the gap'],
  ])('when the board has %j, then %s (%s)', (numbers, expected) => {
    const next = nextCircuitNumber(numbers);
    expect(next).toBe(expected);
  });

  it('when a circuit with the longest number is followed by a new one, then the new number fits and the board opens', async () => {
    const agent = await t.signIn('tester');
    const long = await agent.post(`/api/boards/${t.ids.board}/circuits`).send({ number: '999999999999' });
    expect(long.status).toBe(201);
    const next = await agent.post(`/api/boards/${t.ids.board}/circuits`).send({});
    expect(next.status).toBe(201);
    expect(circuitResponseSchema.parse(next.body).circuit.number).toBe('4');
    await expectBoardServedWhole(agent);
  });
});

describe('a stored value that does not fit its field', () => {
  it('when the database holds a too-long number, an impossible count and an over-long reading, then the board still opens with an error finding on each', async () => {
    const circuit = await t.db.selectFrom('circuits').select('id').where('board_id', '=', t.ids.board).orderBy('position').executeTakeFirstOrThrow();
    // "Somehow": written behind the API's back, as an old version or a hand edit could have.
    await t.db.updateTable('circuits').set({ number: '1234567890123456', points: 5000 }).where('id', '=', circuit.id).execute();
    await t.db.insertInto('cells').values({ circuit_id: circuit.id, column_key: 'zs', text: '0.44'.padEnd(60, ' x'), reason: null, version: 1, updated_by: null, updated_at: '2026-12-01T10:00:00Z' }).execute();

    const agent = await t.signIn('tester');
    const board = await expectBoardServedWhole(agent);
    const served = board.circuits.find((c) => c.id === circuit.id)!;
    expect(served.number).toBe('123456789012');
    expect(served.points).toBeNull();
    expect(served.cells.zs?.text.length).toBe(40);
    const unfit = board.findings.filter((f) => f.code === storedValueFindingCode);
    expect(unfit.map((f) => [f.circuitId, f.severity, f.columns])).toEqual([
      [circuit.id, 'error', []],
      [circuit.id, 'error', ['points']],
      [circuit.id, 'error', ['zs']],
    ]);
    expect(unfit[0]!.message).toMatch(/stored circuit number “1234567890123456” does not fit.*shown as “123456789012” until it is corrected/);
    // The stored values are left alone for a person to correct.
    expect((await t.db.selectFrom('circuits').select('number').where('id', '=', circuit.id).executeTakeFirstOrThrow()).number).toBe('1234567890123456');

    // Correcting the field through the API clears the finding.
    const fixed = await agent.patch(`/api/boards/${t.ids.board}/circuits/${circuit.id}`).send({ version: served.version, changes: { number: '1', points: 8 } });
    expect(fixed.status).toBe(200);
    const after = await expectBoardServedWhole(agent);
    expect(after.findings.filter((f) => f.code === storedValueFindingCode).map((f) => f.columns)).toEqual([['zs']]);
  });
});

// ---- property: after any accepted write, the board as served parses ----

type Op =
  | { kind: 'add'; number?: string; afterIndex?: number }
  | { kind: 'patch'; index: number; changes: Record<string, unknown> }
  | { kind: 'cell'; index: number; column: string; text: string }
  | { kind: 'remove'; index: number }
  | { kind: 'board'; changes: Record<string, unknown> };

// Numbers near the field's edges come often: the longest (12 characters), the largest, labels.
const numberText = fc.oneof(
  { arbitrary: fc.bigInt({ min: 0n, max: 10n ** 12n - 1n }).map(String), weight: 2 },
  { arbitrary: fc.constant('999999999999'), weight: 2 },
  { arbitrary: fc.constantFrom('99999999999', '4L1', '1e3', '0', '007'), weight: 2 },
  { arbitrary: fc.string({ minLength: 0, maxLength: 14 }), weight: 1 },
);
const detailChange = fc.oneof(
  fc.record({ number: numberText }),
  fc.record({ points: fc.oneof(fc.integer({ min: -5, max: 1200 }), fc.constant(null)) }),
  fc.record({ ratingA: fc.oneof(fc.double({ min: -1, max: 7000, noNaN: true }), fc.constant(null)) }),
  fc.record({ kind: fc.constantFrom('ring', 'radial', 'spur', 'distribution', 'loop') }),
  fc.record({ description: fc.string({ maxLength: 220 }) }),
  fc.record({ rcdType: fc.constantFrom('A', 'AC', 'B', 'F', null, 'Z') }),
);
const op: fc.Arbitrary<Op> = fc.oneof(
  { arbitrary: fc.record({ kind: fc.constant('add' as const), number: fc.option(numberText, { nil: undefined, freq: 2 }), afterIndex: fc.option(fc.nat(6), { nil: undefined }) }), weight: 3 },
  { arbitrary: fc.record({ kind: fc.constant('patch' as const), index: fc.nat(6), changes: detailChange }), weight: 2 },
  fc.record({ kind: fc.constant('cell' as const), index: fc.nat(6), column: fc.constantFrom(...readingKeys), text: fc.string({ maxLength: 45 }) }),
  fc.record({ kind: fc.constant('remove' as const), index: fc.nat(6) }),
  fc.record({ kind: fc.constant('board' as const), changes: fc.oneof(fc.record({ zdbOhm: fc.double({ min: -1, max: 120, noNaN: true }) }), fc.record({ reference: fc.string({ maxLength: 70 }) })) }),
);

const sortedJson = (list: unknown[]) => list.map((x) => JSON.stringify(x)).sort();

describe('property: every accepted write leaves a board that is served whole', () => {
  it('when any sequence of writes is sent, then each one answers below 500, and after each accepted one the board as served parses with its response schema, equals the board read afresh from the database, and a second console following the changes feed sees the same', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(op, { minLength: 1, maxLength: 8 }), async (ops) => {
        const app = await createTestApp();
        try {
          const agent = await app.signIn('tester');
          const follower = await app.signIn('reviewer');
          const base = `/api/boards/${app.ids.board}`;
          let followed = boardDetailResponseSchema.parse((await follower.get(base)).body) as BoardDetail;
          for (const o of ops) {
            const board = boardDetailResponseSchema.parse((await agent.get(base)).body);
            const at = (i: number) => board.circuits[i % Math.max(board.circuits.length, 1)];
            let res;
            let schema: { parse(v: unknown): unknown } | undefined;
            if (o.kind === 'add') {
              const after = o.afterIndex === undefined ? undefined : at(o.afterIndex)?.id;
              res = await agent.post(`${base}/circuits`).send({ ...(o.number === undefined ? {} : { number: o.number }), ...(after ? { afterCircuitId: after } : {}) });
              schema = circuitResponseSchema;
            } else if (o.kind === 'patch') {
              const c = at(o.index);
              if (!c) continue;
              res = await agent.patch(`${base}/circuits/${c.id}`).send({ version: c.version, changes: o.changes });
              schema = circuitResponseSchema;
            } else if (o.kind === 'cell') {
              const c = at(o.index);
              if (!c) continue;
              res = await agent.put(`${base}/circuits/${c.id}/cells/${o.column}`).send({ text: o.text, version: c.cells[o.column as 'zs']?.version ?? 0 });
              schema = writeCellResponseSchema;
            } else if (o.kind === 'remove') {
              const c = at(o.index);
              if (!c) continue;
              res = await agent.delete(`${base}/circuits/${c.id}`);
            } else {
              res = await agent.patch(base).send({ version: board.board.version, changes: o.changes });
            }
            expect(res.status, JSON.stringify(res.body)).toBeLessThan(500);
            if (res.status < 300) {
              if (schema) schema.parse(res.body);
              const served = await agent.get(base);
              const parsed = boardDetailResponseSchema.parse(served.body);
              checkInputSchema.parse(boardToCheckInput(parsed));
              expect(parsed.findings.filter((f) => f.code === storedValueFindingCode)).toEqual([]);
              boardChangesResponseSchema.parse((await agent.get(`${base}/changes?after=0`)).body);
              // The board kept in memory is the board in the database.
              const fresh = (await loadBoardWithContext(app.db, app.ids.board))!;
              expect(parsed.circuits).toEqual(JSON.parse(JSON.stringify(fresh.circuits)));
              expect(parsed.board).toEqual(JSON.parse(JSON.stringify(fresh.board)));
              expect(sortedJson(parsed.findings)).toEqual(sortedJson(JSON.parse(JSON.stringify(findingsFor(fresh)))));
              // A second console following the feed holds the same circuits and findings.
              const feed = boardChangesResponseSchema.parse((await follower.get(`${base}/changes?after=${followed.cursor}`)).body);
              const merged = mergeChanges(followed, feed as never, { after: followed.cursor, pending: new Set(), applyOrder: true });
              expect(merged.missing).toBe(false);
              followed = merged.detail;
              expect(followed.circuits).toEqual(parsed.circuits);
              expect(sortedJson(followed.findings.filter((f) => f.circuitId !== null))).toEqual(sortedJson(parsed.findings.filter((f) => f.circuitId !== null)));
            }
          }
        } finally {
          app.close();
        }
      }),
      { numRuns: 80 },
    );
  }, 120_000);
});
