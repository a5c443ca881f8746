import { screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { JobRecordPage } from '../../../src/features/job-record/components/job-record-page.tsx';
import { json, renderWithProviders, stubApi, type ApiCall } from '../../helpers/render.tsx';
import { createFakeJobServer } from './job-fixture.ts';

/** The screen polls the job every few seconds; these tests keep it still unless they test polling. */
function renderJob(server: ReturnType<typeof createFakeJobServer>, refreshEveryMs: number | false = false) {
  const calls = stubApi(server.handlers);
  const result = renderWithProviders(<JobRecordPage refreshEveryMs={refreshEveryMs} />, { path: '/jobs/:jobId', initialEntries: ['/jobs/41'], otherRoutes: { '/boards/:boardId': <p>Board console</p> } });
  return { ...result, calls };
}

const puts = (calls: ApiCall[], section: string) => calls.filter((c) => c.method === 'PUT' && c.path.endsWith(`/record/${section}`));

// The whole screen renders in jsdom; on a busy two-core machine the first render alone can take seconds.
vi.setConfig({ testTimeout: 20_000 });

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('job screen: header and sections', () => {
  it('when an EICR opens, then the header shows client, kind, reference, state and board, and only the report’s sections are there', async () => {
    renderJob(createFakeJobServer('EICR'));
    expect(await screen.findByRole('heading', { level: 1, name: /EICR-2026-0041/ })).toBeInTheDocument();
    expect(screen.getByText('Lantern Row Café')).toBeInTheDocument();
    expect(screen.getByLabelText('State: being entered')).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Open board DB-K in the console' })).toHaveAttribute('href', '/boards/301');
    // sectionsFor('EICR'): no "work" section; observations present.
    expect(screen.getByRole('heading', { name: 'Observations' })).toBeInTheDocument();
    expect(screen.queryByRole('heading', { name: 'The work this certificate covers' })).not.toBeInTheDocument();
    // The caution every results screen shows (common practice).
    expect(screen.getByRole('region', { name: 'Caution' })).toHaveTextContent(/competent people.*safe isolation/);
  });

  it('when an EIC opens, then it has the work section and no observations; the declaration offers one person for all three', async () => {
    renderJob(createFakeJobServer('EIC'));
    expect(await screen.findByRole('heading', { name: 'The work this certificate covers' })).toBeInTheDocument();
    expect(screen.queryByRole('heading', { name: 'Observations' })).not.toBeInTheDocument();
    expect(screen.getByRole('group', { name: 'Designed by' })).toBeInTheDocument();
    expect(screen.getByLabelText('One person designed, built, and inspected and tested the work')).not.toBeChecked();
  });
});

describe('job screen: fields save on leaving them', () => {
  it('when Ze is typed as words, then the zod message shows at the field and nothing is sent; a number is saved with the section’s version and Enter moves on', async () => {
    const server = createFakeJobServer('EICR');
    const { user, calls } = renderJob(server);
    const ze = await screen.findByLabelText('External loop impedance Ze (Ω)');

    await user.click(ze);
    await user.keyboard('about half{Enter}');
    // Message from supplySectionSchema (shared/schemas/job-record.ts).
    expect(await screen.findByText('Ze must be a number.')).toBeInTheDocument();
    expect(ze).toHaveAttribute('aria-invalid', 'true');
    expect(puts(calls, 'supply')).toHaveLength(0);

    await user.clear(ze);
    await user.type(ze, '0.28{Enter}');
    await waitFor(() => expect(puts(calls, 'supply')).toHaveLength(1));
    expect(puts(calls, 'supply')[0]!.body).toEqual({ version: 0, changes: { zeOhm: 0.28 } });
    expect(await within(ze.parentElement!).findByText('✓ saved')).toBeInTheDocument();
    expect(screen.getByLabelText('Prospective fault current Ipf (kA)')).toHaveFocus();

    await user.keyboard('1.9{Enter}');
    await waitFor(() => expect(puts(calls, 'supply')).toHaveLength(2));
    // The second write carries the version the first one left.
    expect(puts(calls, 'supply')[1]!.body).toEqual({ version: 1, changes: { ipfKa: 1.9 } });
  });

  it('when someone else changed the same field, then their value shows at the field with keep mine / take theirs, and keep mine sends it again over theirs', async () => {
    const server = createFakeJobServer('EICR');
    const { user, calls } = renderJob(server);
    const orderedBy = await screen.findByLabelText('Asked for by');
    server.writeAsOther('client', 'orderedBy', 'Millbrook Lettings');

    await user.click(orderedBy);
    await user.keyboard('Priya Okafor{Tab}');

    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Theirs: Millbrook Lettings');
    expect(alert).toHaveTextContent('yours: Priya Okafor');
    expect(orderedBy).toHaveValue('Priya Okafor');

    await user.click(within(alert).getByRole('button', { name: 'Keep mine' }));
    await waitFor(() => expect(server.record.client.data.orderedBy).toBe('Priya Okafor'));
    expect(puts(calls, 'client').at(-1)!.body).toEqual({ version: 1, changes: { orderedBy: 'Priya Okafor' } });
  });

  it('when the conflict is settled with take theirs, then their value stays and nothing more is sent', async () => {
    const server = createFakeJobServer('EICR');
    const { user, calls } = renderJob(server);
    const orderedBy = await screen.findByLabelText('Asked for by');
    server.writeAsOther('client', 'orderedBy', 'Millbrook Lettings');
    await user.click(orderedBy);
    await user.keyboard('Priya Okafor{Tab}');
    await user.click(within(await screen.findByRole('alert')).getByRole('button', { name: 'Take theirs' }));

    expect(orderedBy).toHaveValue('Millbrook Lettings');
    expect(puts(calls, 'client')).toHaveLength(1);
  });

  it('when the job was approved meanwhile (423), then the screen says so and the fields become read-only', async () => {
    const server = createFakeJobServer('EICR');
    const { user } = renderJob(server);
    const u0 = await screen.findByLabelText('Nominal voltage to earth U0 (V)');
    server.lock();
    await user.click(u0);
    await user.keyboard('230{Tab}');

    expect(await screen.findByText(/🔒 This job is approved/)).toBeInTheDocument();
    expect(u0).toHaveAttribute('readonly');
    expect(screen.getByLabelText('Earthing system')).toBeDisabled();
  });
});

describe('job screen: an observation edited by two people', () => {
  it('when someone else changed the observation meanwhile, then the form says so with theirs, and keep mine stores mine', async () => {
    const server = createFakeJobServer('EICR');
    const first = { number: 1, text: 'Outside socket has no RCD', location: 'Yard', code: 'C3' as const, boardId: null, circuitId: null, inspectionItem: null };
    server.writeAsOther('observations', 'o-0a0b0c0d0e', first);
    const { user } = renderJob(server);
    await user.click(await screen.findByRole('button', { name: 'Edit observation 1' }));
    const dialog = await screen.findByRole('dialog', { name: 'Observation 1' });
    server.writeAsOther('observations', 'o-0a0b0c0d0e', { ...first, text: 'Outside socket has no RCD and a cracked lid' });

    await user.selectOptions(within(dialog).getByLabelText('Code'), 'C2');
    await user.click(within(dialog).getByRole('button', { name: 'Save the observation' }));
    const alert = await within(dialog).findByRole('alert');
    await waitFor(() => expect(alert).toHaveTextContent('theirs reads “Outside socket has no RCD and a cracked lid” (C3)'));

    await user.click(within(alert).getByRole('button', { name: 'Keep mine' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(server.record.observations.data['o-0a0b0c0d0e']).toMatchObject({ text: 'Outside socket has no RCD', code: 'C2' });
  });
});

describe('job screen: the server refuses an observation', () => {
  it('when the server names a field of the observation, then its words show at that field and the form stays open', async () => {
    const server = createFakeJobServer('EICR');
    server.handlers['PUT /api/jobs/41/record/observations'] = (call) => {
      const id = Object.keys((call.body as { changes: Record<string, unknown> }).changes)[0]!;
      return json(400, {
        error: { code: 'bad_request', message: 'Board 301 is not a board of this job.', issues: [{ path: `${id}.boardId`, message: 'Board 301 is not a board of this job.' }] },
      });
    };
    const { user } = renderJob(server);
    await screen.findByRole('heading', { name: 'Observations' });
    await user.keyboard('{Alt>}{Shift>}o{/Shift}{/Alt}');
    const dialog = await screen.findByRole('dialog', { name: 'New observation' });
    await user.keyboard('Board cover missing');
    await user.selectOptions(within(dialog).getByLabelText('Board'), '301');
    await user.click(within(dialog).getByRole('button', { name: 'Save the observation' }));

    const board = within(dialog).getByLabelText('Board');
    await waitFor(() => expect(board).toHaveAttribute('aria-invalid', 'true'));
    expect(within(dialog).getByText('Board 301 is not a board of this job.')).toBeInTheDocument();
    expect(screen.getByRole('dialog', { name: 'New observation' })).toBeInTheDocument();
  });
});

describe('job screen: changes to the record', () => {
  it('when the changes are opened, then each saved field shows with who changed it, from what to what, newest first', async () => {
    const server = createFakeJobServer('EICR');
    const { user } = renderJob(server);
    const ze = await screen.findByLabelText('External loop impedance Ze (Ω)');
    await user.click(ze);
    await user.keyboard('0.28{Enter}0.3{Enter}');
    await waitFor(() => expect(server.record.supply.data.ipfKa).toBe(0.3));

    const summary = screen.getByText('Changes to the record');
    await user.click(summary);
    const panel = summary.closest('details')!;
    await waitFor(() => expect(within(panel).getAllByRole('listitem')).toHaveLength(2));
    const items = within(panel).getAllByRole('listitem');
    expect(items[0]).toHaveTextContent('Dana Whitlock');
    expect(items[0]).toHaveTextContent('Supply characteristics and earthing arrangements, Prospective fault current Ipf (kA): blank → 0.3');
    expect(items[1]).toHaveTextContent('External loop impedance Ze (Ω): blank → 0.28');
  });
});

describe('job screen: a slow reload of the job', () => {
  it('when a reload that started before a save lands after it, then the saved value stays and the next save of the same field carries the newer version', async () => {
    const server = createFakeJobServer('EICR');
    const { user, calls, queryClient } = renderJob(server);
    const ze = await screen.findByLabelText('External loop impedance Ze (Ω)');

    // A reload of the job starts now, but its answer (taken now, before the save) arrives late.
    let release!: () => void;
    const released = new Promise<void>((resolve) => (release = resolve));
    const getJob = server.handlers['GET /api/jobs/41']!;
    server.handlers['GET /api/jobs/41'] = async (call) => {
      const answer = getJob(call);
      await released;
      return answer;
    };
    void queryClient.invalidateQueries({ queryKey: ['jobs'] });

    await user.click(ze);
    await user.keyboard('0.28{Tab}');
    await waitFor(() => expect(server.record.supply.data.zeOhm).toBe(0.28));
    release();
    await waitFor(() => expect(calls.filter((c) => c.method === 'GET' && c.path === '/api/jobs/41')).toHaveLength(2));
    await new Promise((resolve) => setTimeout(resolve, 50));
    expect(ze).toHaveValue('0.28');

    await user.clear(ze);
    await user.type(ze, '0.31{Tab}');
    await waitFor(() => expect(server.record.supply.data.zeOhm).toBe(0.31));
    expect(puts(calls, 'supply').map((c) => c.body)).toEqual([
      { version: 0, changes: { zeOhm: 0.28 } },
      { version: 1, changes: { zeOhm: 0.31 } },
    ]);
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
  });
});

describe('job screen: other people’s changes arrive while it is open', () => {
  // A short interval stands in for the screen's few seconds (JOB_REFRESH_MS).
  const poll = 40;
  const gets = (calls: ApiCall[]) => calls.filter((c) => c.method === 'GET' && c.path === '/api/jobs/41').length;

  it('when another person changes a field, submits and then approves the job, then each shows without a reload and the record becomes read-only', async () => {
    const server = createFakeJobServer('EICR');
    renderJob(server, poll);
    const orderedBy = await screen.findByLabelText('Asked for by');

    server.writeAsOther('client', 'orderedBy', 'Millbrook Lettings');
    await waitFor(() => expect(orderedBy).toHaveValue('Millbrook Lettings'));

    server.setJobState('ready');
    expect(await screen.findByLabelText('State: ready for review')).toBeInTheDocument();
    server.setJobState('approved');
    expect(await screen.findByLabelText('State: approved')).toBeInTheDocument();
    await waitFor(() => expect(orderedBy).toHaveAttribute('readonly'));
  });

  it('when a field is being typed in as another person’s change arrives, then the typing is left alone, and leaving the field offers theirs and mine instead of replacing theirs', async () => {
    const server = createFakeJobServer('EICR');
    const { user, calls } = renderJob(server, poll);
    const orderedBy = await screen.findByLabelText('Asked for by');
    const address = screen.getByLabelText('Their address');

    await user.click(orderedBy);
    await user.keyboard('Priya Ok');
    server.writeAsOther('client', 'orderedByAddress', '4 Tannery Yard, Eastbridge');
    server.writeAsOther('client', 'orderedBy', 'Millbrook Lettings');
    // The other field shows the poll has landed; the one being typed in keeps the typing and the focus.
    await waitFor(() => expect(address).toHaveValue('4 Tannery Yard, Eastbridge'));
    const before = gets(calls);
    await waitFor(() => expect(gets(calls)).toBeGreaterThan(before + 1));
    expect(orderedBy).toHaveValue('Priya Ok');
    expect(orderedBy).toHaveFocus();

    await user.keyboard('afor{Tab}');
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Theirs: Millbrook Lettings');
    expect(alert).toHaveTextContent('yours: Priya Okafor');
    // Nothing went with the newer version the poll brought: theirs is not silently replaced.
    expect(puts(calls, 'client')).toHaveLength(0);
    expect(server.record.client.data.orderedBy).toBe('Millbrook Lettings');

    await user.click(within(alert).getByRole('button', { name: 'Keep mine' }));
    await waitFor(() => expect(server.record.client.data.orderedBy).toBe('Priya Okafor'));
  });

  it('when the page is hidden, then the job is not asked for again until it is visible', async () => {
    const server = createFakeJobServer('EICR');
    const { calls } = renderJob(server, poll);
    await screen.findByLabelText('Asked for by');
    const visibility = vi.spyOn(document, 'visibilityState', 'get').mockReturnValue('hidden');
    try {
      document.dispatchEvent(new Event('visibilitychange'));
      const hiddenAt = gets(calls);
      await new Promise((resolve) => setTimeout(resolve, poll * 6));
      // At most one request that was already on its way when the page was hidden.
      expect(gets(calls)).toBeLessThanOrEqual(hiddenAt + 1);
    } finally {
      visibility.mockRestore();
      document.dispatchEvent(new Event('visibilitychange'));
    }
    const shownAt = gets(calls);
    await waitFor(() => expect(gets(calls)).toBeGreaterThan(shownAt));
  });
});
