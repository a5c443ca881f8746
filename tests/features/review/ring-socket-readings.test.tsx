import { screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { diagnoseRingSockets, ringVerdictText } from '../../../shared/checker/index.ts';
import type { RingReadings, RingSocket } from '../../../shared/schemas/ring-sockets.ts';
import { ReviewJobPage } from '../../../src/features/review/components/review-job-page.tsx';
import { json, renderWithProviders, stubApi } from '../../helpers/render.tsx';
import { reviewJob } from './review-fixture.ts';

afterEach(() => vi.unstubAllGlobals());

// An invented ring: r1 0.48, rn 0.48, r2 0.80 Ω, four sockets in ring order, the third one high.
const ends = { ringR1: { text: '0.48' }, ringRn: { text: '0.48' }, ringR2: { text: '0.80' } };
const sockets: RingSocket[] = [
  { label: 'Bedroom 1 bedside', position: null, lineNeutral: '0.24', lineCpc: '0.31' },
  { label: 'Bedroom 1 desk', position: null, lineNeutral: '0.24', lineCpc: '0.32' },
  { label: 'Landing', position: null, lineNeutral: '0.25', lineCpc: '0.55' },
  { label: 'Bedroom 2', position: null, lineNeutral: '0.24', lineCpc: '0.31' },
];

function ringOnBoard(withEnds: boolean): RingReadings {
  const profile = withEnds ? diagnoseRingSockets(ends, sockets) : null;
  return {
    circuitId: 11,
    circuitNumber: '1',
    description: 'Sockets upstairs',
    sockets,
    diagnosis: profile && { verdict: profile.verdict, verdictText: ringVerdictText[profile.verdict], message: profile.message, suspects: profile.suspects },
  };
}

function renderWith(rings: RingReadings[] | undefined) {
  const job = reviewJob();
  job.boards[0] = { ...job.boards[0]!, rings };
  stubApi({ 'GET /api/review/jobs/9': () => json(200, job) });
  return renderWithProviders(<ReviewJobPage jobId={9} role="reviewer" />, { path: '/review/:jobId', initialEntries: ['/review/9'] });
}

describe('review screen: a ring’s socket readings', () => {
  it('when a ring on the board has socket readings, then the reviewer reads them socket by socket with the diagnosis, the high socket marked', async () => {
    renderWith([ringOnBoard(true)]);
    const board = await screen.findByRole('region', { name: 'Board CU1' });
    const part = within(board).getByRole('region', { name: 'Ring socket readings on board CU1' });
    const table = within(part).getByRole('table', { name: 'Ring 1 (Sockets upstairs): readings at each socket' });
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows.map((r) => within(r).getAllByRole('cell').map((c) => c.textContent))).toEqual([
      ['Bedroom 1 bedside', '', '0.24', '0.31', ''],
      ['Bedroom 1 desk', '', '0.24', '0.32', ''],
      // Two halves of a cross-connected ring in parallel read at most (r1+r2)/4 = (0.48+0.80)/4 =
      // 0.32 Ω on a sound ring (common practice): 0.55 Ω at the landing is the one to look at.
      ['Landing', '', '0.25', '0.55', 'points here'],
      ['Bedroom 2', '', '0.24', '0.31', ''],
    ]);
    expect((0.48 + 0.8) / 4).toBeCloseTo(0.32, 10);
    expect(part).toHaveTextContent('Diagnosis: a reading high at a point (a spur or a loose termination).');
    expect(part).toHaveTextContent('not a certainty');
    // Read-only: nothing to type into or press.
    expect(within(part).queryByRole('textbox')).toBeNull();
    expect(within(part).queryByRole('button')).toBeNull();
  });

  it('when r1 or r2 is missing, then the readings show with "no diagnosis" in words', async () => {
    renderWith([ringOnBoard(false)]);
    const part = await screen.findByRole('region', { name: 'Ring socket readings on board CU1' });
    expect(within(part).getAllByRole('row')).toHaveLength(5);
    expect(part).toHaveTextContent('No diagnosis: the ring’s end-to-end readings r1 and r2 are not both recorded.');
  });

  it('when no ring has socket readings (or the server sends none), then the part is not shown', async () => {
    renderWith(undefined);
    await screen.findByRole('region', { name: 'Board CU1' });
    expect(screen.queryByRole('region', { name: /Ring socket readings/ })).toBeNull();
  });
});
