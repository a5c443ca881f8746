import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { planImport, writesFor } from '../../shared/import/plan-import.ts';
import { pngBytes } from '../helpers/images.ts';
import { makeReadingsFile, type GeneratedRow } from '../helpers/instrument-files.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';
import { rowCounts } from './row-counts.ts';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

const rows: GeneratedRow[] = [
  { circuit: '1', r1PlusR2: '0.31', irLiveEarth: '>299', irLiveLive: '>299', testV: '500', zs: '0.52', rcdMs: '24', polarity: 'PASS' },
  { circuit: '2', r1PlusR2: '0.88', irLiveEarth: '180', irLiveLive: '210', testV: '500', zs: '1.09', rcdMs: '19', polarity: 'PASS' },
  { circuit: '3', r1PlusR2: '1.02', irLiveEarth: '95', irLiveLive: '120', testV: '500', zs: '1.24', rcdMs: '22', polarity: 'PASS' },
  { circuit: '7', zs: '0.40' },
];
const style = { separator: ';', encoding: 'windows-1252', units: 'values', numbering: 'number-phase', decimalComma: true, preamble: true } as const;

async function read(file: Buffer, name = 'readings.csv', role: 'tester' | 'reviewer' = 'tester') {
  const agent = await t.signIn(role);
  return agent.post(`/api/boards/${t.ids.board}/import/read`).attach('file', file, name);
}

async function board() {
  return (await (await t.signIn('tester')).get(`/api/boards/${t.ids.board}`)).body;
}

describe('POST /api/boards/:boardId/import/read', () => {
  it('when a semicolon file in Windows-1252 with units and decimal commas is sent, then its table, encoding and a mapping are proposed, and nothing is written', async () => {
    const before = await rowCounts(t.db);
    const res = await read(makeReadingsFile(rows, style));
    expect(res.status).toBe(200);
    expect(res.body.table).toMatchObject({ encoding: 'windows-1252', delimiter: ';', decimalComma: true, fileName: 'readings.csv' });
    expect(res.body.table.encodingNote).toMatch(/Windows-1252/);
    expect(res.body.table.rows).toHaveLength(4);
    expect(res.body.proposal.map((p: { target: string }) => p.target)).toEqual(['circuit', 'r1PlusR2', 'irLiveEarth', 'irLiveLive', 'irTestVoltage', 'zs', 'rcdTimeMs', 'polarity', 'ignore']);
    expect(await rowCounts(t.db)).toEqual(before);
  });

  const bad: Array<[string, Buffer, number, RegExp]> = [
    ['an empty file', Buffer.alloc(0), 400, /Attach|empty/],
    ['a picture', pngBytes(), 400, /not a readings file/],
    ['UTF-16 text', Buffer.from([0xff, 0xfe, 0x41, 0, 0x2c, 0, 0x42, 0]), 415, /UTF-16/],
    ['bytes that are neither UTF-8 nor Windows-1252', Buffer.from('Circuit;Zs\r\n1;0\x81 5\r\n', 'latin1'), 415, /neither UTF-8 nor Windows-1252/],
    ['a letter', Buffer.from('Hello, the readings follow next week.\n'), 400, /not a readings file/],
    ['a header without rows', Buffer.from('Circuit,Zs (Ω),RCD time (ms)\n'), 400, /no rows/],
    ['a table with no column that could be a reading', Buffer.from('Name,Address,Phone\nAnn Smith,1 High St,0123\nBo Jones,2 Low Rd,0456\n'), 400, /No column of this file could be a reading/],
  ];
  it.each(bad)('when the file is %s, then it is refused in words and nothing is written', async (_what, file, status, message) => {
    const before = await rowCounts(t.db);
    const res = await read(file);
    expect(res.status).toBe(status);
    expect(res.body.error.message).toMatch(message);
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when the file is larger than 2 MB, then 413 in words', async () => {
    const big = Buffer.concat([Buffer.from('Circuit,Zs\n'), Buffer.alloc(2 * 1024 * 1024, 0x30)]);
    const res = await read(big);
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/at most 2 MB/);
  });

  it('when the board is locked or its job approved, then 423 before the file is read', async () => {
    await t.db.updateTable('boards').set({ state: 'locked' }).where('id', '=', t.ids.board).execute();
    expect((await read(makeReadingsFile(rows, style))).status).toBe(423);
    await t.db.updateTable('boards').set({ state: 'open' }).where('id', '=', t.ids.board).execute();
    await t.db.updateTable('jobs').set({ state: 'approved' }).where('id', '=', t.ids.job).execute();
    expect((await read(makeReadingsFile(rows, style))).status).toBe(423);
  });

  it('when the file is sent as JSON rather than a form, then 400 saying how to send it', async () => {
    const res = await (await t.signIn('tester')).post(`/api/boards/${t.ids.board}/import/read`).send({ file: 'Circuit,Zs' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/form upload/);
  });
});

describe('POST /api/boards/:boardId/import', () => {
  async function plannedWrites(take = true) {
    const readRes = await read(makeReadingsFile(rows, style));
    const detail = await board();
    const plan = planImport(readRes.body.table, readRes.body.proposal.map((p: { target: string }) => p.target), detail.circuits);
    return { plan, writes: writesFor(plan, { byColumn: take ? { zs: 'take' } : {}, byCell: {} }) };
  }

  it('when the confirmed import is sent, then every value lands with how = imported in one step of the history, and circuit 7 is listed as unmatched', async () => {
    const { plan, writes } = await plannedWrites();
    expect(plan.unmatched).toEqual([{ row: 4, circuit: '7', reason: 'there is no circuit 7 on this board' }]);
    expect(writes).toHaveLength(21);
    const res = await (await t.signIn('tester')).post(`/api/boards/${t.ids.board}/import`).send({ fileName: 'readings.csv', writes });
    expect(res.status).toBe(200);
    expect(res.body.written).toBe(21);
    const cells = await t.db.selectFrom('cells').selectAll().execute();
    expect(cells).toHaveLength(21);
    const history = await t.db.selectFrom('history').selectAll().where('board_id', '=', t.ids.board).execute();
    expect(history.filter((h) => h.action === 'cell').every((h) => h.how === 'imported')).toBe(true);
    expect(history.filter((h) => h.action === 'import')).toEqual([expect.objectContaining({ new_text: '21 readings imported from readings.csv', how: 'imported' })]);
    const c1 = res.body.circuits.find((c: { number: string }) => c.number === '1');
    expect(c1.cells.zs.text).toBe('0.52'); // "0,52 Ohm" in the file
    expect(c1.cells.irLiveEarth.text).toBe('>299');
    expect(c1.cells.polarity.text).toBe('✓');
    expect(res.body.findings).toBeInstanceOf(Array);
  });

  it('when someone changed a cell after the preview, then 409 naming it and nothing is written', async () => {
    const { writes } = await plannedWrites();
    await (await t.signIn('tester2')).put(`/api/boards/${t.ids.board}/circuits/${writes[0]!.circuitId}/cells/${writes[0]!.column}`).send({ text: '9.99', version: 0 });
    const before = await rowCounts(t.db);
    const res = await (await t.signIn('tester')).post(`/api/boards/${t.ids.board}/import`).send({ fileName: 'readings.csv', writes });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/changed since the preview/);
    expect(res.body.error.details.conflicts).toHaveLength(1);
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when a write names a circuit of another board, then 400 and nothing is written', async () => {
    const { writes } = await plannedWrites();
    const before = await rowCounts(t.db);
    const res = await (await t.signIn('tester')).post(`/api/boards/${t.ids.board}/import`).send({ fileName: 'x.csv', writes: [...writes, { circuitId: 9999, column: 'zs', text: '1', version: 0 }] });
    expect(res.status).toBe(400);
    expect(await rowCounts(t.db)).toEqual(before);
  });

  it('when the same cell is written twice, or nothing at all, then 400 in words', async () => {
    const one = { circuitId: 1, column: 'zs', text: '0.5', version: 0 };
    const agent = await t.signIn('tester');
    expect((await agent.post(`/api/boards/${t.ids.board}/import`).send({ fileName: 'x.csv', writes: [one, one] })).body.error.message).toMatch(/twice/);
    expect((await agent.post(`/api/boards/${t.ids.board}/import`).send({ fileName: 'x.csv', writes: [] })).status).toBe(400);
  });

  it('when the board is locked, or the job approved, then 423 and nothing is written', async () => {
    const { writes } = await plannedWrites();
    await t.db.updateTable('boards').set({ state: 'locked' }).where('id', '=', t.ids.board).execute();
    const before = await rowCounts(t.db);
    expect((await (await t.signIn('tester')).post(`/api/boards/${t.ids.board}/import`).send({ fileName: 'x.csv', writes })).status).toBe(423);
    await t.db.updateTable('boards').set({ state: 'open' }).where('id', '=', t.ids.board).execute();
    await t.db.updateTable('jobs').set({ state: 'approved' }).where('id', '=', t.ids.job).execute();
    expect((await (await t.signIn('tester')).post(`/api/boards/${t.ids.board}/import`).send({ fileName: 'x.csv', writes })).status).toBe(423);
    expect(await rowCounts(t.db)).toEqual({ ...before, boards: before.boards });
  });

  it('when an import is undone, then the cells go back as one more step, on the versions the import left', async () => {
    const { writes } = await plannedWrites();
    const agent = await t.signIn('tester');
    const done = await agent.post(`/api/boards/${t.ids.board}/import`).send({ fileName: 'readings.csv', writes });
    const undo = writes.map((w) => ({ circuitId: w.circuitId, column: w.column, text: '', version: done.body.circuits.find((c: { id: number }) => c.id === w.circuitId).cells[w.column].version }));
    const res = await agent.post(`/api/boards/${t.ids.board}/import`).send({ fileName: 'readings.csv', action: 'undo', writes: undo });
    expect(res.status).toBe(200);
    const texts = (await t.db.selectFrom('cells').select('text').execute()).map((c) => c.text);
    expect(texts.every((x) => x === '')).toBe(true);
    expect((await t.db.selectFrom('history').select('action').where('action', '=', 'import-undone').execute())).toHaveLength(1);
  });
});

describe('/api/import-mappings', () => {
  const columns = [{ header: 'Circuit', target: 'circuit' }, { header: 'Loop Zs', target: 'zs' }];

  it('when a person saves a mapping for themself and one for the company, then they see both and another person sees only the company one', async () => {
    const tom = await t.signIn('tester');
    expect((await tom.post('/api/import-mappings').send({ name: 'Van meter', scope: 'mine', columns })).status).toBe(201);
    expect((await tom.post('/api/import-mappings').send({ name: 'Office standard', scope: 'company', columns })).status).toBe(201);
    const again = await tom.post('/api/import-mappings').send({ name: 'Van meter', scope: 'mine', columns: [...columns, { header: 'RCD', target: 'rcdTimeMs' }] });
    expect(again.body.mappings.filter((m: { name: string }) => m.name === 'Van meter')[0].columns).toHaveLength(3);
    expect((await tom.get('/api/import-mappings')).body.mappings.map((m: { name: string }) => m.name)).toEqual(['Office standard', 'Van meter']);
    const tess = await t.signIn('tester2');
    expect((await tess.get('/api/import-mappings')).body.mappings.map((m: { name: string }) => m.name)).toEqual(['Office standard']);
    const companyId = (await tess.get('/api/import-mappings')).body.mappings[0].id;
    expect((await tess.delete(`/api/import-mappings/${companyId}`)).status).toBe(403);
    expect((await tom.delete(`/api/import-mappings/${companyId}`)).status).toBe(200);
  });

  it('when a mapping has no name or sends no column to a reading, then 400 at the field', async () => {
    const tom = await t.signIn('tester');
    expect((await tom.post('/api/import-mappings').send({ name: ' ', scope: 'mine', columns })).status).toBe(400);
    const none = await tom.post('/api/import-mappings').send({ name: 'x', scope: 'mine', columns: [{ header: 'Circuit', target: 'circuit' }] });
    expect(none.status).toBe(400);
    expect(JSON.stringify(none.body.error)).toMatch(/at least one column to a reading/);
  });
});
