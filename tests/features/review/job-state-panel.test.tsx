import { screen, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { JobStatePanel } from '../../../src/features/review/components/job-state-panel.tsx';
import { json, renderWithProviders, stubApi } from '../../helpers/render.tsx';
import { reviewJob } from './review-fixture.ts';

afterEach(() => vi.unstubAllGlobals());

const gate = (state: 'entering' | 'ready' | 'approved', reasons: string[], lastChange: unknown = null) => ({
  jobId: 9,
  state,
  canApprove: reasons.length === 0,
  reasons,
  boards: [{ boardId: 5, reference: 'CU1', state: 'open', canLock: false, reasons: ['Zs not recorded on circuit 3.'] }],
  lastChange,
});

describe('job state panel', () => {
  it('when a job is being entered, then the gate shows before anyone tries, and a tester submits with a note (Enter)', async () => {
    let state: 'entering' | 'ready' = 'entering';
    const calls = stubApi({
      'GET /api/jobs/9/gate': () => json(200, gate(state, ['Board CU1 is not locked.'])),
      'POST /api/jobs/9/submit': () => {
        state = 'ready';
        return json(200, { job: { ...reviewJob().job, state: 'ready' } });
      },
    });
    const { user } = renderWithProviders(<JobStatePanel jobId={9} role="tester" />);
    expect(await screen.findByText('Board CU1 is not locked.')).toBeInTheDocument();
    expect(screen.getByText(/Board CU1: 1 reason it cannot be locked yet/)).toBeInTheDocument();
    await user.click(screen.getByRole('textbox', { name: 'Note for the reviewer (optional)' }));
    await user.keyboard('Typed from the site sheets{Enter}');
    await waitFor(() => expect(calls.find((c) => c.method === 'POST')).toMatchObject({ path: '/api/jobs/9/submit', body: { note: 'Typed from the site sheets' } }));
    expect(await screen.findByRole('status')).toHaveTextContent('Submitted');
    expect(await screen.findByText('ready for review')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Approve' })).toBeNull();
  });

  it('when a reviewer approves and the server refuses, then the gate’s reasons are listed', async () => {
    stubApi({
      'GET /api/jobs/9/gate': () => json(200, gate('ready', [], { from: 'entering', to: 'ready', by: { id: 2, name: 'Tom Tester' }, at: '2026-12-01T16:20:00.000Z', reason: 'All typed up' })),
      'POST /api/jobs/9/approve': () => json(409, { error: { code: 'conflict', message: 'Job KV-1 cannot be approved yet: 1 reason.', details: { reasons: ['Board CU1 is not locked.'] } } }),
    });
    const { user } = renderWithProviders(<JobStatePanel jobId={9} role="reviewer" />);
    expect(await screen.findByText(/Submitted for review by Tom Tester .*“All typed up”/)).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Approve' }));
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Job KV-1 cannot be approved yet: 1 reason.Board CU1 is not locked.');
  });

  it('when a reviewer sends back without a reason, then it is refused at the field and nothing is sent', async () => {
    const calls = stubApi({ 'GET /api/jobs/9/gate': () => json(200, gate('approved', [])) });
    const { user } = renderWithProviders(<JobStatePanel jobId={9} role="admin" />);
    await user.click(await screen.findByRole('button', { name: 'Send back' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('Say why the job is sent back');
    expect(calls.filter((c) => c.method === 'POST')).toEqual([]);
  });
});
