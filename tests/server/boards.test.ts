import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { sql } from 'kysely';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';
import { completeBoard } from './review/review-fixture.ts';

let t: TestApp;
let board: number;
let ring: number;
let lights: number;
beforeEach(async () => {
  t = await createTestApp();
  board = t.ids.board;
  const ids = await t.db.selectFrom('circuits').select('id').orderBy('position').execute();
  ring = ids[0]!.id;
  lights = ids[1]!.id;
});
afterEach(() => t.close());

const cellUrl = (circuitId: number, column: string) => `/api/boards/${board}/circuits/${circuitId}/cells/${column}`;

describe('GET /api/boards and /api/boards/:boardId', () => {
  it('when listing, then each board comes with its site, job, state and circuit count', async () => {
    const res = await (await t.signIn('tester')).get('/api/boards');
    expect(res.status).toBe(200);
    expect(res.body.boards).toEqual([
      expect.objectContaining({ id: board, reference: 'DB1', state: 'open', circuitCount: 3, cellsFilled: 0, site: expect.objectContaining({ client: 'Test client' }), job: expect.objectContaining({ kind: 'EICR' }) }),
    ]);
  });

  it('when every reading the circuits need is typed, then progress reads all of them done (100 %), whatever columns do not apply', async () => {
    const agent = await t.signIn('tester');
    const before = (await agent.get('/api/boards')).body.boards[0];
    // The checker's required columns (a ring needs r1, rn, r2 besides the six every final circuit
    // needs; an RCD adds its time and button) — common practice for the schedule of test results.
    expect(before).toMatchObject({ readingsDone: 0 });
    expect(before.readingsRequired).toBeGreaterThanOrEqual(3 * 6 + 3);
    // Fewer than every reading column of every circuit: those that do not apply are not counted.
    expect(before.readingsRequired).toBeLessThan(3 * 13);
    await completeBoard(t);
    const after = (await agent.get('/api/boards')).body.boards[0];
    expect(after.readingsDone).toBe(after.readingsRequired);
    expect((await agent.get(`/api/boards/${board}/gate`)).body.gate).toMatchObject({ canLock: true, reasons: [] });
  });

  it('when a spur is linked as fused, then the board serves it, and a word other than fused or unfused is refused in words', async () => {
    const agent = await t.signIn('tester');
    const ok = await agent
      .patch(`/api/boards/${board}/circuits/${lights}`)
      .send({ version: 1, changes: { kind: 'spur', spurRingId: ring, spurOriginPoint: 'socket 4', spurProtection: 'fused' } });
    expect(ok.status).toBe(200);
    const served = (await agent.get(`/api/boards/${board}`)).body.circuits.find((c: { id: number }) => c.id === lights);
    expect(served).toMatchObject({ kind: 'spur', spurRingId: ring, spurOriginPoint: 'socket 4', spurProtection: 'fused' });
    const bad = await agent.patch(`/api/boards/${board}/circuits/${lights}`).send({ version: 2, changes: { spurProtection: 'maybe' } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toEqual(expect.any(String));
  });

  it('when a board was typed, locked and unlocked, then its history lists every change newest first, with the unlock reason, filterable by person and column', async () => {
    const tester = await t.signIn('tester');
    await tester.put(cellUrl(ring, 'zs')).send({ text: '0.44', version: 0 });
    await completeBoard(t);
    const reviewer = await t.signIn('reviewer');
    expect((await reviewer.post(`/api/boards/${board}/lock`).send({})).status).toBe(200);
    expect((await reviewer.post(`/api/boards/${board}/unlock`).send({ reason: 'Zs of circuit 1 to be tested again' })).status).toBe(200);
    const all = (await tester.get(`/api/boards/${board}/history`)).body;
    expect(all.history.length).toBeGreaterThanOrEqual(3);
    const ids = all.history.map((h: { id: number }) => h.id);
    expect(ids).toEqual([...ids].sort((a: number, b: number) => b - a));
    expect(JSON.stringify(all.history[0])).toContain('Zs of circuit 1 to be tested again');
    expect(all.people.map((p: { name: string }) => p.name)).toEqual(expect.arrayContaining(['Tom Tester']));
    const tom = all.people.find((p: { name: string }) => p.name === 'Tom Tester').id;
    const zsByTom = (await tester.get(`/api/boards/${board}/history?person=${tom}&column=zs`)).body.history;
    expect(zsByTom).toEqual([expect.objectContaining({ circuitNumber: '1', column: 'zs', newText: '0.44', how: 'typed', by: { id: tom, name: 'Tom Tester' } })]);
    expect((await tester.get(`/api/boards/${board}/history?person=abc`)).status).toBe(400);
  });

  it('when fetching a board, then circuits come in order with cells, versions and findings', async () => {
    const agent = await t.signIn('tester');
    await agent.put(cellUrl(ring, 'zs')).send({ text: '0.44', version: 0 });
    const res = await agent.get(`/api/boards/${board}`);
    expect(res.status).toBe(200);
    expect(res.body.circuits.map((c: { number: string }) => c.number)).toEqual(['1', '2', '3']);
    expect(res.body.circuits[0].cells.zs).toMatchObject({ text: '0.44', version: 1, updatedBy: { name: 'Tom Tester' } });
    expect(Array.isArray(res.body.findings)).toBe(true);
    expect(res.body.cursor).toBeGreaterThan(0);
  });

  it('when the board does not exist, then 404; when the id is not a number, then 400', async () => {
    const agent = await t.signIn('tester');
    expect((await agent.get('/api/boards/999')).status).toBe(404);
    const bad = await agent.get('/api/boards/seven');
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/boardId must be a positive whole number/);
  });
});

describe('PUT a cell', () => {
  it('when the version is current, then 200 with the next version and a history row', async () => {
    const agent = await t.signIn('tester');
    const first = await agent.put(cellUrl(ring, 'zs')).send({ text: '0.44', version: 0 });
    expect(first.status).toBe(200);
    expect(first.body.cell).toMatchObject({ text: '0.44', version: 1 });
    const second = await agent.put(cellUrl(ring, 'zs')).send({ text: '0.45', version: 1, how: 'dictated' });
    expect(second.body.cell.version).toBe(2);
    const history = await agent.get(`${cellUrl(ring, 'zs')}/history`);
    expect(history.body.history.map((h: { oldText: string; newText: string; how: string }) => [h.oldText, h.newText, h.how])).toEqual([
      [null, '0.44', 'typed'],
      ['0.44', '0.45', 'dictated'],
    ]);
  });

  it('when the cell changed since the version sent, then 409 with the current text and who, and nothing changes', async () => {
    const tester = await t.signIn('tester');
    const other = await t.signIn('tester2');
    await tester.put(cellUrl(ring, 'zs')).send({ text: '0.44', version: 0 });
    const stale = await other.put(cellUrl(ring, 'zs')).send({ text: '0.99', version: 0 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('conflict');
    expect(stale.body.error.message).toMatch(/Tom Tester changed this Zs to "0.44"/);
    expect(stale.body.error.details.current).toMatchObject({ text: '0.44', version: 1, updatedBy: { name: 'Tom Tester' } });
    const now = await tester.get(`/api/boards/${board}`);
    expect(now.body.circuits[0].cells.zs.text).toBe('0.44');
  });

  it('when the same text is sent again with an old version (a retried request), then 200 without a new version', async () => {
    const agent = await t.signIn('tester');
    await agent.put(cellUrl(ring, 'zs')).send({ text: '0.44', version: 0 });
    const retry = await agent.put(cellUrl(ring, 'zs')).send({ text: '0.44', version: 0 });
    expect(retry.status).toBe(200);
    expect(retry.body.cell.version).toBe(1);
  });

  it('when a LIM is written with a reason, then the reason is kept; when cleared, then the row keeps its version', async () => {
    const agent = await t.signIn('tester');
    const lim = await agent.put(cellUrl(lights, 'irLiveEarth')).send({ text: 'LIM', reason: 'Loads could not be disconnected', version: 0 });
    expect(lim.body.cell).toMatchObject({ text: 'LIM', reason: 'Loads could not be disconnected' });
    const cleared = await agent.put(cellUrl(lights, 'irLiveEarth')).send({ text: '', version: 1 });
    expect(cleared.body.cell).toMatchObject({ text: '', reason: null, version: 2 });
  });

  it('when the body or column is wrong, then 400 with a message and nothing is written', async () => {
    const agent = await t.signIn('tester');
    const noVersion = await agent.put(cellUrl(ring, 'zs')).send({ text: '0.44' });
    expect(noVersion.status).toBe(400);
    expect(noVersion.body.error.message).toMatch(/version/);
    const tooLong = await agent.put(cellUrl(ring, 'zs')).send({ text: 'x'.repeat(41), version: 0 });
    expect(tooLong.status).toBe(400);
    const unknown = await agent.put(cellUrl(ring, 'zz')).send({ text: '1', version: 0 });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toBe('There is no reading column "zz".');
    const detail = await agent.put(cellUrl(ring, 'description')).send({ text: 'x', version: 0 });
    expect(detail.body.error.message).toMatch(/circuit detail/);
    const count = await t.db.selectFrom('cells').select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
    expect(Number(count.n)).toBe(0);
  });

  it('when the circuit is on another board, then 404', async () => {
    const agent = await t.signIn('tester');
    const res = await agent.put(`/api/boards/${board}/circuits/9999/cells/zs`).send({ text: '1', version: 0 });
    expect(res.status).toBe(404);
  });
});

describe('lock and unlock', () => {
  // Locking needs a board that passes its gate (tests/server/review/board-gate.test.ts).
  beforeEach(() => completeBoard(t));

  it('when a tester locks, then 403 and the board stays open', async () => {
    const tester = await t.signIn('tester');
    const res = await tester.post(`/api/boards/${board}/lock`);
    expect(res.status).toBe(403);
    expect(res.body.error.message).toBe('Only a reviewer or an admin can do this; you are signed in as a tester.');
    expect((await tester.get(`/api/boards/${board}`)).body.board.state).toBe('open');
  });

  it('when a reviewer locks, then every write answers 423 and nothing changes', async () => {
    const reviewer = await t.signIn('reviewer');
    const tester = await t.signIn('tester');
    await tester.put(cellUrl(ring, 'zs')).send({ text: '0.45', version: 1 });
    const locked = await reviewer.post(`/api/boards/${board}/lock`);
    expect(locked.status).toBe(200);
    expect(locked.body.board).toMatchObject({ state: 'locked', lockedBy: { name: 'Rhea Reviewer' } });
    const before = await tester.get(`/api/boards/${board}`);

    const writes = [
      tester.put(cellUrl(ring, 'zs')).send({ text: '9.99', version: 1 }),
      tester.put(cellUrl(ring, 'r1PlusR2')).send({ text: '0.2', version: 0 }),
      tester.patch(`/api/boards/${board}/circuits/${ring}`).send({ version: 1, changes: { description: 'x' } }),
      tester.post(`/api/boards/${board}/circuits`).send({ description: 'new' }),
      tester.delete(`/api/boards/${board}/circuits/${lights}`),
      tester.put(`/api/boards/${board}/circuits/order`).send({ circuitIds: [lights, ring, before.body.circuits[2].id] }),
      tester.patch(`/api/boards/${board}`).send({ version: 2, changes: { zdbOhm: 1 } }),
      reviewer.put(cellUrl(ring, 'zs')).send({ text: '9.99', version: 1 }),
    ];
    for (const res of await Promise.all(writes)) {
      expect(res.status).toBe(423);
      expect(res.body.error.code).toBe('locked');
    }
    const after = await tester.get(`/api/boards/${board}`);
    expect(after.body.circuits).toEqual(before.body.circuits);
    expect(after.body.board).toEqual(before.body.board);
  });

  it('when unlocking without a reason, then 400; with a reason, then open again and the reason is in the history', async () => {
    const reviewer = await t.signIn('reviewer');
    await reviewer.post(`/api/boards/${board}/lock`);
    const noReason = await reviewer.post(`/api/boards/${board}/unlock`).send({});
    expect(noReason.status).toBe(400);
    expect((await (await t.signIn('tester')).post(`/api/boards/${board}/unlock`).send({ reason: 'Client asked for a retest' })).status).toBe(403);
    const res = await reviewer.post(`/api/boards/${board}/unlock`).send({ reason: 'Client asked for a retest' });
    expect(res.status).toBe(200);
    expect(res.body.board.state).toBe('open');
    const history = await t.db.selectFrom('history').select(['action', 'new_text']).where('board_id', '=', board).execute();
    expect(history).toContainEqual({ action: 'unlocked', new_text: 'open: Client asked for a retest' });
  });

  it('when an admin locks, then it is allowed', async () => {
    expect((await (await t.signIn('admin')).post(`/api/boards/${board}/lock`)).status).toBe(200);
  });
});

describe('circuits', () => {
  it('when inserting after a circuit, then it lands there and positions stay 1..n', async () => {
    const agent = await t.signIn('tester');
    const res = await agent.post(`/api/boards/${board}/circuits`).send({ afterCircuitId: ring, description: 'Garage', kind: 'radial' });
    expect(res.status).toBe(201);
    expect(res.body.circuit).toMatchObject({ number: '4', description: 'Garage', position: 2 });
    const detail = await agent.get(`/api/boards/${board}`);
    expect(detail.body.circuits.map((c: { description: string; position: number }) => [c.position, c.description])).toEqual([
      [1, 'Sockets'],
      [2, 'Garage'],
      [3, 'Lights'],
      [4, 'Lights upstairs'],
    ]);
  });

  it('when two people change different details of one circuit from the same version, then both land', async () => {
    const a = await t.signIn('tester');
    const b = await t.signIn('tester2');
    const ra = await a.patch(`/api/boards/${board}/circuits/${ring}`).send({ version: 1, changes: { description: 'Kitchen sockets' } });
    expect(ra.status).toBe(200);
    const rb = await b.patch(`/api/boards/${board}/circuits/${ring}`).send({ version: 1, changes: { ratingA: 20 } });
    expect(rb.status).toBe(200);
    expect(rb.body.circuit).toMatchObject({ description: 'Kitchen sockets', ratingA: 20, version: 3 });
  });

  it('when two people change the same detail from the same version, then the second gets 409', async () => {
    const a = await t.signIn('tester');
    const b = await t.signIn('tester2');
    await a.patch(`/api/boards/${board}/circuits/${ring}`).send({ version: 1, changes: { ratingA: 20 } });
    const rb = await b.patch(`/api/boards/${board}/circuits/${ring}`).send({ version: 1, changes: { ratingA: 16 } });
    expect(rb.status).toBe(409);
    expect(rb.body.error.details).toMatchObject({ fields: ['ratingA'], current: { ratingA: 20 } });
  });

  it('when a detail is the wrong type, then 400 naming it', async () => {
    const agent = await t.signIn('tester');
    const res = await agent.patch(`/api/boards/${board}/circuits/${ring}`).send({ version: 1, changes: { ratingA: 'thirty' } });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('changes.ratingA');
    const empty = await agent.patch(`/api/boards/${board}/circuits/${ring}`).send({ version: 1, changes: {} });
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toMatch(/Nothing to change/);
  });

  it('when linking a spur to a ring, then it is stored; to itself or another board, then 400', async () => {
    const agent = await t.signIn('tester');
    const ok = await agent.patch(`/api/boards/${board}/circuits/${lights}`).send({ version: 1, changes: { kind: 'spur', spurRingId: ring, spurOriginPoint: 'socket 3', spurLengthM: 4 } });
    expect(ok.body.circuit).toMatchObject({ kind: 'spur', spurRingId: ring, spurOriginPoint: 'socket 3', spurLengthM: 4 });
    const self = await agent.patch(`/api/boards/${board}/circuits/${lights}`).send({ version: 2, changes: { spurRingId: lights } });
    expect(self.status).toBe(400);
  });

  it('when reordering, then every circuit must be given once', async () => {
    const agent = await t.signIn('tester');
    const ids = (await agent.get(`/api/boards/${board}`)).body.circuits.map((c: { id: number }) => c.id);
    const bad = await agent.put(`/api/boards/${board}/circuits/order`).send({ circuitIds: [ids[0], ids[0], ids[1]] });
    expect(bad.status).toBe(400);
    const good = await agent.put(`/api/boards/${board}/circuits/order`).send({ circuitIds: [...ids].reverse() });
    expect(good.body.order).toEqual([...ids].reverse());
  });

  it('when removing a circuit, then its cells go and the history keeps the removal', async () => {
    const agent = await t.signIn('tester');
    await agent.put(cellUrl(lights, 'zs')).send({ text: '1.1', version: 0 });
    const res = await agent.delete(`/api/boards/${board}/circuits/${lights}`);
    expect(res.status).toBe(200);
    expect(res.body.order).not.toContain(lights);
    expect(await t.db.selectFrom('cells').selectAll().where('circuit_id', '=', lights).execute()).toEqual([]);
    const removed = await t.db.selectFrom('history').selectAll().where('action', '=', 'circuit-removed').execute();
    expect(removed).toHaveLength(1);
  });
});

describe('history is append-only', () => {
  it('when something tries to change or delete history rows, then the database refuses', async () => {
    const agent = await t.signIn('tester');
    await agent.put(cellUrl(ring, 'zs')).send({ text: '0.44', version: 0 });
    await expect(sql`update history set new_text = 'forged'`.execute(t.db)).rejects.toThrow(/append-only/);
    await expect(sql`delete from history`.execute(t.db)).rejects.toThrow(/append-only/);
  });
});

describe('GET /api/boards/:boardId/changes', () => {
  it('when another person writes, then the feed after my cursor carries that circuit and names them as present', async () => {
    const a = await t.signIn('tester');
    const b = await t.signIn('tester2');
    const start = (await a.get(`/api/boards/${board}`)).body.cursor;
    await b.get(`/api/boards/${board}`);
    await b.put(cellUrl(lights, 'zs')).send({ text: '1.23', version: 0 });
    const feed = await a.get(`/api/boards/${board}/changes?after=${start}`);
    expect(feed.status).toBe(200);
    expect(feed.body.circuits.map((c: { id: number }) => c.id)).toEqual([lights]);
    expect(feed.body.circuits[0].cells.zs.text).toBe('1.23');
    expect(feed.body.cursor).toBeGreaterThan(start);
    expect(feed.body.present).toEqual([{ id: t.ids.tester2, name: 'Tess Second' }]);
    const quiet = await a.get(`/api/boards/${board}/changes?after=${feed.body.cursor}`);
    expect(quiet.body.circuits).toEqual([]);
    expect((await a.get(`/api/boards/${board}/changes?after=minus`)).status).toBe(400);
  });
});

describe('PATCH /api/boards/:boardId', () => {
  it('when the version is current, then the details change; when stale, then 409', async () => {
    const agent = await t.signIn('tester');
    const ok = await agent.patch(`/api/boards/${board}`).send({ version: 1, changes: { zdbOhm: 0.31, polarityConfirmed: true } });
    expect(ok.status).toBe(200);
    expect(ok.body.board).toMatchObject({ zdbOhm: 0.31, polarityConfirmed: true, version: 2 });
    const stale = await agent.patch(`/api/boards/${board}`).send({ version: 1, changes: { ipfKa: 2 } });
    expect(stale.status).toBe(409);
    const bad = await agent.patch(`/api/boards/${board}`).send({ version: 2, changes: { zdbOhm: 'low' } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/Zdb must be a number/);
  });
});

describe('unknown API paths', () => {
  it('when the path does not exist, then 404 in the error shape', async () => {
    const res = await (await t.signIn('tester')).get('/api/nothing-here');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});
