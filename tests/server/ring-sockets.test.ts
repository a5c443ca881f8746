import { afterEach, beforeEach, describe, expect, it } from 'vitest';
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
