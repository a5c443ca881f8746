import { screen, within } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { JobsPage } from '../../../src/features/jobs/components/jobs-page.tsx';
import { json, renderWithProviders, stubApi } from '../../helpers/render.tsx';
import { boards, jobs, sites } from './jobs-fixture.ts';

function renderJobs(initialEntry = '/jobs') {
  return renderWithProviders(<JobsPage />, {
    path: '/jobs',
    initialEntries: [initialEntry],
    otherRoutes: { '/boards/:boardId': <p>Board console</p> },
  });
}

/** Board references in the order the page shows them. */
const shownBoards = () =>
  screen
    .queryAllByRole('link')
    .filter((link) => link.closest('tr'))
    .map((link) => link.textContent);

beforeEach(() => {
  stubApi({
    'GET /api/sites': () => json(200, { sites }),
    'GET /api/jobs': () => json(200, { jobs }),
    'GET /api/boards': () => json(200, { boards }),
  });
});

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('jobs page', () => {
  it('when the page opens, then sites show their jobs and boards with state, circuits and progress', async () => {
    renderJobs();

    const bakery = await screen.findByRole('region', { name: /Harbour Bakery/ });
    expect(within(bakery).getByText('HB-2026-01')).toBeInTheDocument();
    expect(within(bakery).getByTitle('Electrical Installation Condition Report')).toHaveTextContent('EICR');
    const db1 = within(bakery).getByRole('link', { name: 'DB1' }).closest('tr')!;
    expect(within(db1).getByText('open')).toBeInTheDocument();
    expect(within(db1).getByText('12')).toBeInTheDocument();
    // 12 radials × 6 needed readings (the checker's required columns) = 72; 40 typed → 55 % (rounded down).
    expect(db1).toHaveTextContent('55 % · 40 / 72 readings');

    const lodge = screen.getByRole('region', { name: /Ellis Lodge/ });
    expect(within(lodge).getByRole('link', { name: 'CU' }).closest('tr')).toHaveTextContent('locked');
    expect(within(screen.getByRole('region', { name: /Tollgate Garage/ })).getByText('No jobs at this site yet.')).toBeInTheDocument();
    expect(screen.getByRole('searchbox', { name: 'Search' })).toHaveFocus();
  });

  it('when a search is typed, then only boards whose client, address, job or board reference match stay', async () => {
    const { user, currentPath } = renderJobs();
    await screen.findByRole('link', { name: 'DB1' });
    const search = screen.getByRole('searchbox', { name: 'Search' });

    await user.type(search, 'bakery');
    expect(shownBoards()).toEqual(['DB1', 'DB2']);

    await user.clear(search);
    await user.type(search, 'Ashby');
    expect(shownBoards()).toEqual(['CU']);
    expect(screen.getByRole('region', { name: /Tollgate Garage/ })).toBeInTheDocument();

    await user.clear(search);
    await user.type(search, 'hb-2026 db2');
    expect(shownBoards()).toEqual(['DB2']);
    expect(currentPath()).toBe('/jobs?q=hb-2026+db2');

    await user.clear(search);
    await user.type(search, 'nowhere at all');
    expect(shownBoards()).toEqual([]);
    expect(screen.getByText(/Nothing matches/)).toBeInTheDocument();

    await user.keyboard('{Escape}');
    expect(shownBoards()).toEqual(['DB1', 'DB2', 'CU']);
  });

  it('when ArrowDown is pressed twice and then Enter, then the second board shown opens', async () => {
    const { user, currentPath } = renderJobs();
    await screen.findByRole('link', { name: 'DB1' });

    await user.keyboard('{ArrowDown}{ArrowDown}');
    expect(screen.getByRole('link', { name: 'DB2' }).closest('tr')).toHaveAttribute('aria-current', 'true');
    expect(screen.getByRole('status')).toHaveTextContent(/DB2, Ovens .*open, 6 circuits/);

    await user.keyboard('{Enter}');
    expect(await screen.findByText('Board console')).toBeInTheDocument();
    expect(currentPath()).toBe('/boards/102');
  });

  it('when the search narrows the list, then ArrowDown and Enter open a board among those left', async () => {
    const { user, currentPath } = renderJobs();
    await screen.findByRole('link', { name: 'DB1' });

    await user.keyboard('lodge{ArrowDown}{Enter}');

    expect(await screen.findByText('Board console')).toBeInTheDocument();
    expect(currentPath()).toBe('/boards/201');
  });

  it('when ArrowUp is pressed with nothing chosen, then the last board is chosen, and moves stop at the ends', async () => {
    const { user } = renderJobs();
    await screen.findByRole('link', { name: 'DB1' });
    const current = () => screen.getAllByRole('row').find((row) => row.getAttribute('aria-current') === 'true');

    await user.keyboard('{ArrowUp}');
    expect(current()).toHaveTextContent('CU');
    await user.keyboard('{ArrowDown}');
    expect(current()).toHaveTextContent('CU');
    await user.keyboard('{ArrowUp}{ArrowUp}{ArrowUp}');
    expect(current()).toHaveTextContent('DB1');
  });

  it('when "/" is pressed away from the search box, then the search box gets the cursor', async () => {
    const { user } = renderJobs('/jobs?q=bakery');
    await screen.findByRole('link', { name: 'DB1' });
    const search = screen.getByRole('searchbox', { name: 'Search' });
    expect(search).toHaveValue('bakery');

    search.blur();
    expect(search).not.toHaveFocus();
    await user.keyboard('/');

    expect(search).toHaveFocus();
    expect(search).toHaveValue('bakery');
  });

  it('when the boards cannot be loaded, then the reason shows, and Try again loads them', async () => {
    let failures = 1;
    stubApi({
      'GET /api/sites': () => json(200, { sites }),
      'GET /api/jobs': () => json(200, { jobs }),
      'GET /api/boards': () =>
        failures-- > 0
          ? json(500, { error: { code: 'internal', message: 'Something went wrong on the server. Nothing was changed.' } })
          : json(200, { boards }),
    });
    const { user } = renderJobs();

    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Something went wrong on the server.');
    await user.click(within(alert).getByRole('button', { name: 'Try again' }));

    expect(await screen.findByRole('link', { name: 'DB1' })).toBeInTheDocument();
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
  });
});
