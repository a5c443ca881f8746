import type { Server } from 'node:http';
import { vi } from 'vitest';
import type { Cell, Circuit } from '../../../../shared/schemas/boards.ts';
import type { ReadingKey } from '../../../../shared/schemas/columns.ts';
import { loadCircuits } from '../../../../server/db/boards.ts';
import { createTestApp, listen, password, type TestApp } from '../../../helpers/test-app.ts';

/** One request the page made, as the server saw it. */
export interface LoggedRequest {
  method: string;
  path: string;
  body: unknown;
  status: number | 'network-error';
}

type Role = 'tester' | 'tester2' | 'reviewer';

const emails: Record<Role, string> = { tester: 'tester@test.example', tester2: 'tester2@test.example', reviewer: 'reviewer@test.example' };

/**
 * The real app over a fresh in-memory database (tests/helpers/test-app.ts), listening on port 0,
 * with `fetch` replaced by one that sends the page's relative `/api/...` calls to it signed in as
 * the tester. The network can be cut, writes held back, and the changes feed paused, so a test
 * decides exactly when each answer arrives.
 */
export interface SyncServer {
  app: TestApp;
  boardId: number;
  /** The board's circuit ids in order (three circuits: 1 Sockets ring, 2 Lights, 3 Lights upstairs). */
  circuitIds: number[];
  /** Every request the page made, in the order it was sent. */
  log: LoggedRequest[];
  /** Writes (PUT/PATCH) the page has sent, in order. */
  writes(): LoggedRequest[];
  /** Most writes in flight at one time. */
  maxWritesInFlight: number;
  /** No request reaches the server: fetch fails as a browser's does without a network. */
  offline: boolean;
  /** Holds the page's writes (not answered) until `releaseWrites()`. */
  holdWrites(): void;
  releaseWrites(): void;
  /** Holds the page's polls of the changes feed until `resumeFeed()`. */
  pauseFeed(): void;
  resumeFeed(): void;
  /** Calls the API as someone else (a second typist, the reviewer), with the real fetch. */
  as(role: Role): (method: string, path: string, body?: unknown) => Promise<{ status: number; body: any }>;
  /** A cell as the server holds it now. */
  cell(circuitId: number, column: ReadingKey): Promise<Cell | undefined>;
  circuit(circuitId: number): Promise<Circuit>;
  close(): Promise<void>;
}

function gate() {
  let open: () => void = () => {};
  const promise = new Promise<void>((resolve) => (open = resolve));
  return { promise, open };
}

export async function startSyncServer(): Promise<SyncServer> {
  const realFetch = globalThis.fetch;
  const app = await createTestApp();
  const { server, url }: { server: Server; url: string } = await listen(app.app);

  const cookies = new Map<Role, string>();
  async function cookieOf(role: Role): Promise<string> {
    const known = cookies.get(role);
    if (known) return known;
    const res = await realFetch(`${url}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: emails[role], password }),
    });
    if (!res.ok) throw new Error(`sign-in as ${role} failed: ${res.status}`);
    const cookie = (res.headers.get('set-cookie') ?? '').split(';')[0] ?? '';
    cookies.set(role, cookie);
    return cookie;
  }
  const testerCookie = await cookieOf('tester');

  let writesGate: ReturnType<typeof gate> | null = null;
  let feedGate: ReturnType<typeof gate> | null = null;
  let inFlight = 0;

  const state: SyncServer = {
    app,
    boardId: app.ids.board,
    circuitIds: [],
    log: [],
    writes: () => state.log.filter((r) => r.method === 'PUT' || r.method === 'PATCH'),
    maxWritesInFlight: 0,
    offline: false,
    holdWrites: () => {
      writesGate ??= gate();
    },
    releaseWrites: () => {
      writesGate?.open();
      writesGate = null;
    },
    pauseFeed: () => {
      feedGate ??= gate();
    },
    resumeFeed: () => {
      feedGate?.open();
      feedGate = null;
    },
    as: (role) => async (method, path, body) => {
      const res = await realFetch(`${url}${path}`, {
        method,
        headers: { cookie: await cookieOf(role), ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
        body: body === undefined ? undefined : JSON.stringify(body),
      });
      return { status: res.status, body: await res.json().catch(() => undefined) };
    },
    cell: async (circuitId, column) => (await state.circuit(circuitId)).cells[column],
    // Read from the database itself: asking the API would mark someone present on the board.
    circuit: async (circuitId) => {
      const [circuit] = await loadCircuits(app.db, app.ids.board, [circuitId]);
      if (!circuit) throw new Error(`no circuit ${circuitId}`);
      return circuit;
    },
    close: async () => {
      vi.unstubAllGlobals();
      writesGate?.open();
      feedGate?.open();
      await new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      });
      app.close();
    },
  };

  const fakeFetch = async (input: RequestInfo | URL, init: RequestInit = {}): Promise<Response> => {
    const path = String(input);
    const method = (init.method ?? 'GET').toUpperCase();
    const body = typeof init.body === 'string' ? (JSON.parse(init.body) as unknown) : undefined;
    const entry: LoggedRequest = { method, path, body, status: 'network-error' };
    state.log.push(entry);
    const isWrite = method === 'PUT' || method === 'PATCH';
    if (isWrite) {
      inFlight += 1;
      state.maxWritesInFlight = Math.max(state.maxWritesInFlight, inFlight);
    }
    try {
      if (isWrite && writesGate) await writesGate.promise;
      if (path.includes('/changes') && feedGate) await feedGate.promise;
      if (state.offline) throw new TypeError('Failed to fetch');
      // jsdom's AbortSignal is not the one Node's fetch accepts; the tests never abort.
      const { signal: _signal, ...rest } = init;
      const res = await realFetch(`${url}${path}`, { ...rest, headers: { ...(init.headers as Record<string, string>), cookie: testerCookie } });
      entry.status = res.status;
      return res;
    } finally {
      if (isWrite) inFlight -= 1;
    }
  };
  vi.stubGlobal('fetch', fakeFetch);

  state.circuitIds = (await loadCircuits(app.db, app.ids.board)).map((c) => c.id);
  return state;
}
