import { screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { JobRecordPage } from '../../../src/features/job-record/components/job-record-page.tsx';
import { renderWithProviders, stubApi, type ApiCall } from '../../helpers/render.tsx';
import { createFakeJobServer } from './job-fixture.ts';

function renderJob(server: ReturnType<typeof createFakeJobServer>) {
  const calls = stubApi(server.handlers);
  const result = renderWithProviders(<JobRecordPage />, { path: '/jobs/:jobId', initialEntries: ['/jobs/41'] });
  return { ...result, calls };
}

const puts = (calls: ApiCall[], section: string) => calls.filter((c) => c.method === 'PUT' && c.path.endsWith(`/record/${section}`));
const assessment = () => screen.getByTestId('overall-assessment');

// The whole screen renders in jsdom; on a busy two-core machine the first render alone can take seconds.
vi.setConfig({ testTimeout: 20_000 });

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('schedule of inspections from the keyboard', () => {
  it('when v and n are pressed on the first items, then each is saved and the cursor moves on; Delete clears; x is refused on a report', async () => {
    const server = createFakeJobServer('EICR');
    const { user, calls } = renderJob(server);
    await screen.findByRole('grid', { name: 'Schedule of inspections' });

    await user.keyboard('{Alt>}{Shift>}i{/Shift}{/Alt}');
    const grid = screen.getByRole('grid', { name: 'Schedule of inspections' });
    expect(grid).toHaveFocus();
    expect(grid).toHaveAttribute('aria-activedescendant', 'job-inspection-1-1');

    await user.keyboard('v');
    expect(grid).toHaveAttribute('aria-activedescendant', 'job-inspection-1-2');
    await user.keyboard('n');
    await waitFor(() => expect(server.record.inspections.data).toEqual({ '1.1': 'ok', '1.2': 'N/A' }));
    expect(puts(calls, 'inspections').map((c) => c.body)).toEqual([
      { version: 0, changes: { '1.1': 'ok' } },
      { version: 1, changes: { '1.2': 'N/A' } },
    ]);
    expect(within(grid).getByRole('row', { selected: false, name: /1\.1.*✓ acceptable/ })).toBeInTheDocument();

    // ✗ belongs to a certificate: on a report the key is refused with the reason, nothing sent.
    await user.keyboard('x');
    expect(screen.getByText(/✗ is for a certificate \(EIC\)/)).toBeInTheDocument();
    expect(puts(calls, 'inspections')).toHaveLength(2);

    await user.keyboard('{ArrowUp}{Delete}');
    await waitFor(() => expect(server.record.inspections.data).toEqual({ '1.1': 'ok' }));

    // PageDown goes to the first item of the next area.
    await user.keyboard('{PageDown}');
    expect(grid).toHaveAttribute('aria-activedescendant', 'job-inspection-2-1');
  });

  it('when an EIC item is marked x, then it is saved as not acceptable; the C keys are refused there', async () => {
    const server = createFakeJobServer('EIC');
    const { user } = renderJob(server);
    await screen.findByRole('grid', { name: 'Schedule of inspections' });
    await user.keyboard('{Alt>}{Shift>}i{/Shift}{/Alt}');

    await user.keyboard('x');
    await waitFor(() => expect(server.record.inspections.data).toEqual({ '1.1': 'fail' }));
    await user.keyboard('2');
    expect(screen.getByText(/C2 is for a condition report \(EICR\)/)).toBeInTheDocument();
    expect(server.record.inspections.data).toEqual({ '1.1': 'fail' });
  });
});

describe('observations and the derived overall assessment', () => {
  // The rule checked: any C1, C2 or FI makes a condition report unsatisfactory; C3 alone does not
  // (BS 7671:2018 Appendix 6, notes for the person producing a condition report — common practice).

  it('when an item is coded C2, then the observation form opens tied to it; once saved the assessment turns unsatisfactory', async () => {
    const server = createFakeJobServer('EICR');
    const { user } = renderJob(server);
    await screen.findByRole('grid', { name: 'Schedule of inspections' });
    expect(assessment()).toHaveTextContent('satisfactory');
    expect(assessment()).not.toHaveTextContent('unsatisfactory');

    await user.keyboard('{Alt>}{Shift>}i{/Shift}{/Alt}');
    await user.keyboard('{PageDown}{PageDown}{ArrowDown}{ArrowDown}'); // area 3, then 3.3: main bonding to services
    await user.keyboard('2');

    const dialog = await screen.findByRole('dialog', { name: 'New observation' });
    expect(within(dialog).getByLabelText('Code')).toHaveValue('C2');
    expect(within(dialog).getByLabelText('Inspection item')).toHaveValue('3.3');
    expect(within(dialog).getByLabelText('Number')).toHaveValue('1');
    expect(within(dialog).getByLabelText('What was observed')).toHaveFocus();

    // Enter in an empty description would start a line; Ctrl+Enter saves and the schema answers at the field.
    await user.keyboard('{Control>}{Enter}{/Control}');
    expect(await within(dialog).findByText('Say what was observed.')).toBeInTheDocument();

    await user.keyboard('No main bonding to the gas pipe at the meter');
    await user.tab();
    await user.keyboard('Meter cupboard{Enter}');

    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    const saved = Object.values(server.record.observations.data);
    expect(saved).toEqual([
      { number: 1, text: 'No main bonding to the gas pipe at the meter', location: 'Meter cupboard', code: 'C2', boardId: null, circuitId: null, inspectionItem: '3.3' },
    ]);
    expect(Object.keys(server.record.observations.data)[0]).toMatch(/^o-[0-9a-f]{10}$/);
    expect(server.record.inspections.data).toEqual({ '3.3': 'C2' });
    expect(assessment()).toHaveTextContent('unsatisfactory');
    expect(screen.getByText(/Unsatisfactory because of observation 1 \(C2\)/)).toBeInTheDocument();
  });

  it('when only a C3 stands, then the report stays satisfactory; an FI added makes it unsatisfactory; removing the FI puts it back', async () => {
    const server = createFakeJobServer('EICR');
    const { user } = renderJob(server);
    await screen.findByRole('grid', { name: 'Schedule of inspections' });

    await user.keyboard('{Alt>}{Shift>}o{/Shift}{/Alt}');
    let dialog = await screen.findByRole('dialog', { name: 'New observation' });
    await user.keyboard('No RCD on the outside socket');
    await user.selectOptions(within(dialog).getByLabelText('Code'), 'C3');
    await user.selectOptions(within(dialog).getByLabelText('Board'), '301');
    await user.selectOptions(await within(dialog).findByRole('combobox', { name: 'Circuit' }), await within(dialog).findByRole('option', { name: /1 Kitchen sockets/ }));
    await user.click(within(dialog).getByRole('button', { name: 'Save the observation' }));
    await waitFor(() => expect(screen.queryByRole('dialog'), screen.queryByRole('dialog')?.textContent ?? '').not.toBeInTheDocument());
    expect(Object.values(server.record.observations.data)[0]).toMatchObject({ code: 'C3', boardId: 301, circuitId: 9001 });
    expect(assessment()).toHaveTextContent('satisfactory');
    expect(assessment()).not.toHaveTextContent('unsatisfactory');

    await user.keyboard('{Alt>}{Shift>}o{/Shift}{/Alt}');
    dialog = await screen.findByRole('dialog', { name: 'New observation' });
    expect(within(dialog).getByLabelText('Number')).toHaveValue('2');
    await user.keyboard('Scorching at the cooker switch: cause not found');
    await user.selectOptions(within(dialog).getByLabelText('Code'), 'FI');
    await user.keyboard('{Enter}');
    await waitFor(() => expect(assessment()).toHaveTextContent('unsatisfactory'));

    await user.click(screen.getByRole('button', { name: 'Remove observation 2' }));
    await user.click(screen.getByRole('button', { name: 'Yes, remove it' }));
    await waitFor(() => expect(Object.keys(server.record.observations.data)).toHaveLength(1));
    expect(assessment()).not.toHaveTextContent('unsatisfactory');
  });

  it('when the premises and an interval are given, then the usual interval shows as guidance and the next date is counted from the visit', async () => {
    const server = createFakeJobServer('EICR');
    const { user } = renderJob(server);
    const premises = await screen.findByLabelText('Kind of premises');
    await user.selectOptions(premises, 'rented-dwelling');
    // IET Guidance Note 3, Table 3.2 [memory]: rented dwellings every 5 years.
    expect(await screen.findByText(/usually 60 months for rented home/)).toBeInTheDocument();

    const months = screen.getByLabelText('Next inspection recommended in (months)');
    await user.click(months);
    await user.keyboard('60{Enter}');
    // 20 November 2026 + 60 months, by plain calendar arithmetic (JavaScript Date as the oracle).
    const expected = new Date(Date.UTC(2026, 10 + 60, 20)).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });
    expect(expected).toBe('20 November 2031');
    expect(await screen.findByText(expected)).toBeInTheDocument();
  });
});

describe('the job’s findings', () => {
  it('when a C1 item is left without its observation, then the checker’s finding lists with its source, and choosing it puts the cursor on the item', async () => {
    const server = createFakeJobServer('EICR');
    const { user } = renderJob(server);
    await screen.findByRole('grid', { name: 'Schedule of inspections' });
    await user.keyboard('{Alt>}{Shift>}i{/Shift}{/Alt}{ArrowDown}1');
    await screen.findByRole('dialog', { name: 'New observation' });
    await user.keyboard('{Escape}');
    await waitFor(() => expect(server.record.inspections.data).toEqual({ '1.2': 'C1' }));

    // The finding comes from the shared checker's job rules (through the fake server's answer).
    const finding = await screen.findByRole('button', { name: /Inspection item 1\.2 .* is marked C1 but no observation says what was found/ });
    expect(finding).toHaveTextContent('source: BS 7671:2018 Appendix 6');
    await user.keyboard('{Alt>}{Shift>}f{/Shift}{/Alt}');
    expect(finding).toHaveFocus();
    await user.keyboard('{Enter}');
    const grid = screen.getByRole('grid', { name: 'Schedule of inspections' });
    expect(grid).toHaveFocus();
    expect(grid).toHaveAttribute('aria-activedescendant', 'job-inspection-1-2');
  });
});
