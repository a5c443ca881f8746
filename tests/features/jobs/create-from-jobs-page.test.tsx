import { screen, waitFor, within } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { Job, Site } from '../../../shared/schemas/sites.ts';
import { JobsPage } from '../../../src/features/jobs/components/jobs-page.tsx';
import { json, renderWithProviders, stubApi, type ApiCall } from '../../helpers/render.tsx';
import { boards, jobs, sites } from './jobs-fixture.ts';

let calls: ApiCall[];
let siteList: Site[];
let jobList: Job[];

function renderJobs() {
  return renderWithProviders(<JobsPage />, {
    path: '/jobs',
    initialEntries: ['/jobs'],
    otherRoutes: { '/jobs/:jobId': <p>Job screen</p>, '/boards/:boardId': <p>Board console</p> },
  });
}

const posts = (path: string) => calls.filter((c) => c.method === 'POST' && c.path === path);

beforeEach(() => {
  siteList = [...sites];
  jobList = [...jobs];
  calls = stubApi({
    'GET /api/sites': () => json(200, { sites: siteList }),
    'GET /api/jobs': () => json(200, { jobs: jobList }),
    'GET /api/boards': () => json(200, { boards }),
    'POST /api/sites': (call) => {
      const body = call.body as Partial<Site>;
      const site: Site = { ...sites[2]!, id: 4, client: body.client!, address: body.address!, contactEmail: body.contactEmail ?? '', version: 1 };
      siteList = [...siteList, site];
      return json(201, { site });
    },
    'POST /api/jobs': (call) => {
      const body = call.body as { siteId: number; kind: Job['kind']; reference?: string; visitDate: string };
      if (body.reference === 'HB-2026-01') {
        return json(400, { error: { code: 'bad_request', message: 'That reference is already used by another job.', issues: [{ path: 'reference', message: 'That reference is already used by another job.' }] } });
      }
      const job: Job = { ...jobs[0]!, id: 30, siteId: body.siteId, kind: body.kind, reference: body.reference ?? 'EICR-2026-0007', visitDate: body.visitDate };
      jobList = [...jobList, job];
      return json(201, { job });
    },
    'POST /api/jobs/10/boards': () => json(201, { board: { id: 150, reference: 'DB3' } }),
    'PATCH /api/sites/1': (call) => {
      const body = call.body as { version: number; changes: Partial<Site> };
      const site = { ...siteList[0]!, ...body.changes, version: body.version + 1 };
      siteList = [site, ...siteList.slice(1)];
      return json(200, { site });
    },
  });
});

// The whole screen renders in jsdom; on a busy two-core machine the first render alone can take seconds.
vi.setConfig({ testTimeout: 20_000 });

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('new site, job and board from the jobs page', () => {
  it('when the new site form is sent empty, then each required field says what it needs, in words, and nothing is sent', async () => {
    const { user } = renderJobs();
    await screen.findByRole('link', { name: 'DB1' });

    await user.keyboard('{Alt>}{Shift>}s{/Shift}{/Alt}');
    const dialog = await screen.findByRole('dialog', { name: 'New site' });
    expect(within(dialog).getByLabelText('Client')).toHaveFocus();
    await user.keyboard('{Enter}');

    // Messages from createSiteBodySchema (shared/schemas/sites.ts), the same schema the server uses.
    expect(within(dialog).getByText('Name the client.')).toBeInTheDocument();
    expect(within(dialog).getByText('Give the installation address.')).toBeInTheDocument();
    expect(within(dialog).getByLabelText('Client')).toHaveAttribute('aria-invalid', 'true');
    expect(within(dialog).getByLabelText('Client')).toHaveFocus();
    expect(posts('/api/sites')).toHaveLength(0);

    await user.keyboard('Quarry Lane Surgery');
    await user.tab();
    await user.keyboard('9 Quarry Lane, Westford');
    await user.click(within(dialog).getByLabelText('Contact e-mail'));
    await user.keyboard('reception at surgery{Enter}');
    expect(within(dialog).getByText('That is not an e-mail address.')).toBeInTheDocument();
    expect(within(dialog).getByLabelText('Contact e-mail')).toHaveFocus();
    expect(posts('/api/sites')).toHaveLength(0);
  });

  it('when a site is added, then the new job form opens on it; a reference the server refuses shows at its field; a blank one is made by the app and the job screen opens', async () => {
    const { user, currentPath } = renderJobs();
    await screen.findByRole('link', { name: 'DB1' });

    await user.keyboard('{Alt>}{Shift>}s{/Shift}{/Alt}');
    let dialog = await screen.findByRole('dialog', { name: 'New site' });
    await user.keyboard('Quarry Lane Surgery{Tab}9 Quarry Lane, Westford{Enter}');
    await waitFor(() => expect(posts('/api/sites')).toHaveLength(1));
    expect(posts('/api/sites')[0]!.body).toMatchObject({ client: 'Quarry Lane Surgery', address: '9 Quarry Lane, Westford', earthing: 'TN-C-S', nominalVoltageV: 230 });

    dialog = await screen.findByRole('dialog', { name: 'New job' });
    expect(within(dialog).getByLabelText('Site')).toHaveValue('4');
    expect(within(dialog).getByLabelText('Kind of job')).toHaveValue('EICR');

    await user.type(within(dialog).getByLabelText('Reference'), 'HB-2026-01');
    await user.clear(within(dialog).getByLabelText('First day of the visit'));
    await user.type(within(dialog).getByLabelText('First day of the visit'), '2026-12-01{Enter}');
    expect(await within(dialog).findByText('That reference is already used by another job.')).toBeInTheDocument();
    expect(within(dialog).getByLabelText('Reference')).toHaveFocus();

    await user.clear(within(dialog).getByLabelText('Reference'));
    await user.keyboard('{Enter}');
    await waitFor(() => expect(currentPath()).toBe('/jobs/30'));
    expect(posts('/api/jobs').at(-1)!.body).toEqual({ siteId: 4, kind: 'EICR', visitDate: '2026-12-01', visitEndDate: null, startFromJobId: null });
  });

  it('when a new EICR is on a site with an earlier job, then it may start from that job', async () => {
    const { user } = renderJobs();
    await screen.findByRole('link', { name: 'DB1' });
    await user.keyboard('bakery');
    await user.keyboard('{Alt>}{Shift>}j{/Shift}{/Alt}');
    const dialog = await screen.findByRole('dialog', { name: 'New job' });
    expect(within(dialog).getByLabelText('Site')).toHaveValue('1');
    // A certificate for new work does not start from an earlier job; a condition report may.
    await user.selectOptions(within(dialog).getByLabelText('Kind of job'), 'EIC');
    expect(within(dialog).queryByLabelText('Start from')).not.toBeInTheDocument();
    await user.selectOptions(within(dialog).getByLabelText('Kind of job'), 'EICR');
    const startFrom = within(dialog).getByLabelText('Start from');
    await user.selectOptions(startFrom, within(dialog).getByRole('option', { name: 'start from EICR HB-2026-01 of 2026-11-20' }));
    await user.keyboard('{Enter}');
    await waitFor(() => expect(posts('/api/jobs')).toHaveLength(1));
    expect(posts('/api/jobs')[0]!.body).toMatchObject({ siteId: 1, kind: 'EICR', startFromJobId: 10 });
  });

  it('when a new board has no ways, then the field says so; with 10 ways it is made and its console opens', async () => {
    const { user, currentPath } = renderJobs();
    await screen.findByRole('link', { name: 'DB1' });
    await user.keyboard('{ArrowDown}');
    await user.keyboard('{Alt>}{Shift>}b{/Shift}{/Alt}');
    const dialog = await screen.findByRole('dialog', { name: 'New board' });
    expect(within(dialog).getByLabelText('Job')).toHaveValue('10');

    await user.type(within(dialog).getByLabelText('Board reference'), 'DB3{Enter}');
    // Message from createBoardBodySchema (shared/schemas/sites.ts).
    expect(within(dialog).getByText('Give the number of ways, or a board to copy.')).toBeInTheDocument();
    expect(within(dialog).getByLabelText('Number of ways')).toHaveFocus();

    await user.keyboard('ten{Enter}');
    expect(within(dialog).getByText('Give the number of ways.')).toBeInTheDocument();
    await user.clear(within(dialog).getByLabelText('Number of ways'));
    await user.keyboard('10{Enter}');
    await waitFor(() => expect(currentPath()).toBe('/boards/150'));
    expect(posts('/api/jobs/10/boards')[0]!.body).toEqual({ reference: 'DB3', location: '', suppliedFrom: '', layout: 'single-phase', ways: 10, copyFromBoardId: null });
  });

  it('when a board is copied, then only the board to copy is sent, with its layout', async () => {
    const { user } = renderJobs();
    await screen.findByRole('link', { name: 'DB1' });
    await user.keyboard('{ArrowDown}{Alt>}{Shift>}b{/Shift}{/Alt}');
    const dialog = await screen.findByRole('dialog', { name: 'New board' });
    await user.type(within(dialog).getByLabelText('Board reference'), 'DB1 (2027)');
    await user.selectOptions(within(dialog).getByLabelText('Circuit details'), within(dialog).getByRole('option', { name: /copy the circuit details of board DB1 / }));
    expect(within(dialog).queryByLabelText('Number of ways')).not.toBeInTheDocument();
    await user.keyboard('{Enter}');
    await waitFor(() => expect(posts('/api/jobs/10/boards')).toHaveLength(1));
    expect(posts('/api/jobs/10/boards')[0]!.body).toEqual({ reference: 'DB1 (2027)', location: '', suppliedFrom: '', layout: 'single-phase', copyFromBoardId: 101 });
  });
});

describe('editing a site from the jobs page', () => {
  it('when a site is chosen in the palette and its contact e-mail changed, then only that field is sent with the site’s version', async () => {
    const { user } = renderJobs();
    await screen.findByRole('link', { name: 'DB1' });

    await user.keyboard('{Alt>}{Shift>}e{/Shift}{/Alt}');
    const palette = await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('harbour{Enter}');
    await waitFor(() => expect(palette).not.toBeInTheDocument());
    const dialog = await screen.findByRole('dialog', { name: 'Edit site Harbour Bakery' });
    expect(within(dialog).getByLabelText('Client')).toHaveValue('Harbour Bakery');

    // Nothing changed: the schema's own words, at the form.
    await user.keyboard('{Enter}');
    expect(within(dialog).getByRole('alert')).toHaveTextContent('Nothing to change.');
    expect(calls.filter((c) => c.method === 'PATCH')).toHaveLength(0);

    await user.type(within(dialog).getByLabelText('Contact e-mail'), 'orders@harbour-bakery.example{Enter}');
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(calls.filter((c) => c.method === 'PATCH').map((c) => c.body)).toEqual([{ version: 1, changes: { contactEmail: 'orders@harbour-bakery.example' } }]);
    expect(screen.getByText('Site Harbour Bakery saved.')).toBeInTheDocument();
  });
});

describe('going to a job screen from the jobs page', () => {
  it('when Go to a job is chosen by its key and a job named, then its job screen opens', async () => {
    const { user, currentPath } = renderJobs();
    await screen.findByRole('link', { name: 'DB1' });
    await user.keyboard('{Alt>}{Shift>}g{/Shift}{/Alt}');
    await screen.findByRole('dialog', { name: 'Command palette' });
    await user.keyboard('EL-NEW{Enter}');
    await waitFor(() => expect(currentPath()).toBe('/jobs/20'));
    // Each job also has its own link.
    expect(screen.getByText('Job screen')).toBeInTheDocument();
  });
});
