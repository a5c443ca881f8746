import { screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { JobMail, OutgoingMail } from '../../../shared/schemas/mail.ts';
import { SendPanel } from '../../../src/features/mail/components/send-panel.tsx';
import { json, renderWithProviders, stubApi } from '../../helpers/render.tsx';

const issued: Omit<JobMail, 'mail'> = {
  jobState: 'issued',
  defaultTo: 'priya@client.example',
  latestIssue: { id: 3, revision: 2, issuedAt: '2026-11-30T10:00:00.000Z' },
  photosChosen: 0,
};

const outgoing = (changes: Partial<OutgoingMail>): OutgoingMail => ({
  id: 11,
  jobId: 5,
  revision: 2,
  to: 'priya@client.example',
  subject: 'Electrical installation condition report BW-0042, revision 2: 9 Orchard Row',
  body: 'Hello',
  state: 'waiting',
  attempts: 0,
  lastError: null,
  createdBy: { id: 2, name: 'Rhea Reviewer' },
  createdAt: '2026-11-30T10:05:00.000Z',
  sentAt: null,
  ...changes,
});

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('send panel', () => {
  it('when two photos of the notes are chosen, then the form says they go with the document', async () => {
    stubApi({ 'GET /api/jobs/5/mail': () => json(200, { ...issued, photosChosen: 2, mail: [] }) });
    renderWithProviders(<SendPanel jobId={5} personRole="reviewer" />);
    expect(await screen.findByText(/The 2 photos of the notes chosen under “Photos of the notes” go with it\./)).toBeInTheDocument();
  });

  it('when the job is not issued yet, then it says sending opens once it is', async () => {
    stubApi({ 'GET /api/jobs/5/mail': () => json(200, { ...issued, jobState: 'approved', latestIssue: null, mail: [] }) });
    renderWithProviders(<SendPanel jobId={5} personRole="reviewer" />);
    expect(await screen.findByText('The document can be sent once the job is issued; it is approved.')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Send to client' })).not.toBeInTheDocument();
  });

  it('when a reviewer sends with a message, then the request carries both and a failed send shows its reason and can be retried', async () => {
    let mail: OutgoingMail[] = [];
    const calls = stubApi({
      'GET /api/jobs/5/mail': () => json(200, { ...issued, mail }),
      'POST /api/jobs/5/send': () => {
        mail = [outgoing({ state: 'failed', attempts: 1, lastError: 'The mail server refused the connection (connect ECONNREFUSED 127.0.0.1:2525). Check that it is running, then retry.' })];
        return json(202, { mail: outgoing({}) });
      },
      'POST /api/mail/11/retry': () => {
        mail = [outgoing({ state: 'sent', attempts: 2, sentAt: '2026-11-30T10:07:00.000Z' })];
        return json(202, { mail: outgoing({ state: 'waiting', attempts: 1 }) });
      },
    });
    const { user } = renderWithProviders(<SendPanel jobId={5} personRole="reviewer" />);
    expect(await screen.findByLabelText('To')).toHaveValue('priya@client.example');
    expect(screen.getByText('Nothing has been sent for this job yet.')).toBeInTheDocument();
    expect(screen.getByText(/No photo of the notes goes with it/)).toBeInTheDocument();

    await user.type(screen.getByLabelText('Your message (optional)'), 'Observation 2 needs attention this month.{Control>}{Enter}{/Control}');

    expect(await screen.findByText('Revision 2 is on its way to priya@client.example.')).toBeInTheDocument();
    expect(calls.find((c) => c.path === '/api/jobs/5/send')?.body).toEqual({ to: 'priya@client.example', message: 'Observation 2 needs attention this month.' });

    const list = await screen.findByRole('list', { name: 'E-mails of this job' });
    expect(await within(list).findByText(/refused the connection/)).toBeInTheDocument();
    expect(within(list).getByText('not sent')).toBeInTheDocument();

    await user.click(within(list).getByRole('button', { name: 'Retry sending to priya@client.example' }));
    expect(await within(list).findByText('sent')).toBeInTheDocument();
    expect(within(list).getByText(/2 attempts/)).toBeInTheDocument();
    expect(calls.filter((c) => c.path === '/api/mail/11/retry')).toHaveLength(1);
  });

  it('when the site has no contact e-mail and none is typed, then the address field says so and nothing is sent', async () => {
    const calls = stubApi({ 'GET /api/jobs/5/mail': () => json(200, { ...issued, defaultTo: '', mail: [] }) });
    const { user } = renderWithProviders(<SendPanel jobId={5} personRole="admin" />);
    await user.click(await screen.findByRole('button', { name: 'Send to client' }));
    const to = screen.getByLabelText('To');
    expect(to).toHaveAccessibleDescription('Give the address to send to: the site has no contact e-mail.');
    expect(to).toHaveFocus();
    expect(calls.some((c) => c.method === 'POST')).toBe(false);
  });

  it('when a tester looks, then the e-mails show but there is no send form or retry', async () => {
    stubApi({ 'GET /api/jobs/5/mail': () => json(200, { ...issued, mail: [outgoing({ state: 'failed', attempts: 1, lastError: 'No answer.' })] }) });
    renderWithProviders(<SendPanel jobId={5} personRole="tester" />);
    expect(await screen.findByText('A reviewer or an admin sends revision 2 to the client.')).toBeInTheDocument();
    expect(screen.getByText('No answer.')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Retry/ })).not.toBeInTheDocument();
  });
});
