import { screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { createReviewCommands } from '../../../src/features/review/commands.ts';
import { ReviewJobPage } from '../../../src/features/review/components/review-job-page.tsx';
import { json, renderWithProviders, stubApi } from '../../helpers/render.tsx';
import { reviewJob, zsError } from './review-fixture.ts';

afterEach(() => vi.unstubAllGlobals());

function renderPage(role: 'reviewer' | 'tester' = 'reviewer') {
  return renderWithProviders(<ReviewJobPage jobId={9} role={role} />, { path: '/review/:jobId', initialEntries: ['/review/9'], otherRoutes: { '/boards/:boardId': <p>Console</p> } });
}

describe('review screen: one job', () => {
  it('when it opens, then the boards with their findings and the record are side by side, with the gate and readings to do counted per column', async () => {
    stubApi({ 'GET /api/review/jobs/9': () => json(200, reviewJob()) });
    renderPage();
    const board = await screen.findByRole('region', { name: 'Board CU1' });
    expect(within(board).getByText(/Before board CU1 can be locked/)).toBeInTheDocument();
    expect(within(board).getByText('Readings to do: L-E 1')).toBeInTheDocument();
    const findings = within(board).getByRole('listbox', { name: 'Findings on board CU1' });
    // Errors first, then warnings; readings to do are counted, not listed.
    expect(within(findings).getAllByRole('option').map((o) => o.textContent?.slice(0, 60))).toEqual([
      expect.stringContaining('Circuit 3 · Zs'),
      expect.stringContaining('Circuit 1 · Zs'),
      expect.stringContaining('Circuit 2 · Zs'),
    ]);
    expect(within(findings).getByText(/Source: BS 7671:2018 Table 41.3/)).toBeInTheDocument();
    expect(screen.getByRole('region', { name: 'The job record' })).toHaveTextContent('Supply characteristics');
    expect(screen.getByText('Before this job can be approved')).toBeInTheDocument();
    expect(screen.getByText('Declaration: the inspector is not named.')).toBeInTheDocument();
  });

  it('when the reviewer selects the error with j and presses a, then a reason is asked for, sent, and the finding shows accepted with who and why', async () => {
    let accepted = false;
    const calls = stubApi({
      'GET /api/review/jobs/9': () => {
        if (!accepted) return json(200, reviewJob());
        const review = reviewJob();
        review.boards[0]!.findings = review.boards[0]!.findings.map((f) =>
          f.key === zsError.key
            ? { ...f, acceptance: { id: 1, boardId: 5, findingKey: f.key, code: f.code, message: f.message, reason: 'Recorded as observation 4, C2', acceptedBy: { id: 3, name: 'Rhea Reviewer' }, acceptedAt: '2026-12-02T09:00:00.000Z' } }
            : f,
        );
        return json(200, review);
      },
      'POST /api/jobs/9/acceptances': () => {
        accepted = true;
        return json(201, { acceptance: { id: 1, boardId: 5, findingKey: zsError.key, code: 'zs-over-max', message: zsError.message, reason: 'Recorded as observation 4, C2', acceptedBy: { id: 3, name: 'Rhea Reviewer' }, acceptedAt: '2026-12-02T09:00:00.000Z' } });
      },
    });
    const { user } = renderPage();
    await screen.findByRole('region', { name: 'Board CU1' });
    await user.keyboard('j'); // the LIM without reason: cannot be accepted
    await user.keyboard('a');
    expect(await screen.findByRole('alert')).toHaveTextContent('Accept the finding with a reason: A LIM without a reason cannot be accepted');
    await user.keyboard('j'); // the Zs error
    await waitFor(() => expect(document.activeElement?.textContent).toMatch(/Circuit 1 · Zs/));
    await user.keyboard('a');
    const reason = await screen.findByRole('textbox', { name: 'Why is it accepted?' });
    expect(reason).toHaveFocus();
    await user.keyboard('ok{Enter}');
    expect(await screen.findByText(/Say why in words/)).toBeInTheDocument();
    expect(calls.filter((c) => c.method === 'POST')).toEqual([]);
    await user.clear(reason);
    await user.keyboard('Recorded as observation 4, C2{Enter}');
    await waitFor(() => expect(calls.filter((c) => c.method === 'POST').map((c) => c.body)).toEqual([{ boardId: 5, findingKey: zsError.key, reason: 'Recorded as observation 4, C2' }]));
    expect(await screen.findByText(/Accepted by Rhea Reviewer, .*: “Recorded as observation 4, C2”/)).toBeInTheDocument();
  });

  it('when l is pressed on a board whose gate fails, then the lock is not tried and every reason is said', async () => {
    const calls = stubApi({ 'GET /api/review/jobs/9': () => json(200, reviewJob()) });
    const { user } = renderPage();
    await screen.findByRole('region', { name: 'Board CU1' });
    await user.keyboard('j');
    await user.keyboard('l');
    expect(await screen.findByRole('alert')).toHaveTextContent(/Board CU1 cannot be locked yet: L-E not recorded on circuit 3\. · Circuit 3: LIM in Zs has no reason recorded\./);
    expect(calls.filter((c) => c.method === 'POST')).toEqual([]);
  });

  it('when the Lock button is pressed and the server refuses, then its reasons are listed', async () => {
    stubApi({
      'GET /api/review/jobs/9': () => json(200, reviewJob()),
      'POST /api/boards/5/lock': () => json(409, { error: { code: 'conflict', message: 'Board CU1 cannot be locked yet: 1 reason.', details: { reasons: ['Zs not recorded on circuit 7.'] } } }),
    });
    const { user } = renderPage();
    await user.click(await screen.findByRole('button', { name: 'Lock board CU1' }));
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Board CU1 was not locked: Board CU1 cannot be locked yet: 1 reason.');
    expect(within(alert).getByRole('listitem')).toHaveTextContent('Zs not recorded on circuit 7.');
  });

  it('when b is pressed and a reason typed, then the job is sent back with it; a short reason is refused at the field', async () => {
    const calls = stubApi({
      'GET /api/review/jobs/9': () => json(200, reviewJob()),
      'POST /api/jobs/9/send-back': () => json(200, { job: { ...reviewJob().job, state: 'entering' } }),
    });
    const { user } = renderPage();
    await screen.findByRole('region', { name: 'Board CU1' });
    await user.keyboard('b');
    const input = screen.getByRole('textbox', { name: /Send back to the tester/ });
    expect(input).toHaveFocus();
    await user.keyboard('no{Enter}');
    expect(input).toHaveAccessibleDescription(/at least 5 characters/);
    await user.clear(input);
    await user.keyboard('Circuit 3 needs its L-E reading{Enter}');
    await waitFor(() => expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ reason: 'Circuit 3 needs its L-E reading' }));
  });

  it('when Alt+Shift+A is pressed while the gate fails, then nothing is sent and the reasons are said; when it passes, the job is approved', async () => {
    const calls = stubApi({ 'GET /api/review/jobs/9': () => json(200, reviewJob()) });
    const first = renderPage();
    await screen.findByRole('region', { name: 'Board CU1' });
    await first.user.keyboard('{Alt>}{Shift>}A{/Shift}{/Alt}');
    expect(await screen.findByRole('alert')).toHaveTextContent('Approve the job: Not yet: Board CU1 is not locked. · Declaration: the inspector is not named.');
    expect(calls.filter((c) => c.method === 'POST')).toEqual([]);
    first.unmount();

    const passing = reviewJob();
    passing.gate = { ...passing.gate, canApprove: true, reasons: [] };
    passing.boards[0]!.board = { ...passing.boards[0]!.board, state: 'locked' };
    const calls2 = stubApi({
      'GET /api/review/jobs/9': () => json(200, passing),
      'POST /api/jobs/9/approve': () => json(200, { job: { ...passing.job, state: 'approved' } }),
    });
    const second = renderPage();
    await screen.findByRole('region', { name: 'Board CU1' });
    await second.user.keyboard('{Alt>}{Shift>}A{/Shift}{/Alt}');
    await waitFor(() => expect(calls2.filter((c) => c.method === 'POST').map((c) => c.path)).toEqual(['/api/jobs/9/approve']));
    expect(await screen.findByRole('status')).toHaveTextContent('Job KV-EICR-0042 approved.');
  });

  it('when the palette finds "Approve the job" only by a loose match, then it asks first: Esc sends nothing, "Yes, go on" approves', async () => {
    const passing = reviewJob();
    passing.gate = { ...passing.gate, canApprove: true, reasons: [] };
    passing.boards[0]!.board = { ...passing.boards[0]!.board, state: 'locked' };
    const calls = stubApi({
      'GET /api/review/jobs/9': () => json(200, passing),
      'POST /api/jobs/9/approve': () => json(200, { job: { ...passing.job, state: 'approved' } }),
    });
    const { user } = renderPage();
    await screen.findByRole('region', { name: 'Board CU1' });
    await user.keyboard('{Control>}k{/Control}');
    const dialog = await screen.findByRole('dialog');
    await user.keyboard('aprv');
    expect(within(dialog).getAllByRole('option')[0]).toHaveAttribute('data-match', 'fuzzy');
    await user.keyboard('{Enter}');
    expect(within(dialog).getByText(/only loosely matches this command/)).toBeInTheDocument();
    await user.keyboard('{Escape}');
    expect(calls.filter((c) => c.method === 'POST')).toEqual([]);
    await user.keyboard('{Enter}');
    expect(within(dialog).getByRole('button', { name: /Yes, go on/ })).toHaveFocus();
    await user.keyboard('{Enter}');
    await waitFor(() => expect(calls.filter((c) => c.method === 'POST').map((c) => c.path)).toEqual(['/api/jobs/9/approve']));
  });

  it('when the review commands are listed, then every one that changes data is marked so, and moving about is not', () => {
    const marked = createReviewCommands()
      .filter((c) => c.changesData)
      .map((c) => c.id);
    expect(marked).toEqual(['review.accept', 'review.withdraw', 'review.lock-board', 'review.send-back', 'review.approve']);
  });

  it('when a board is locked, then the reviewer can send it back with a reason (unlock); a short reason is refused at the field', async () => {
    const locked = reviewJob();
    locked.boards[0]!.board = { ...locked.boards[0]!.board, state: 'locked', lockedBy: { id: 3, name: 'Rhea Reviewer' } };
    const calls = stubApi({
      'GET /api/review/jobs/9': () => json(200, locked),
      'POST /api/boards/5/unlock': () => json(200, { board: { ...locked.boards[0]!.board, state: 'open', lockedBy: null } }),
    });
    const { user } = renderPage();
    const reason = await screen.findByRole('textbox', { name: /Send board CU1 back \(unlock it\)/ });
    expect(screen.queryByRole('button', { name: 'Lock board CU1' })).toBeNull();
    await user.click(reason);
    await user.keyboard('no{Enter}');
    expect(reason).toHaveAccessibleDescription(/at least 5 characters/);
    await user.clear(reason);
    await user.keyboard('Circuit 3 to be tested again after the repair{Enter}');
    await waitFor(() => expect(calls.find((c) => c.method === 'POST')).toMatchObject({ path: '/api/boards/5/unlock', body: { reason: 'Circuit 3 to be tested again after the repair' } }));
    expect(await screen.findByRole('status')).toHaveTextContent('Board CU1 unlocked and sent back to the testers.');
  });

  it('when a tester somehow opens it, then no accept, lock, approve or send-back control is offered', async () => {
    stubApi({ 'GET /api/review/jobs/9': () => json(200, reviewJob()) });
    const { user } = renderPage('tester');
    await screen.findByRole('region', { name: 'Board CU1' });
    expect(screen.queryByRole('button', { name: /Lock board/ })).toBeNull();
    expect(screen.queryByRole('button', { name: /Approve/ })).toBeNull();
    await user.keyboard('j');
    expect(screen.queryByRole('button', { name: /Accept with a reason/ })).toBeNull();
  });
});
