import Papa from 'papaparse';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { jobExportSchema } from '../../shared/schemas/issues.ts';
import { reviewJobResponseSchema } from '../../shared/schemas/review.ts';
import { writeReadings } from '../helpers/issue-fixture.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

let t: TestApp;
let ring: number;
let lights: number;
beforeEach(async () => {
  t = await createTestApp();
  const ids = await t.db.selectFrom('circuits').select(['id', 'kind']).orderBy('position').execute();
  ring = ids.find((c) => c.kind === 'ring')!.id;
  lights = ids.find((c) => c.kind !== 'ring')!.id;
});
afterEach(() => t.close());

const url = (circuitId: number) => `/api/boards/${t.ids.board}/circuits/${circuitId}/ring-sockets`;
// Invented readings of a sound ring: r1 0.52, r2 0.85 → (r1+r2)/4 = 0.34 Ω mid-ring (formula).
const sockets = [
  { label: 'hall', position: null, lineNeutral: '0.26', lineCpc: '0.33' },
  { label: 'lounge', position: null, lineNeutral: '0.27', lineCpc: '0.34' },
];

describe('ring sockets over HTTP', () => {
  it('when never written, then an empty list at version 0; when written, then stored with a history row', async () => {
    const agent = await t.signIn('tester');
    expect((await agent.get(url(ring))).body).toEqual({ sockets: [], version: 0 });
    const put = await agent.put(url(ring)).send({ version: 0, sockets });
    expect(put.status).toBe(200);
    expect(put.body).toEqual({ sockets, version: 1 });
    expect((await agent.get(url(ring))).body).toEqual({ sockets, version: 1 });
    const history = (await agent.get(`/api/boards/${t.ids.board}/history`)).body.history;
    expect(history[0]).toMatchObject({ action: 'ring-sockets', circuitId: ring, newText: JSON.stringify(sockets) });
  });

  it('when a stale version is sent, then 409 with the current list; a resend of the same list is harmless', async () => {
    const agent = await t.signIn('tester');
    await agent.put(url(ring)).send({ version: 0, sockets });
    expect((await agent.put(url(ring)).send({ version: 0, sockets })).status).toBe(200);
    const stale = await agent.put(url(ring)).send({ version: 0, sockets: sockets.slice(0, 1) });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.current).toEqual({ sockets, version: 1 });
  });

  it('when the circuit is not a ring, or the body is bad, then 400 in words and nothing stored', async () => {
    const agent = await t.signIn('tester');
    const notRing = await agent.put(url(lights)).send({ version: 0, sockets });
    expect(notRing.status).toBe(400);
    expect(notRing.body.error.message).toMatch(/not a ring final circuit/);
    expect((await agent.put(url(ring)).send({ version: 0, sockets: [{ label: 'x' }] })).status).toBe(400);
    expect((await agent.get(url(ring))).body.version).toBe(0);
  });
});

describe('ring sockets in the CSV export', () => {
  it('when a ring has socket readings, then the board’s CSV lists them after the circuits, read back with papaparse', async () => {
    const agent = await t.signIn('tester');
    await agent.put(url(ring)).send({ version: 0, sockets });
    const res = await agent.get(`/api/boards/${t.ids.board}/export.csv`).buffer(true).parse((response, callback) => {
      const chunks: Buffer[] = [];
      response.on('data', (chunk: Buffer) => chunks.push(chunk));
      response.on('end', () => callback(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    const rows = Papa.parse<string[]>((res.body as Buffer).toString('utf8').slice(1), { skipEmptyLines: true }).data;
    const at = rows.findIndex((r) => r[0] === 'Ring socket readings');
    expect(at).toBeGreaterThan(0);
    expect(rows[at + 1]).toEqual(['Circuit', 'Socket', 'Label', 'Position along the ring (0–1)', 'L-N (Ω)', 'L-cpc (Ω)']);
    const ringNumber = (await t.db.selectFrom('circuits').select('number').where('id', '=', ring).executeTakeFirstOrThrow()).number;
    expect(rows.slice(at + 2, at + 4)).toEqual([
      [ringNumber, '1', 'hall', '', '0.26', '0.33'],
      [ringNumber, '2', 'lounge', '', '0.27', '0.34'],
    ]);
  });
});

describe('ring sockets in the job JSON export and the review response', () => {
  // The same invented ring with its end-to-end readings: r1 0.52, rn 0.52, r2 0.85 Ω.
  const ends = { ringR1: '0.52', ringRn: '0.52', ringR2: '0.85' };

  it('when a ring has socket readings, then the job export carries them with the diagnosis, parsed back with the schema', async () => {
    const agent = await t.signIn('tester');
    await writeReadings(t.db, ring, ends, t.ids.tester);
    await agent.put(url(ring)).send({ version: 0, sockets });
    const res = await agent.get(`/api/jobs/${t.ids.job}/export.json`);
    expect(res.status).toBe(200);
    const exported = jobExportSchema.parse(JSON.parse(res.text));
    const board = exported.boards.find((b) => b.board.id === t.ids.board)!;
    expect(board.ringSockets).toHaveLength(1);
    const readings = board.ringSockets![0]!;
    expect(readings).toMatchObject({ circuitId: ring, sockets });
    // A sound ring reads between r1·r2/(r1+r2) = 0.32 Ω and (r1+r2)/4 = 0.34 Ω at any socket (two
    // halves in parallel, common practice): 0.33 and 0.34 are consistent.
    expect((0.52 * 0.85) / (0.52 + 0.85)).toBeCloseTo(0.3226, 3);
    expect((0.52 + 0.85) / 4).toBeCloseTo(0.3425, 4);
    expect(readings.diagnosis).toMatchObject({ verdict: 'consistent', verdictText: 'consistent with a sound ring', suspects: [] });
  });

  it('when r1 or r2 is not recorded, then the readings are exported without a diagnosis; an export without rings still parses', async () => {
    const agent = await t.signIn('tester');
    await agent.put(url(ring)).send({ version: 0, sockets });
    const exported = jobExportSchema.parse(JSON.parse((await agent.get(`/api/jobs/${t.ids.job}/export.json`)).text));
    expect(exported.boards[0]!.ringSockets![0]).toMatchObject({ sockets, diagnosis: null });
    // Compatible extension: a file written before socket readings were exported parses as it is.
    const older = { ...exported, boards: exported.boards.map(({ board, circuits }) => ({ board, circuits })) };
    expect(jobExportSchema.safeParse(older).success).toBe(true);
  });

  it('when the reviewer opens the job, then the board carries its rings’ socket readings and diagnosis', async () => {
    const tester = await t.signIn('tester');
    await writeReadings(t.db, ring, ends, t.ids.tester);
    await tester.put(url(ring)).send({ version: 0, sockets: [...sockets, { label: 'study', position: null, lineNeutral: '0.27', lineCpc: '0.52' }] });
    const reviewer = await t.signIn('reviewer');
    const res = await reviewer.get(`/api/review/jobs/${t.ids.job}`);
    expect(res.status).toBe(200);
    const review = reviewJobResponseSchema.parse(res.body);
    const rings = review.boards.find((b) => b.board.id === t.ids.board)!.rings!;
    expect(rings.map((r) => r.circuitId)).toEqual([ring]);
    // 0.52 Ω is far above the most a sound ring can read, (r1+r2)/4 = 0.34 Ω (common practice).
    expect(rings[0]!.diagnosis).toMatchObject({ verdict: 'high-point', suspects: [2] });
  });
});
