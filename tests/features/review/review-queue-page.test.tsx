import { screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ReviewQueuePage } from '../../../src/features/review/components/review-queue-page.tsx';
import { json, renderWithProviders, stubApi } from '../../helpers/render.tsx';
import { reviewJob } from './review-fixture.ts';

afterEach(() => vi.unstubAllGlobals());

const job = reviewJob().job;
const entry = (id: number, reference: string, at: string, counts: { errors: number; accepted: number; warnings: number; missingReadings: number }) => ({
  job: { ...job, id, reference },
  site: { id: 2, client: 'Marsh Lane Lettings', address: '4 Heron Row' },
  submitted: { by: { id: 2, name: 'Tom Tester' }, at, note: `note ${reference}` },
  boardCount: 2,
  lockedBoards: 1,
  counts,
});

describe('review queue', () => {
  it('when jobs wait, then they are listed in the order served (oldest first) with their counts; arrows move and Enter opens', async () => {
    stubApi({
      'GET /api/review/queue': () =>
        json(200, {
          jobs: [
            entry(7, 'KV-EICR-0040', '2026-12-01T09:00:00.000Z', { errors: 3, accepted: 1, warnings: 2, missingReadings: 14 }),
            entry(9, 'KV-EICR-0042', '2026-12-01T16:20:00.000Z', { errors: 0, accepted: 0, warnings: 0, missingReadings: 0 }),
          ],
        }),
    });
    const { user, currentPath } = renderWithProviders(<ReviewQueuePage />, { path: '/review', otherRoutes: { '/review/:jobId': <p>One job</p> } });
    const first = await screen.findByRole('link', { name: 'EICR KV-EICR-0040' });
    expect(first).toHaveFocus();
    const row = first.closest('tr')!;
    expect(within(row).getAllByRole('cell').map((c) => c.textContent)).toEqual([
      'EICR KV-EICR-0040',
      'Marsh Lane Lettings4 Heron Row',
      expect.stringContaining('by Tom Tester“note KV-EICR-0040”'),
      '1 of 2',
      '31 accepted',
      '2',
      '14',
    ]);
    await user.keyboard('{ArrowDown}');
    expect(screen.getByRole('link', { name: 'EICR KV-EICR-0042' })).toHaveFocus();
    await user.keyboard('{Enter}');
    expect(currentPath()).toBe('/review/9');
  });

  it('when nothing waits, then it says so in words', async () => {
    stubApi({ 'GET /api/review/queue': () => json(200, { jobs: [] }) });
    renderWithProviders(<ReviewQueuePage />, { path: '/review' });
    expect(await screen.findByText(/No job is waiting for review/)).toBeInTheDocument();
  });
});
