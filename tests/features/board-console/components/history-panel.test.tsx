import { screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { boardDetail, cellOf, circuit, renderConsole } from './console-fixture.tsx';

function jsonResponse(body: unknown): Response {
  return new Response(JSON.stringify(body), { status: 200, headers: { 'content-type': 'application/json' } });
}

afterEach(() => vi.unstubAllGlobals());

const detail = () => boardDetail([circuit(81, '1', { zs: '0.52' }, { kind: 'radial' })]);

describe('history from the keyboard', () => {
  it('when Alt+Shift+H is pressed on a cell, then its changes show with who, when and how, newest first; Esc goes back to the grid', async () => {
    const fetchMock = vi.fn(async (url: string) => {
      expect(url).toBe('/api/boards/1/circuits/81/cells/zs/history');
      return jsonResponse({
        history: [
          { id: 1, oldText: null, newText: '0.55', by: { id: 2, name: 'Priya Shah' }, at: '2026-11-30T09:12:00.000Z', how: 'dictated' },
          { id: 2, oldText: '0.55', newText: '0.52', by: { id: 3, name: 'Owen Marsh' }, at: '2026-11-30T09:20:00.000Z', how: 'typed' },
        ],
      });
    });
    vi.stubGlobal('fetch', fetchMock);
    const { grid, user } = renderConsole(detail());
    await user.click(cellOf(grid, '1', 'Zs'));
    await user.keyboard('{Alt>}{Shift>}H{/Shift}{/Alt}');
    const panel = await screen.findByRole('region', { name: 'History of Zs, circuit 1' });
    await waitFor(() => expect(within(panel).getAllByRole('listitem')).toHaveLength(2));
    const items = within(panel).getAllByRole('listitem');
    expect(items[0]).toHaveTextContent('Owen Marsh · typed · “0.55” → “0.52”');
    expect(items[1]).toHaveTextContent('Priya Shah · dictated · (empty) → “0.55”');
    await user.keyboard('{Escape}');
    expect(screen.queryByRole('region', { name: /History of/ })).toBeNull();
    expect(document.activeElement).toBe(grid);
  });

  it('when the board history is filtered by person, then the filter goes to the server', async () => {
    const fetchMock = vi.fn(async (url: string) =>
      jsonResponse({
        history: url.includes('person=3')
          ? [{ id: 9, circuitId: 81, circuitNumber: '1', column: 'zs', action: 'cell', oldText: '0.55', newText: '0.52', by: { id: 3, name: 'Owen Marsh' }, at: '2026-11-30T09:20:00.000Z', how: 'typed' }]
          : [
              { id: 10, circuitId: null, circuitNumber: null, column: null, action: 'unlocked', oldText: null, newText: 'Zs of circuit 1 to be tested again', by: { id: 4, name: 'Rhea Review' }, at: '2026-11-30T10:00:00.000Z', how: 'typed' },
              { id: 9, circuitId: 81, circuitNumber: '1', column: 'zs', action: 'cell', oldText: '0.55', newText: '0.52', by: { id: 3, name: 'Owen Marsh' }, at: '2026-11-30T09:20:00.000Z', how: 'typed' },
            ],
        people: [
          { id: 3, name: 'Owen Marsh' },
          { id: 4, name: 'Rhea Review' },
        ],
      }),
    );
    vi.stubGlobal('fetch', fetchMock);
    const { user } = renderConsole(detail());
    await user.keyboard('{Alt>}{Shift>}Y{/Shift}{/Alt}');
    const panel = await screen.findByRole('region', { name: 'Board history' });
    await waitFor(() => expect(within(panel).getAllByRole('listitem')).toHaveLength(2));
    expect(within(panel).getAllByRole('listitem')[0]).toHaveTextContent('unlocked');
    expect(within(panel).getAllByRole('listitem')[0]).toHaveTextContent('Zs of circuit 1 to be tested again');
    await user.selectOptions(within(panel).getByLabelText('Person'), 'Owen Marsh');
    await waitFor(() => expect(within(panel).getAllByRole('listitem')).toHaveLength(1));
    expect(fetchMock.mock.calls.at(-1)?.[0]).toBe('/api/boards/1/history?person=3');
    expect(within(panel).getByRole('listitem')).toHaveTextContent('circuit 1 · Zs · typed');
  });
});
