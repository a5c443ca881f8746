/**
 * The job screen's commands: the palette, the keys and the keys overlay are built from this list
 * (src/lib/commands). Keys carry Alt+Shift so they work while the cursor is in a field of the
 * record; the same key means the same thing as on the jobs page (Alt+Shift+B: new board).
 */
import type { ReactNode } from 'react';
import type { JobDetail } from '../../../shared/schemas/jobs.ts';
import { sectionsFor, type JobSectionKey } from '../../../shared/schemas/job-record.ts';
import type { Command } from '../../lib/commands/types.ts';

/** Section names as the screen shows them (in our own words). */
export const sectionTitles: Record<JobSectionKey, string> = {
  client: 'Who it is for, and why',
  work: 'The work this certificate covers',
  installation: 'The installation',
  supply: 'Supply characteristics and earthing arrangements',
  origin: 'Particulars at the origin',
  extent: 'Extent and limitations',
  inspections: 'Schedule of inspections',
  observations: 'Observations',
  summary: 'Summary',
  declaration: 'Declaration',
};

/**
 * An action another feature adds to the job screen (composed in src/app/job-route.tsx): a
 * command whose form opens in a dialog over the record.
 */
export interface JobScreenAction {
  id: string;
  label: string;
  keywords?: readonly string[];
  shortcut?: string;
  /** true when it can run now; otherwise why not. */
  when?: (detail: JobDetail) => true | string;
  /** The dialog's content; `close()` when done (or navigate away). */
  render: (args: { detail: JobDetail; close: () => void }) => ReactNode;
}

export interface JobScreenContext {
  detail: JobDetail;
  readOnlyReason: string | null;
  goToSection(section: JobSectionKey): void;
  focusInspections(): void;
  focusFindings(): void;
  openObservation(): void;
  openAction(action: JobScreenAction): void;
}

export const GO_TO_SECTION_KEY = 'Alt+Shift+KeyG';
export const INSPECTIONS_KEY = 'Alt+Shift+KeyI';
export const NEW_OBSERVATION_KEY = 'Alt+Shift+KeyO';
export const FINDINGS_KEY = 'Alt+Shift+KeyF';

export function createJobScreenCommands(getCtx: () => JobScreenContext | null, actions: readonly JobScreenAction[]): Command<JobScreenContext>[] {
  const sectionChoices = () => {
    const detail = getCtx()?.detail;
    if (!detail) return [];
    return sectionsFor(detail.job.kind).map((key) => ({ value: key, label: sectionTitles[key] }));
  };
  return [
    {
      id: 'job.go-to-section',
      label: 'Go to a section',
      group: 'Job',
      keywords: ['jump', 'supply', 'origin', 'extent', 'limitations', 'summary', 'declaration', 'installation'],
      shortcut: GO_TO_SECTION_KEY,
      params: [{ name: 'section', label: 'Which section?', kind: 'choice', required: true, options: sectionChoices }],
      run: (ctx, args) => ctx.goToSection(args.section as JobSectionKey),
    },
    {
      id: 'job.inspections',
      label: 'Go to the schedule of inspections',
      group: 'Job',
      keywords: ['checklist', 'items', 'outcome'],
      shortcut: INSPECTIONS_KEY,
      run: (ctx) => ctx.focusInspections(),
    },
    {
      id: 'job.new-observation',
      label: 'New observation',
      group: 'Job',
      keywords: ['add', 'C1', 'C2', 'C3', 'FI', 'defect', 'code'],
      shortcut: NEW_OBSERVATION_KEY,
      when: (ctx) =>
        ctx.detail.job.kind !== 'EICR' ? 'Observations belong to a condition report (EICR)' : (ctx.readOnlyReason ?? true),
      run: (ctx) => ctx.openObservation(),
    },
    {
      id: 'job.findings',
      label: 'Go to the findings',
      group: 'Job',
      keywords: ['problems', 'checker', 'errors'],
      shortcut: FINDINGS_KEY,
      run: (ctx) => ctx.focusFindings(),
    },
    ...actions.map(
      (action): Command<JobScreenContext> => ({
        id: action.id,
        label: action.label,
        group: 'Job',
        keywords: action.keywords,
        shortcut: action.shortcut,
        when: action.when ? (ctx) => action.when!(ctx.detail) : undefined,
        run: (ctx) => ctx.openAction(action),
      }),
    ),
  ];
}
