import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createRef } from 'react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { PhotoPanel } from '../../../../src/features/board-console/photos/photo-panel.tsx';

const photo = { id: 41, mime: 'image/png', sizeBytes: 1200, sha256: 'a'.repeat(64), originalName: 'page-1.png', uploadedBy: { id: 2, name: 'Tom Tester' }, uploadedAt: '2026-12-02T08:00:00Z', locationNote: null };

beforeEach(() => {
  localStorage.clear();
  vi.stubGlobal('fetch', vi.fn(async () => new Response(JSON.stringify({ photos: [photo, { ...photo, id: 42, originalName: 'page-2.png' }] }), { status: 200, headers: { 'content-type': 'application/json' } })));
});
afterEach(() => vi.unstubAllGlobals());

function renderPanel(onLeave = vi.fn()) {
  const panelRef = createRef<HTMLDivElement>();
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  const result = render(
    <QueryClientProvider client={client}>
      <PhotoPanel boardId={7} lockedReason={null} panelRef={panelRef} onLeave={onLeave} />
    </QueryClientProvider>,
  );
  return { ...result, panelRef, onLeave };
}

describe('the photo panel', () => {
  it('when keys are pressed on it, then the photo zooms, moves, turns and changes, and the panel’s width is remembered', async () => {
    const user = userEvent.setup();
    const { panelRef, onLeave, unmount } = renderPanel();
    const image = await waitFor(() => {
      const img = document.querySelector<HTMLImageElement>('img[data-photo-view]');
      if (!img) throw new Error('no photo yet');
      return img;
    });
    expect(image.getAttribute('src')).toBe('/api/files/41');
    act(() => panelRef.current!.focus());
    await user.keyboard('++{ArrowDown}{Shift>}{ArrowRight}{/Shift}r');
    expect(image.dataset).toMatchObject({ zoom: '1.5625', x: '-120', y: '-40', rotation: '90' });
    await user.keyboard('0');
    expect(image.dataset).toMatchObject({ zoom: '1', x: '0', y: '0', rotation: '0' });
    await user.keyboard('{PageDown}');
    expect(document.querySelector('img[data-photo-view]')!.getAttribute('src')).toBe('/api/files/42');
    expect(screen.getByText(/photo 2 of 2/)).toBeTruthy();

    await user.keyboard(']]');
    expect(localStorage.getItem('boardwalk.photo-panel.width')).toBe('500');
    await user.keyboard('{Escape}');
    expect(onLeave).toHaveBeenCalledTimes(1);
    unmount();

    renderPanel();
    expect(screen.getByRole('complementary', { name: 'Photos of the paper notes' }).style.width).toBe('500px');
  });
});
