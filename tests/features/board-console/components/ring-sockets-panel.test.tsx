import { screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { boardDetail, cellOf, circuit, renderConsole } from './console-fixture.tsx';

function jsonResponse(body: unknown): Response {
  return new Response(JSON.stringify(body), { status: 200, headers: { 'content-type': 'application/json' } });
}

afterEach(() => vi.unstubAllGlobals());

// Invented ring: r1 0.52, rn 0.53, r2 0.85 Ω (2.5/1.5 twin and earth: r2/r1 ≈ 12.1/7.41 = 1.63,
// IEC 60228). A sound ring reads r1·r2/(r1+r2) = 0.32 Ω near the ends up to (r1+r2)/4 = 0.34 Ω
// mid-ring (the closed form of the cross-connected ring, see domain notes).
const ringBoard = () =>
  boardDetail([circuit(91, '1', { ringR1: '0.52', ringRn: '0.53', ringR2: '0.85' }, { kind: 'ring', ratingA: 32, description: 'Sockets' }), circuit(92, '2', {}, { kind: 'radial' })]);

describe('a ring’s socket-by-socket readings', () => {
  it('when the L-cpc readings are typed socket by socket, then the plot and a sound diagnosis show, and Alt+Enter saves them and records the highest as R1+R2', async () => {
    const fetchMock = vi.fn(async (_url: string, init?: RequestInit) => {
      if (!init || init.method === undefined || init.method === 'GET') return jsonResponse({ sockets: [], version: 0 });
      const body = JSON.parse(String(init.body));
      return jsonResponse({ sockets: body.sockets, version: 1 });
    });
    vi.stubGlobal('fetch', fetchMock);
    const { grid, user, calls } = renderConsole(ringBoard());
    await user.click(cellOf(grid, '1', 'Zs'));
    await user.keyboard('{Alt>}{Shift>}R{/Shift}{/Alt}');
    const panel = await screen.findByRole('region', { name: 'Socket readings of ring 1' });
    const first = await within(panel).findByLabelText('L-cpc of socket 1');
    await waitFor(() => expect(first).toHaveFocus());
    await user.keyboard('0.32{Enter}0.34{Enter}0.33');
    expect(within(panel).getByRole('img', { name: /L-cpc readings at 3 sockets/ })).toBeDefined();
    expect(within(panel).getByRole('status').textContent).not.toMatch(/Type r1 and r2/);
    expect(within(panel).getByText(/Highest L-cpc 0\.34 Ω/)).toBeDefined();
    await user.keyboard('{Alt>}{Enter}{/Alt}');
    await waitFor(() => expect(calls).toContainEqual({ kind: 'cell', circuitId: 91, column: 'r1PlusR2', text: '0.34', reason: null, how: 'typed' }));
    const put = fetchMock.mock.calls.find(([, init]) => init?.method === 'PUT');
    expect(put?.[0]).toBe('/api/boards/1/circuits/91/ring-sockets');
    expect(JSON.parse(String(put?.[1]?.body))).toEqual({
      version: 0,
      sockets: [
        { label: '', position: null, lineNeutral: '', lineCpc: '0.32' },
        { label: '', position: null, lineNeutral: '', lineCpc: '0.34' },
        { label: '', position: null, lineNeutral: '', lineCpc: '0.33' },
      ],
    });
    expect(screen.queryByRole('region', { name: /Socket readings/ })).toBeNull();
    expect(screen.getByRole('status')).toHaveTextContent('recorded as 0.34');
  });

  it('when the active circuit is not a ring, then the key says why and opens nothing', async () => {
    const { grid, user } = renderConsole(ringBoard());
    await user.click(cellOf(grid, '2', 'Zs'));
    await user.keyboard('{Alt>}{Shift>}R{/Shift}{/Alt}');
    expect(screen.queryByRole('region', { name: /Socket readings/ })).toBeNull();
    expect(screen.getByRole('status')).toHaveTextContent('Circuit 2 is not a ring final circuit');
  });
});
