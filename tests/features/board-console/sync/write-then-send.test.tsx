import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, cleanup, renderHook, waitFor } from '@testing-library/react';
import type { ReactNode } from 'react';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { readOutbox } from '../../../../src/features/board-console/sync/outbox-storage.ts';
import { useBoardSync } from '../../../../src/features/board-console/sync/use-board-sync.ts';
import { startSyncServer, type SyncServer } from './sync-server.ts';

let server: SyncServer;

beforeEach(async () => {
  localStorage.clear();
  server = await startSyncServer();
});

afterEach(async () => {
  cleanup();
  await server.close();
});

function renderSync(boardId: number) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const wrapper = ({ children }: { children: ReactNode }) => <QueryClientProvider client={client}>{children}</QueryClientProvider>;
  return renderHook(() => useBoardSync(boardId), { wrapper });
}

describe('useBoardSync: a keystroke that saves', () => {
  it('when a reading is written, then it is stored and shown before the call returns, marked as waiting, and sent after the frame', async () => {
    const { result } = renderSync(server.boardId);
    await waitFor(() => expect(result.current.detail).toBeDefined());
    const [c1, c2] = server.circuitIds as [number, number];
    const sent = server.writes().length;

    act(() => {
      result.current.writeCell(c1, 'zs', '0.44');
      // Nothing has gone to the server yet, but the edit is already in storage: a crash now loses nothing.
      expect(server.writes()).toHaveLength(sent);
      expect(readOutbox(localStorage, server.boardId).map((e) => [e.edit.circuitId, e.edit.kind === 'cell' ? e.edit.text : null])).toEqual([[c1, '0.44']]);
    });
    expect(result.current.detail?.circuits.find((c) => c.id === c1)?.cells.zs?.text).toBe('0.44');
    expect(result.current.status).toEqual({ state: 'saving', waiting: 1 });
    expect(result.current.pendingMarks).toEqual(new Map([[c1, ' zs ']]));
    expect(result.current.pendingMarks?.has(c2)).toBe(false);

    await waitFor(() => expect(result.current.status).toEqual({ state: 'saved' }));
    expect(server.writes().slice(sent).map((w) => w.body)).toEqual([expect.objectContaining({ text: '0.44' })]);
    expect(result.current.pendingMarks).toEqual(new Map());
    expect(readOutbox(localStorage, server.boardId)).toEqual([]);
  });
});
