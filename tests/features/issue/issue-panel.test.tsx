import { screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { JobIssue } from '../../../shared/schemas/issues.ts';
import type { Job } from '../../../shared/schemas/sites.ts';
import { IssuePanel } from '../../../src/features/issue/components/issue-panel.tsx';
import { json, renderWithProviders, stubApi } from '../../helpers/render.tsx';

const job = (state: Job['state']): Job => ({
  id: 7, siteId: 2, kind: 'EICR', reference: 'EICR-2026-0042', visitDate: '2026-11-30', visitEndDate: null, limitations: '',
  state, startedFromJobId: null, createdAt: '2026-11-30T08:00:00.000Z', version: 4,
});
const revision = (n: number, supersededAt: string | null = null): JobIssue => ({
  revision: n, issuedBy: { id: 3, name: 'Rhea Reviewer' }, issuedAt: `2026-12-0${n}T09:30:00.000Z`, sha256: `${n}`.repeat(64), sizeBytes: 61_440,
  supersededAt, pdfUrl: `/api/jobs/7/issues/${n}/pdf`,
});

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('issue panel', () => {
  it('when a reviewer issues an approved job, then revision 1 is listed with its download link', async () => {
    let issued = false;
    const calls = stubApi({
      'GET /api/jobs/7/issues': () => json(200, issued ? { job: job('issued'), issues: [revision(1)] } : { job: job('approved'), issues: [] }),
      'POST /api/jobs/7/issue': () => {
        issued = true;
        return json(201, { issue: revision(1), job: job('issued') });
      },
    });
    const { user } = renderWithProviders(<IssuePanel jobId={7} role="reviewer" />);
    await user.click(await screen.findByRole('button', { name: 'Issue revision 1' }));

    expect(await screen.findByRole('status')).toHaveTextContent('Revision 1 issued: its PDF is stored and will not change.');
    const list = await screen.findByRole('list', { name: 'Revisions' });
    const link = within(list).getByRole('link', { name: /Download EICR-2026-0042 revision 1 \(PDF, 60 kB\)/ });
    expect(link).toHaveAttribute('href', '/api/jobs/7/issues/1/pdf');
    expect(calls.filter((c) => c.method === 'POST')).toHaveLength(1);
    // Issued: no second issue, but a reviewer may reopen it.
    expect(screen.queryByRole('button', { name: /Issue revision/ })).not.toBeInTheDocument();
    expect(screen.getByRole('form', { name: 'Reopen the job' })).toBeInTheDocument();
  });

  it('when the server refuses the issue, then its message and reasons are shown', async () => {
    stubApi({
      'GET /api/jobs/7/issues': () => json(200, { job: job('approved'), issues: [] }),
      'POST /api/jobs/7/issue': () =>
        json(409, { error: { code: 'conflict', message: 'EICR-2026-0042 cannot be issued until it is signed: the reviewer has not signed.', details: { reasons: ['the reviewer has not signed'] } } }),
    });
    const { user } = renderWithProviders(<IssuePanel jobId={7} role="admin" />);
    await user.click(await screen.findByRole('button', { name: 'Issue revision 1' }));
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('cannot be issued until it is signed');
    expect(within(alert).getByRole('listitem')).toHaveTextContent('the reviewer has not signed');
  });

  it('when a reviewer reopens with no reason, then the field says why and nothing is sent; with a reason, Enter reopens it', async () => {
    let reopened = false;
    const calls = stubApi({
      'GET /api/jobs/7/issues': () => json(200, { job: job(reopened ? 'entering' : 'issued'), issues: [revision(2), revision(1, '2026-12-02T09:30:00.000Z')] }),
      'POST /api/jobs/7/reopen': () => {
        reopened = true;
        return json(200, { job: job('entering') });
      },
    });
    const { user } = renderWithProviders(<IssuePanel jobId={7} role="reviewer" />);
    const field = await screen.findByLabelText('Why the issued report must change');
    await user.type(field, '{Enter}');
    expect(field).toHaveAttribute('aria-invalid', 'true');
    expect(field).toHaveAccessibleDescription('Say why the issued document must change.');
    expect(field).toHaveFocus();
    expect(calls.filter((c) => c.method === 'POST')).toHaveLength(0);

    await user.type(field, 'Ze was recorded at the wrong board{Enter}');
    expect(await screen.findByRole('status')).toHaveTextContent('Reopened: the job is being entered again. Revision 2 stays as issued; the next issue will be revision 3. Everyone signs again for it');
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({ reason: 'Ze was recorded at the wrong board' });
    // Both revisions stay listed, the older one marked superseded.
    const items = within(screen.getByRole('list', { name: 'Revisions' })).getAllByRole('listitem');
    expect(items[0]).toHaveTextContent('Revision 2');
    expect(items[0]).toHaveTextContent('current');
    expect(items[1]).toHaveTextContent('superseded');
  });

  it('when a tester opens an approved job, then there is no issue button and it says who issues', async () => {
    stubApi({ 'GET /api/jobs/7/issues': () => json(200, { job: job('approved'), issues: [] }) });
    renderWithProviders(<IssuePanel jobId={7} role="tester" />);
    expect(await screen.findByText('Approved: a reviewer or an admin issues it.')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Issue/ })).not.toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Download the job as JSON' })).toHaveAttribute('href', '/api/jobs/7/export.json');
  });
});
