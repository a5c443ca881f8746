import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useLayoutEffect, useMemo, useRef, useState, useSyncExternalStore, type ReactNode } from 'react';
import { useLocation, useNavigate, useParams } from 'react-router-dom';
import type { Finding } from '../../../../shared/schemas/findings.ts';
import { sectionsFor, type JobSectionKey } from '../../../../shared/schemas/job-record.ts';
import { jobStateLabels } from '../../../../shared/schemas/sites.ts';
import { CommandPalette } from '../../../components/command-palette.tsx';
import { FormDialog } from '../../../components/form-dialog.tsx';
import { KeysOverlay, ShortcutKeys } from '../../../components/keys-overlay.tsx';
import { createGeneralCommands, OPEN_PALETTE_KEY, SHOW_KEYS_KEY } from '../../../lib/commands/general-commands.ts';
import { createRegistry } from '../../../lib/commands/registry.ts';
import { useCommandKeys } from '../../../lib/commands/use-command-keys.ts';
import { useJobDetail } from '../api/get-job.ts';
import { jobRecordKeys } from '../api/job-record-keys.ts';
import { RecordSaver } from '../api/record-saver.ts';
import {
  createJobScreenCommands,
  FINDINGS_KEY,
  GO_TO_SECTION_KEY,
  INSPECTIONS_KEY,
  NEW_OBSERVATION_KEY,
  type JobScreenAction,
  type JobScreenContext,
} from '../commands.ts';
import { InspectionsSchedule, type InspectionsHandle } from './inspections-schedule.tsx';
import { JobFindings } from './job-findings.tsx';
import { JobHeader } from './job-header.tsx';
import { JobHistory } from './job-history.tsx';
import { ObservationForm, ObservationsSection, useObservationList, type ObservationFormTarget } from './observations.tsx';
import { fieldDomId, RecordContext, sectionDomId, type RecordContextValue } from './record-context.tsx';
import { ClientSection, ExtentSection, InstallationSection, OriginSection, SupplySection, WorkSection } from './record-sections.tsx';
import { DeclarationSection, SummarySection } from './summary-and-declaration.tsx';

export interface JobRecordPageProps {
  /** Commands with forms that other features add (new board, edit the site…). */
  actions?: readonly JobScreenAction[];
  /** Panels of other features (review, signing, issue…), shown beside the findings. */
  panels?: ReactNode;
  /** How often the job is asked for again while the page is visible; `false` turns it off (tests). */
  refreshEveryMs?: number | false;
}

/** `/jobs/:jobId`: the job screen. */
export function JobRecordPage(props: JobRecordPageProps) {
  const { jobId: param } = useParams();
  const jobId = Number(param);
  const queryClient = useQueryClient();
  // One saver per job shown: it keeps the save state of every field.
  const saver = useMemo(() => new RecordSaver(queryClient, jobId), [queryClient, jobId]);
  const job = useJobDetail(jobId, saver.withLatest, props.refreshEveryMs);
  useOtherPanelsFollow(jobId, job.data?.job.version);

  if (!Number.isInteger(jobId) || jobId <= 0) return <p className="p-4">There is no such job.</p>;
  if (job.isPending) return <p className="p-4 text-muted">Loading the job…</p>;
  if (job.isError)
    return (
      <div role="alert" className="m-4 space-y-2 rounded border border-danger bg-danger-soft px-3 py-2 text-danger">
        <p>The job could not be loaded: {job.error.message}</p>
        <button type="button" className="rounded border border-danger bg-surface px-2 py-0.5 font-medium" onClick={() => void job.refetch()}>
          Try again
        </button>
      </div>
    );
  return <JobScreen key={jobId} {...props} detail={job.data} saver={saver} />;
}

/**
 * When a poll brings a new version of the job (another person submitted, approved, issued,
 * reopened or changed it), every other query under `['jobs']` — the panels' state and gate,
 * signatures, issues — is fetched again, so the whole screen moves together.
 */
function useOtherPanelsFollow(jobId: number, version: number | undefined) {
  const queryClient = useQueryClient();
  const seen = useRef<number | undefined>(undefined);
  useEffect(() => {
    if (version === undefined) return;
    if (seen.current !== undefined && seen.current !== version) {
      void queryClient.invalidateQueries({
        queryKey: jobRecordKeys.all,
        predicate: (query) => !(query.queryKey[1] === 'detail' && query.queryKey[2] === jobId && query.queryKey.length === 3),
      });
    }
    seen.current = version;
  }, [queryClient, jobId, version]);
}

const SECTION_COMPONENTS: Record<Exclude<JobSectionKey, 'inspections' | 'observations'>, () => ReactNode> = {
  client: ClientSection,
  work: WorkSection,
  installation: InstallationSection,
  supply: SupplySection,
  origin: OriginSection,
  extent: ExtentSection,
  summary: SummarySection,
  declaration: DeclarationSection,
};

function JobScreen({ detail, saver, actions = [], panels }: JobRecordPageProps & { detail: RecordContextValue['detail']; saver: RecordSaver }) {
  const navigate = useNavigate();
  const location = useLocation();
  const [palette, setPalette] = useState<{ open: boolean; commandId?: string }>({ open: false });
  const [keysOpen, setKeysOpen] = useState(false);
  const [observation, setObservation] = useState<ObservationFormTarget | null>(null);
  const [openAction, setOpenAction] = useState<JobScreenAction | null>(null);
  const [status, setStatus] = useState<string>(() => (location.state as { notice?: string } | null)?.notice ?? '');
  const inspectionsRef = useRef<InspectionsHandle>(null);
  const locked = useSyncExternalStore(saver.subscribe, () => saver.locked);

  const readOnlyReason =
    detail.job.state === 'approved' || detail.job.state === 'issued'
      ? `This job is ${jobStateLabels[detail.job.state]}: its record can no longer change.`
      : locked;
  const record: RecordContextValue = { detail, saver, readOnlyReason };
  const sections = sectionsFor(detail.job.kind);

  function goToSection(section: JobSectionKey) {
    if (section === 'inspections') return inspectionsRef.current?.focusItem('1.1');
    const heading = document.getElementById(sectionDomId(section));
    heading?.scrollIntoView({ block: 'start' });
    // The first field of the section takes the cursor; a section without fields, its heading.
    const first = heading?.closest('section')?.querySelector<HTMLElement>('[data-record-field]:not([disabled]), button:not([disabled])');
    (first ?? heading)?.focus();
  }

  function goToFinding(finding: Finding) {
    const section = finding.section as JobSectionKey | undefined;
    if (section === 'inspections' && finding.field) return inspectionsRef.current?.focusItem(finding.field);
    if (section === 'observations' && finding.field && detail.record.observations.data[finding.field]) return setObservation({ id: finding.field });
    if (section && finding.field) {
      const field = document.getElementById(fieldDomId(section, finding.field));
      if (field) {
        field.scrollIntoView({ block: 'center' });
        return field.focus();
      }
    }
    if (section) return goToSection(section);
    if (finding.boardId) return void navigate(`/boards/${finding.boardId}`);
  }

  /** An item coded C1/C2/C3 asks for its observation: the one tied to it, or a new one. */
  function openObservationFor(itemId: string, code: 'C1' | 'C2' | 'C3') {
    const tied = Object.entries(detail.record.observations.data).find(([, o]) => o?.inspectionItem === itemId);
    setObservation(tied ? { id: tied[0] } : { preset: { inspectionItem: itemId, code } });
  }

  const ctx: JobScreenContext = {
    detail,
    readOnlyReason,
    goToSection,
    focusInspections: () => inspectionsRef.current?.focusItem(''),
    focusFindings: () => {
      const first = document.querySelector<HTMLElement>('[data-job-finding]') ?? document.getElementById('job-findings-heading');
      first?.focus();
    },
    openObservation: () => setObservation({}),
    openAction: (action) => setOpenAction(action),
  };
  const ctxRef = useRef<JobScreenContext | null>(null);
  useLayoutEffect(() => {
    ctxRef.current = ctx;
  });
  const registry = useMemo(
    () =>
      createRegistry<JobScreenContext>([
        ...createGeneralCommands<JobScreenContext>({ openPalette: () => setPalette({ open: true }), showKeys: () => setKeysOpen(true) }),
        ...createJobScreenCommands(() => ctxRef.current, actions),
      ]),
    // The actions are fixed for the screen's life (the route composes them once).
    [],
  );
  const dialogOpen = palette.open || keysOpen || observation !== null || openAction !== null;
  useCommandKeys(registry, ctx, {
    enabled: !dialogOpen,
    onNeedsArgs: (command) => setPalette({ open: true, commandId: command.id }),
    onUnavailable: (command, reason) => setStatus(`${command.label}: ${reason}.`),
  });

  return (
    <RecordContext.Provider value={record}>
      <div className="mx-auto w-full max-w-7xl space-y-4 p-4">
        <JobHeader />
        <p role="status" className="text-muted empty:hidden">
          {status}
        </p>
        {readOnlyReason && (
          <p role="alert" className="rounded border border-locked bg-locked-soft px-3 py-2 text-locked">
            🔒 {readOnlyReason}
          </p>
        )}
        <KeyHints hasObservations={detail.job.kind === 'EICR'} />
        <div className="grid items-start gap-4 xl:grid-cols-[minmax(0,1fr)_22rem]">
          <div className="min-w-0 space-y-4">
            {sections.map((section) => {
              if (section === 'inspections') return <InspectionsSchedule key={section} handleRef={inspectionsRef} onNeedsObservation={openObservationFor} />;
              if (section === 'observations') return <ObservationsSection key={section} onOpen={setObservation} />;
              const Section = SECTION_COMPONENTS[section];
              return <Section key={section} />;
            })}
          </div>
          <aside className="space-y-4 xl:sticky xl:top-4" aria-label="Findings and more">
            <JobFindings onGoTo={goToFinding} />
            {panels}
            <JobHistory />
            <Caution />
          </aside>
        </div>
      </div>
      {observation && (
        <ObservationDialog target={observation} onClose={() => setObservation(null)} />
      )}
      {openAction && (
        <FormDialog title={openAction.label} onClose={() => setOpenAction(null)}>
          {openAction.render({ detail, close: () => setOpenAction(null) })}
        </FormDialog>
      )}
      <CommandPalette open={palette.open} commandId={palette.commandId} onOpenChange={(open) => setPalette({ open })} registry={registry} ctx={ctx} />
      <KeysOverlay open={keysOpen} onOpenChange={setKeysOpen} registry={registry} ctx={ctx} sections={[inspectionKeysSection(detail.job.kind), fieldKeysSection]} />
    </RecordContext.Provider>
  );
}

function ObservationDialog({ target, onClose }: { target: ObservationFormTarget; onClose: () => void }) {
  const list = useObservationList();
  const number = target.id ? list.find(([id]) => id === target.id)?.[1].number : undefined;
  return (
    <FormDialog title={number ? `Observation ${number}` : 'New observation'} onClose={onClose}>
      <ObservationForm target={target} onDone={onClose} />
    </FormDialog>
  );
}

function KeyHints({ hasObservations }: { hasObservations: boolean }) {
  const hint = (shortcut: string, words: string) => (
    <span className="inline-flex items-center gap-1">
      <ShortcutKeys shortcut={shortcut} /> {words}
    </span>
  );
  return (
    <p className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-muted">
      {hint(GO_TO_SECTION_KEY, 'go to a section')}
      {hint(INSPECTIONS_KEY, 'inspections')}
      {hasObservations && hint(NEW_OBSERVATION_KEY, 'new observation')}
      {hint(FINDINGS_KEY, 'findings')}
      {hint(OPEN_PALETTE_KEY, 'every command')}
      {hint(SHOW_KEYS_KEY, 'all keys')}
      <span>Enter saves a field and moves on</span>
    </p>
  );
}

function Caution() {
  return (
    <section aria-label="Caution" className="rounded border border-line bg-surface p-4 text-sm">
      <h2 className="font-semibold">Before you rely on this</h2>
      <p className="mt-1 text-muted">
        Inspection and testing are for competent people, on circuits proven dead after safe isolation, with an instrument proven to work. Boardwalk records and
        checks what you enter; it does not replace your judgement. The current edition of BS 7671 and local regulations take precedence over anything shown here.
      </p>
    </section>
  );
}

const inspectionKeysSection = (kind: 'EIC' | 'EICR') => ({
  title: 'Schedule of inspections',
  note: 'With the cursor on the schedule.',
  rows: [
    { label: 'Next or previous item', keys: ['ArrowDown', 'ArrowUp'] },
    { label: 'Next or previous area', keys: ['PageDown', 'PageUp'] },
    { label: '✓ acceptable', keys: ['v'] },
    ...(kind === 'EIC'
      ? [{ label: '✗ not acceptable', keys: ['x'] }]
      : [
          { label: 'C1 danger present (asks for the observation)', keys: ['1'] },
          { label: 'C2 potentially dangerous (asks for the observation)', keys: ['2'] },
          { label: 'C3 improvement recommended (asks for the observation)', keys: ['3'] },
        ]),
    { label: 'LIM limitation', keys: ['l'] },
    { label: 'N/A', keys: ['n'] },
    { label: 'not verified', keys: ['u'] },
    { label: 'Clear the outcome', keys: ['Delete', 'Backspace'] },
  ],
});

const fieldKeysSection = {
  title: 'Fields of the record',
  rows: [
    { label: 'Save the field and move to the next', keys: ['Enter'] },
    { label: 'Next or previous field (leaving a field saves it)', keys: ['Tab', 'Shift+Tab'] },
    { label: 'Put back what was there before typing', keys: ['Escape'] },
  ],
};
