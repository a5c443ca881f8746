import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, renderHook, waitFor } from '@testing-library/react';
import type { ReactNode } from 'react';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { outboxStorageKey } from '../../../../src/features/board-console/sync/outbox-storage.ts';
import type { BoardSync } from '../../../../src/features/board-console/sync/types.ts';
import { stopBoardSync, useBoardSync } from '../../../../src/features/board-console/sync/use-board-sync.ts';
import { completeBoard } from '../../../server/review/review-fixture.ts';
import { startSyncServer, type SyncServer } from './sync-server.ts';

function newQueryClient() {
  return new QueryClient({ defaultOptions: { queries: { retry: false } } });
}

/** Mounts the hook as the console page would; a new QueryClient is a new page (a reload). */
function renderSync(boardId: number, client = newQueryClient()) {
  const wrapper = ({ children }: { children: ReactNode }) => <QueryClientProvider client={client}>{children}</QueryClientProvider>;
  return renderHook(() => useBoardSync(boardId), { wrapper });
}

async function loaded(result: { current: BoardSync }) {
  await waitFor(() => expect(result.current.detail).toBeDefined());
  return result.current.detail!;
}

const cellOf = (sync: BoardSync, circuitId: number, column: 'zs' | 'r1PlusR2' | 'irLiveEarth') =>
  sync.detail?.circuits.find((c) => c.id === circuitId)?.cells[column];

let server: SyncServer;

beforeEach(async () => {
  localStorage.clear();
  server = await startSyncServer();
});

afterEach(async () => {
  cleanup();
  await server.close();
});

describe('useBoardSync: loading', () => {
  it('when the board loads, then detail is the server board and nothing waits', async () => {
    const { result } = renderSync(server.boardId);
    expect(result.current.isLoading).toBe(true);
    const detail = await loaded(result);
    expect(detail.circuits.map((c) => c.id)).toEqual(server.circuitIds);
    expect(result.current.isLoading).toBe(false);
    expect(result.current.status).toEqual({ state: 'saved' });
    expect(result.current.conflicts).toEqual([]);
  });
});

describe('useBoardSync: the outbox', () => {
  it('when several edits are written, then they show at once and are sent one at a time in the order typed', async () => {
    const { result } = renderSync(server.boardId);
    await loaded(result);
    const [c1, c2, c3] = server.circuitIds as [number, number, number];

    act(() => {
      result.current.writeCell(c1, 'zs', '0.44');
      result.current.writeCell(c2, 'zs', '1.2');
      result.current.writeField(c3, 'description', 'Cooker');
      result.current.writeCell(c3, 'irLiveEarth', '>200');
    });
    // Optimistic: the typist sees every value before any answer.
    expect(cellOf(result.current, c1, 'zs')?.text).toBe('0.44');
    expect(result.current.detail?.circuits[2]?.description).toBe('Cooker');
    expect(result.current.status).toEqual({ state: 'saving', waiting: 4 });
    expect(result.current.isPending?.(c1, 'zs')).toBe(true);

    await waitFor(() => expect(result.current.status).toEqual({ state: 'saved' }));
    expect(server.writes().map((w) => `${w.method} ${w.path}`)).toEqual([
      `PUT /api/boards/${server.boardId}/circuits/${c1}/cells/zs`,
      `PUT /api/boards/${server.boardId}/circuits/${c2}/cells/zs`,
      `PATCH /api/boards/${server.boardId}/circuits/${c3}`,
      `PUT /api/boards/${server.boardId}/circuits/${c3}/cells/irLiveEarth`,
    ]);
    expect(server.maxWritesInFlight).toBe(1);
    expect((await server.cell(c1, 'zs'))?.text).toBe('0.44');
    expect((await server.cell(c3, 'irLiveEarth'))?.text).toBe('>200');
    expect((await server.circuit(c3)).description).toBe('Cooker');
    // The cache took the server's answers in place: versions and who wrote them.
    expect(cellOf(result.current, c1, 'zs')).toMatchObject({ text: '0.44', version: 1, updatedBy: { name: 'Tom Tester' } });
    expect(result.current.isPending?.(c1, 'zs')).toBe(false);
    expect(localStorage.getItem(outboxStorageKey(server.boardId))).toBeNull();
  });

  it('when one cell is edited three times before the first edit lands, then each lands on the one before (no conflict with oneself)', async () => {
    const { result } = renderSync(server.boardId);
    await loaded(result);
    const [c1] = server.circuitIds as [number];

    server.holdWrites();
    act(() => {
      result.current.writeCell(c1, 'zs', '0.5');
      result.current.writeCell(c1, 'zs', '0.6');
      result.current.writeCell(c1, 'zs', '0.7');
    });
    expect(cellOf(result.current, c1, 'zs')?.text).toBe('0.7');
    server.releaseWrites();

    await waitFor(() => expect(result.current.status).toEqual({ state: 'saved' }));
    expect(result.current.conflicts).toEqual([]);
    expect(server.writes().map((w) => [w.body, w.status])).toEqual([
      [expect.objectContaining({ text: '0.5', version: 0 }), 200],
      [expect.objectContaining({ text: '0.6', version: 1 }), 200],
      [expect.objectContaining({ text: '0.7', version: 2 }), 200],
    ]);
    expect(await server.cell(c1, 'zs')).toMatchObject({ text: '0.7', version: 3 });
    expect(cellOf(result.current, c1, 'zs')).toMatchObject({ text: '0.7', version: 3 });
  });

  it('when an edit writes what the cell already shows, then nothing is sent', async () => {
    const { result } = renderSync(server.boardId);
    await loaded(result);
    const [c1] = server.circuitIds as [number];
    act(() => result.current.writeCell(c1, 'zs', '0.5'));
    await waitFor(() => expect(result.current.status).toEqual({ state: 'saved' }));
    act(() => result.current.writeCell(c1, 'zs', ' 0.5 '));
    expect(result.current.status).toEqual({ state: 'saved' });
    expect(server.writes()).toHaveLength(1);
  });
});

describe('useBoardSync: leaving the console', () => {
  it('when the console unmounts with edits waiting, then they are still sent, and polling stops', async () => {
    const { result, unmount } = renderSync(server.boardId);
    await loaded(result);
    const [c1, c2] = server.circuitIds as [number, number];
    server.holdWrites();
    act(() => {
      result.current.writeCell(c1, 'zs', '0.47');
      result.current.writeCell(c2, 'zs', '0.58');
    });
    unmount();
    await new Promise((resolve) => setTimeout(resolve, 20));
    server.releaseWrites();
    await waitFor(async () => expect((await server.cell(c2, 'zs'))?.text).toBe('0.58'));
    expect((await server.cell(c1, 'zs'))?.text).toBe('0.47');
    await waitFor(() => expect(localStorage.getItem(outboxStorageKey(server.boardId))).toBeNull());

    const polls = server.log.filter((r) => r.path.includes('/changes')).length;
    await new Promise((resolve) => setTimeout(resolve, 1500));
    expect(server.log.filter((r) => r.path.includes('/changes')).length).toBe(polls);
  });
});

describe('useBoardSync: conflicts', () => {
  /** Holds this page's polls so it keeps the version it saw while someone else writes. */
  async function freezeFeed() {
    const polls = () => server.log.filter((r) => r.path.includes('/changes')).length;
    const before = polls();
    server.pauseFeed();
    await waitFor(() => expect(polls()).toBeGreaterThan(before), { timeout: 3000 });
  }

  it('when someone else wrote the cell first, then a Conflict shows their value, the queue goes on, and keeping theirs drops mine', async () => {
    const { result } = renderSync(server.boardId);
    await loaded(result);
    const [c1, c2] = server.circuitIds as [number, number];
    await freezeFeed();
    const second = server.as('tester2');
    expect((await second('PUT', `/api/boards/${server.boardId}/circuits/${c1}/cells/zs`, { text: '0.71', version: 0 })).status).toBe(200);

    act(() => {
      result.current.writeCell(c1, 'zs', '0.44');
      result.current.writeCell(c2, 'zs', '0.9');
    });
    await waitFor(() => expect(result.current.conflicts).toHaveLength(1));
    await waitFor(() => expect(result.current.status).toEqual({ state: 'saved' }));
    const [conflict] = result.current.conflicts;
    expect(conflict).toMatchObject({ circuitId: c1, column: 'zs', mine: '0.44', theirs: '0.71', theirsBy: 'Tess Second' });
    // Until the typist chooses, the cell shows the other person's value.
    expect(cellOf(result.current, c1, 'zs')?.text).toBe('0.71');
    // The edit behind the refused one was not held up.
    expect((await server.cell(c2, 'zs'))?.text).toBe('0.9');

    act(() => result.current.resolveConflict(conflict!.editId, 'keep-theirs'));
    expect(result.current.conflicts).toEqual([]);
    expect(result.current.status).toEqual({ state: 'saved' });
    expect(await server.cell(c1, 'zs')).toMatchObject({ text: '0.71', version: 1 });
    expect(server.writes()).toHaveLength(2);
    server.resumeFeed();
  });

  it('when the typist overwrites, then their value is written over the current version', async () => {
    const { result } = renderSync(server.boardId);
    await loaded(result);
    const [, , c3] = server.circuitIds as [number, number, number];
    await freezeFeed();
    await server.as('tester2')('PUT', `/api/boards/${server.boardId}/circuits/${c3}/cells/zs`, { text: '1.10', version: 0 });

    act(() => result.current.writeCell(c3, 'zs', '1.25'));
    await waitFor(() => expect(result.current.conflicts).toHaveLength(1));
    const [conflict] = result.current.conflicts;
    act(() => result.current.resolveConflict(conflict!.editId, 'overwrite'));
    expect(cellOf(result.current, c3, 'zs')?.text).toBe('1.25');

    await waitFor(() => expect(result.current.status).toEqual({ state: 'saved' }));
    expect(result.current.conflicts).toEqual([]);
    expect(await server.cell(c3, 'zs')).toMatchObject({ text: '1.25', version: 2, updatedBy: { name: 'Tom Tester' } });
    expect(server.writes().at(-1)?.body).toMatchObject({ text: '1.25', version: 1 });
    server.resumeFeed();
  });

  it('when edits of the same cell queued behind a refused one, then the conflict offers the latest of them', async () => {
    const { result } = renderSync(server.boardId);
    await loaded(result);
    const [c1] = server.circuitIds as [number];
    await freezeFeed();
    await server.as('tester2')('PUT', `/api/boards/${server.boardId}/circuits/${c1}/cells/zs`, { text: '0.71', version: 0 });

    server.holdWrites();
    act(() => {
      result.current.writeCell(c1, 'zs', '0.4');
      result.current.writeCell(c1, 'zs', '0.45');
    });
    server.releaseWrites();
    await waitFor(() => expect(result.current.conflicts).toHaveLength(1));
    expect(result.current.conflicts[0]).toMatchObject({ mine: '0.45', theirs: '0.71' });
    expect(result.current.status).toEqual({ state: 'saved' });
    expect(server.writes()).toHaveLength(1);
    server.resumeFeed();
  });

  it('when someone else changed the same circuit detail, then it is a conflict, while another detail of the circuit lands', async () => {
    const { result } = renderSync(server.boardId);
    await loaded(result);
    const [, c2] = server.circuitIds as [number, number];
    await freezeFeed();
    const seen = (await server.circuit(c2)).version;
    await server.as('tester2')('PATCH', `/api/boards/${server.boardId}/circuits/${c2}`, { version: seen, changes: { description: 'Landing lights' } });

    act(() => {
      result.current.writeField(c2, 'description', 'Hall lights');
      result.current.writeField(c2, 'points', 9);
    });
    await waitFor(() => expect(result.current.status).toEqual({ state: 'saved' }));
    expect(result.current.conflicts).toEqual([expect.objectContaining({ circuitId: c2, column: 'description', mine: 'Hall lights', theirs: 'Landing lights' })]);
    expect(result.current.detail?.circuits[1]).toMatchObject({ description: 'Landing lights', points: 9 });
    expect(await server.circuit(c2)).toMatchObject({ description: 'Landing lights', points: 9 });

    act(() => result.current.resolveConflict(result.current.conflicts[0]!.editId, 'overwrite'));
    await waitFor(() => expect(result.current.status).toEqual({ state: 'saved' }));
    expect(await server.circuit(c2)).toMatchObject({ description: 'Hall lights', points: 9 });
    server.resumeFeed();
  });
});

describe('useBoardSync: offline', () => {
  it('when the server cannot be reached, then edits wait in localStorage, survive a reload and land in order when it comes back', async () => {
    const firstClient = newQueryClient();
    const first = renderSync(server.boardId, firstClient);
    await loaded(first.result);
    const [c1, c2, c3] = server.circuitIds as [number, number, number];

    server.offline = true;
    act(() => {
      first.result.current.writeCell(c1, 'zs', '0.41');
      first.result.current.writeCell(c2, 'zs', '0.52');
      first.result.current.writeField(c3, 'description', 'Garage');
      first.result.current.writeCell(c1, 'zs', '0.43');
    });
    await waitFor(() => expect(first.result.current.status).toEqual({ state: 'offline', waiting: 4 }));
    expect(cellOf(first.result.current, c1, 'zs')?.text).toBe('0.43');
    const stored = JSON.parse(localStorage.getItem(outboxStorageKey(server.boardId)) ?? 'null') as { entries: { edit: { text?: string; value?: unknown } }[] };
    expect(stored.entries.map((e) => e.edit.text ?? e.edit.value)).toEqual(['0.41', '0.52', 'Garage', '0.43']);

    // A reload: the page goes away with everything in it (its engine, which would otherwise keep
    // sending in the background) and a new page (new QueryClient, new engine) opens the board.
    first.unmount();
    await act(async () => {
      await new Promise((resolve) => setTimeout(resolve, 0));
    });
    stopBoardSync(firstClient);
    const second = renderSync(server.boardId, newQueryClient());
    await waitFor(() => expect(second.result.current.status).toEqual({ state: 'offline', waiting: 4 }));

    const failedBefore = server.writes().length;
    server.offline = false;
    act(() => {
      window.dispatchEvent(new Event('online'));
    });
    await waitFor(() => expect(second.result.current.status).toEqual({ state: 'saved' }), { timeout: 5000 });

    const landed = server.writes().slice(failedBefore).filter((w) => w.status === 200);
    expect(landed.map((w) => w.body)).toEqual([
      expect.objectContaining({ text: '0.41', version: 0 }),
      expect.objectContaining({ text: '0.52', version: 0 }),
      expect.objectContaining({ changes: { description: 'Garage' } }),
      expect.objectContaining({ text: '0.43', version: 1 }),
    ]);
    expect(await server.cell(c1, 'zs')).toMatchObject({ text: '0.43', version: 2 });
    expect((await server.cell(c2, 'zs'))?.text).toBe('0.52');
    expect((await server.circuit(c3)).description).toBe('Garage');
    expect(localStorage.getItem(outboxStorageKey(server.boardId))).toBeNull();
    await waitFor(() => expect(cellOf(second.result.current, c1, 'zs')?.text).toBe('0.43'));
  });
});

describe('useBoardSync: live changes', () => {
  it("when someone else writes, then their change appears within 2 s without touching a cell this typist is still sending", async () => {
    const { result } = renderSync(server.boardId);
    const before = await loaded(result);
    const [c1, c2] = server.circuitIds as [number, number];

    server.holdWrites();
    act(() => result.current.writeCell(c1, 'zs', '0.44'));
    const second = server.as('tester2');
    await second('PUT', `/api/boards/${server.boardId}/circuits/${c1}/cells/zs`, { text: '0.80', version: 0 });
    await second('PUT', `/api/boards/${server.boardId}/circuits/${c2}/cells/r1PlusR2`, { text: '0.61', version: 0 });

    await waitFor(() => expect(cellOf(result.current, c2, 'r1PlusR2')?.text).toBe('0.61'), { timeout: 2000 });
    expect(cellOf(result.current, c2, 'r1PlusR2')?.updatedBy?.name).toBe('Tess Second');
    expect(cellOf(result.current, c1, 'zs')?.text).toBe('0.44');
    expect(result.current.isPending?.(c1, 'zs')).toBe(true);
    // The untouched circuit is the same object: its row need not render again.
    expect(result.current.detail?.circuits[2]).toBe(before.circuits[2]);

    // When the held write goes, its version is stale: a conflict, never a silent overwrite.
    server.releaseWrites();
    await waitFor(() => expect(result.current.conflicts).toEqual([expect.objectContaining({ mine: '0.44', theirs: '0.80' })]));
  });

  it('when someone else inserts and removes circuits, then the order follows and they are listed as present', async () => {
    const { result } = renderSync(server.boardId);
    const before = await loaded(result);
    const [c1, c2, c3] = server.circuitIds as [number, number, number];
    const second = server.as('tester2');
    const { body } = await second('POST', `/api/boards/${server.boardId}/circuits`, { afterCircuitId: c1, description: 'Shower' });
    await second('DELETE', `/api/boards/${server.boardId}/circuits/${c3}`);
    await second('GET', `/api/boards/${server.boardId}/changes?after=0`);

    await waitFor(() => expect(result.current.detail?.circuits.map((c) => c.id)).toEqual([c1, body.circuit.id, c2]), { timeout: 2000 });
    expect(result.current.detail?.circuits[1]?.description).toBe('Shower');
    expect(result.current.detail?.circuits[0]).toBe(before.circuits[0]);
    await waitFor(() => expect(result.current.present).toEqual([expect.objectContaining({ name: 'Tess Second' })]), { timeout: 2000 });
  });
});

describe('useBoardSync: refusals', () => {
  it('when the board is locked, then the reading is refused in words and the message stays until the next save', async () => {
    // Locking needs a board that passes the completeness gate: every reading recorded.
    await completeBoard(server.app, server.boardId);
    const { result } = renderSync(server.boardId);
    await loaded(result);
    const [c1, c2] = server.circuitIds as [number, number];
    const reviewer = server.as('reviewer');
    expect((await reviewer('POST', `/api/boards/${server.boardId}/lock`)).status).toBe(200);

    act(() => result.current.writeCell(c1, 'zs', '0.3'));
    await waitFor(() => expect(result.current.status).toMatchObject({ state: 'error', message: expect.stringMatching(/locked/) }));
    expect(cellOf(result.current, c1, 'zs')?.text).toBe('0.44');
    expect((await server.cell(c1, 'zs'))?.text).toBe('0.44');
    await waitFor(() => expect(result.current.detail?.board.state).toBe('locked'), { timeout: 2000 });
    expect(result.current.status.state).toBe('error');

    await reviewer('POST', `/api/boards/${server.boardId}/unlock`, { reason: 'Zs of circuit 1 to be added' });
    act(() => result.current.writeCell(c2, 'zs', '0.8'));
    await waitFor(() => expect(result.current.status).toEqual({ state: 'saved' }));
  });

  it('when a structural change is asked for, then the cache follows, and a refusal throws the server message', async () => {
    const { result } = renderSync(server.boardId);
    await loaded(result);
    const [c1, c2, c3] = server.circuitIds as [number, number, number];

    let inserted: Awaited<ReturnType<BoardSync['insertCircuit']>> | undefined;
    await act(async () => {
      inserted = await result.current.insertCircuit(c1, { description: 'Shower' });
    });
    // The cache tells its observers on the next tick.
    await waitFor(() => expect(result.current.detail?.circuits.map((c) => c.id)).toEqual([c1, inserted!.id, c2, c3]));
    expect(result.current.detail?.circuits.map((c) => c.position)).toEqual([1, 2, 3, 4]);

    await act(() => result.current.removeCircuit(c2));
    await waitFor(() => expect(result.current.detail?.circuits.map((c) => c.id)).toEqual([c1, inserted!.id, c3]));
    expect(result.current.detail?.circuits.map((c) => c.position)).toEqual([1, 2, 3]);

    await expect(result.current.lockBoard()).rejects.toThrow('Only a reviewer or an admin can do this');
    await expect(result.current.unlockBoard('no')).rejects.toThrow();
  });
});
