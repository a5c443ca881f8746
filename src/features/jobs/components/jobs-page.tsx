import { useDeferredValue, useEffect, useId, useLayoutEffect, useMemo, useRef, useState, type KeyboardEvent, type MouseEvent } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { tinykeys } from 'tinykeys';
import type { BoardSummary } from '../../../../shared/schemas/boards.ts';
import { jobStateLabels, type Job } from '../../../../shared/schemas/sites.ts';
import { CommandPalette } from '../../../components/command-palette.tsx';
import { FormDialog } from '../../../components/form-dialog.tsx';
import { KeysOverlay, ShortcutKeys } from '../../../components/keys-overlay.tsx';
import { createGeneralCommands, OPEN_PALETTE_KEY } from '../../../lib/commands/general-commands.ts';
import { createRegistry } from '../../../lib/commands/registry.ts';
import { useCommandKeys } from '../../../lib/commands/use-command-keys.ts';
import { useJobs, type SiteWithJobs } from '../api/get-jobs.ts';
import { createJobsCommands, NEW_BOARD_KEY, NEW_JOB_KEY, NEW_SITE_KEY, type JobsContext, type JobsForm } from '../commands.ts';
import { NewBoardForm } from './forms/new-board-form.tsx';
import { NewJobForm } from './forms/new-job-form.tsx';
import { SiteForm } from './forms/site-form.tsx';
import { searchJobs, visibleBoards } from '../search-jobs.ts';
import { BoardProgress, progressPercent } from './board-progress.tsx';
import { BoardStateLabel } from './board-state-label.tsx';

const jobKindNames: Record<Job['kind'], string> = {
  EIC: 'Electrical Installation Certificate',
  EICR: 'Electrical Installation Condition Report',
};

function formatVisitDate(isoDate: string): string {
  const date = new Date(`${isoDate}T00:00:00`);
  if (Number.isNaN(date.getTime())) return isoDate;
  return date.toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });
}

const boardRowId = (boardId: number) => `jobs-board-${boardId}`;

function describeBoard(board: BoardSummary): string {
  const where = board.location ? `, ${board.location}` : '';
  return `${board.reference}${where} (${board.site.client}, ${board.job.reference}): ${board.state}, ${board.circuitCount} circuits, ${progressPercent(board.readingsDone, board.readingsRequired)} % done, ${board.readingsDone} of ${board.readingsRequired} needed readings typed. Enter opens it.`;
}

/** True when a key press belongs to a field the person is typing in. */
function isTypingTarget(target: EventTarget | null): boolean {
  return (
    target instanceof HTMLElement &&
    (target.isContentEditable || target.tagName === 'INPUT' || target.tagName === 'TEXTAREA' || target.tagName === 'SELECT')
  );
}

/**
 * Sites with their jobs and each job's boards. The search box has the keyboard from the start:
 * typing filters, ArrowUp / ArrowDown move through the boards shown, Enter opens the chosen one,
 * Escape clears the search, and "/" brings the cursor back to the search from anywhere on the page.
 * The search is kept in the address (?q=) so coming back from a board finds the same list.
 */
export function JobsPage() {
  const jobs = useJobs();
  const navigate = useNavigate();
  const [searchParams, setSearchParams] = useSearchParams();
  // The box keeps its own text: a key typed while the address is still being updated for the one
  // before it (one key every 5 ms, as a practised typist or a barcode reader types) would otherwise
  // be overwritten by the address's older text and lost. The address follows the box.
  const [search, setSearchText] = useState(() => searchParams.get('q') ?? '');
  const listQuery = useDeferredValue(search);
  const [activeBoardId, setActiveBoardId] = useState<number | null>(null);
  const searchRef = useRef<HTMLInputElement>(null);
  const hintId = useId();
  const [form, setForm] = useState<JobsForm | null>(null);
  const [palette, setPalette] = useState<{ open: boolean; commandId?: string }>({ open: false });
  const [keysOpen, setKeysOpen] = useState(false);
  const [notice, setNotice] = useState('');

  const tree = jobs.data ?? [];
  const shown = useMemo(() => searchJobs(jobs.data ?? [], listQuery), [jobs.data, listQuery]);
  const boards = useMemo(() => visibleBoards(shown), [shown]);
  // A board hidden by the search is no longer the chosen one.
  const activeBoard = boards.find((b) => b.id === activeBoardId) ?? null;

  const ctx: JobsContext = {
    loaded: jobs.isSuccess,
    tree,
    shown,
    activeBoard,
    openForm: (next) => {
      setNotice('');
      setForm(next);
    },
    openJob: (jobId) => void navigate(`/jobs/${jobId}`),
  };
  const ctxRef = useRef<JobsContext | null>(null);
  useLayoutEffect(() => {
    ctxRef.current = ctx;
  });
  const registry = useMemo(
    () =>
      createRegistry<JobsContext>([
        ...createGeneralCommands<JobsContext>({ openPalette: () => setPalette({ open: true }), showKeys: () => setKeysOpen(true) }),
        ...createJobsCommands(() => ctxRef.current),
      ]),
    [],
  );
  useCommandKeys(registry, ctx, {
    enabled: !palette.open && !keysOpen && form === null,
    onNeedsArgs: (command) => setPalette({ open: true, commandId: command.id }),
    onUnavailable: (command, reason) => setNotice(`${command.label}: ${reason}.`),
  });

  useEffect(
    () =>
      tinykeys(window, {
        '/': (event) => {
          if (event.defaultPrevented || event.isComposing || isTypingTarget(event.target)) return;
          event.preventDefault();
          searchRef.current?.focus();
          searchRef.current?.select();
        },
      }),
    [],
  );

  useEffect(() => {
    if (activeBoard) document.getElementById(boardRowId(activeBoard.id))?.scrollIntoView({ block: 'nearest' });
  }, [activeBoard]);

  const urlQuery = searchParams.get('q') ?? '';
  useEffect(() => {
    if (urlQuery === search) return;
    setSearchParams(
      (params) => {
        const next = new URLSearchParams(params);
        if (search) next.set('q', search);
        else next.delete('q');
        return next;
      },
      { replace: true },
    );
    // Only the box's text drives the address; the address is read once, when the page opens.
  }, [search]);

  function setSearch(value: string) {
    setSearchText(value);
  }

  const openBoard = (board: BoardSummary) => navigate(`/boards/${board.id}`);

  function handleSearchKeyDown(event: KeyboardEvent<HTMLInputElement>) {
    if (event.nativeEvent.isComposing) return;
    const index = activeBoard ? boards.indexOf(activeBoard) : -1;
    switch (event.key) {
      case 'ArrowDown':
        event.preventDefault();
        if (boards.length > 0) setActiveBoardId(boards[Math.min(index + 1, boards.length - 1)]!.id);
        break;
      case 'ArrowUp':
        event.preventDefault();
        // From no choice, ArrowUp starts at the bottom of the list.
        if (boards.length > 0) setActiveBoardId(boards[index === -1 ? boards.length - 1 : Math.max(index - 1, 0)]!.id);
        break;
      case 'Enter': {
        event.preventDefault();
        // With one board left, Enter needs no arrow first.
        const target = activeBoard ?? (boards.length === 1 ? boards[0] : undefined);
        if (target) void openBoard(target);
        break;
      }
      case 'Escape':
        if (search) {
          event.preventDefault();
          setSearch('');
        }
        break;
    }
  }

  function handleRowClick(event: MouseEvent<HTMLTableRowElement>, board: BoardSummary) {
    // The reference is a link of its own; let it do its work.
    if ((event.target as HTMLElement).closest('a')) return;
    void openBoard(board);
  }

  return (
    <div className="mx-auto w-full max-w-6xl space-y-4 p-4">
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <h1 className="text-lg font-semibold">Jobs</h1>
        <div className="flex min-w-72 flex-1 items-center gap-2">
          <label htmlFor="jobs-search" className="font-medium">
            Search
          </label>
          <input
            ref={searchRef}
            id="jobs-search"
            type="search"
            value={search}
            onChange={(event) => {
              setSearch(event.target.value);
              setActiveBoardId(null);
            }}
            onKeyDown={handleSearchKeyDown}
            autoFocus
            autoComplete="off"
            spellCheck={false}
            placeholder="Client, address, job or board"
            aria-keyshortcuts="/"
            aria-describedby={hintId}
            className="w-full max-w-md rounded border border-line-strong bg-surface px-2 py-1"
          />
        </div>
        <p id={hintId} className="text-xs text-muted">
          <kbd className="font-mono">/</kbd> search · <kbd className="font-mono">↑</kbd> <kbd className="font-mono">↓</kbd> choose a
          board · <kbd className="font-mono">Enter</kbd> opens it · <kbd className="font-mono">Esc</kbd> clears
        </p>
      </div>
      <p className="flex flex-wrap items-center gap-x-4 gap-y-1 text-xs text-muted">
        <span className="inline-flex items-center gap-1">
          <ShortcutKeys shortcut={NEW_SITE_KEY} /> new site
        </span>
        <span className="inline-flex items-center gap-1">
          <ShortcutKeys shortcut={NEW_JOB_KEY} /> new job
        </span>
        <span className="inline-flex items-center gap-1">
          <ShortcutKeys shortcut={NEW_BOARD_KEY} /> new board
        </span>
        <span className="inline-flex items-center gap-1">
          <ShortcutKeys shortcut={OPEN_PALETTE_KEY} /> every command
        </span>
      </p>

      <p role="status" className="sr-only">
        {activeBoard ? describeBoard(activeBoard) : ''}
      </p>
      <p aria-live="polite" className="text-muted empty:hidden">
        {notice}
      </p>

      {jobs.isPending && <p className="text-muted">Loading jobs…</p>}
      {jobs.isError && (
        <div role="alert" className="space-y-2 rounded border border-danger bg-danger-soft px-3 py-2 text-danger">
          <p>The jobs could not be loaded: {jobs.error.message}</p>
          <button type="button" className="rounded border border-danger bg-surface px-2 py-0.5 font-medium" onClick={() => void jobs.refetch()}>
            Try again
          </button>
        </div>
      )}
      {jobs.isSuccess && jobs.data.length === 0 && <p className="text-muted">There are no sites yet.</p>}
      {jobs.isSuccess && jobs.data.length > 0 && shown.length === 0 && (
        <p className="text-muted">Nothing matches “{search}”. Esc clears the search.</p>
      )}

      {shown.map((entry) => (
        <SiteSection
          key={entry.site.id}
          entry={entry}
          activeBoardId={activeBoard?.id ?? null}
          onRowClick={handleRowClick}
        />
      ))}

      {form && (
        <JobsFormDialog
          form={form}
          tree={tree}
          onClose={() => setForm(null)}
          onSiteAdded={(siteId, client) => {
            // The next thing after a new site is its first job.
            setNotice(`Site ${client} added.`);
            setForm({ kind: 'new-job', siteId });
          }}
          onSiteSaved={(client) => {
            setForm(null);
            setNotice(`Site ${client} saved.`);
          }}
          onJobCreated={(job) => void navigate(`/jobs/${job.id}`, { state: { notice: `Job ${job.kind} ${job.reference} started.` } })}
          onBoardCreated={(board) => void navigate(`/boards/${board.id}`)}
        />
      )}
      <CommandPalette
        open={palette.open}
        commandId={palette.commandId}
        onOpenChange={(open) => setPalette({ open })}
        registry={registry}
        ctx={ctx}
      />
      <KeysOverlay open={keysOpen} onOpenChange={setKeysOpen} registry={registry} ctx={ctx} sections={[jobsListKeys]} />
    </div>
  );
}

const jobsListKeys = {
  title: 'Jobs list',
  rows: [
    { label: 'Put the cursor in the search', keys: ['/'] },
    { label: 'Choose the next or previous board', keys: ['ArrowDown', 'ArrowUp'] },
    { label: 'Open the chosen board', keys: ['Enter'] },
    { label: 'Clear the search', keys: ['Escape'] },
  ],
};

/** The form the page's commands open, in a dialog. */
export function JobsFormDialog({
  form,
  tree,
  onClose,
  onSiteAdded,
  onSiteSaved,
  onJobCreated,
  onBoardCreated,
}: {
  form: JobsForm;
  tree: readonly SiteWithJobs[];
  onClose: () => void;
  onSiteAdded: (siteId: number, client: string) => void;
  onSiteSaved: (client: string) => void;
  onJobCreated: (job: Job) => void;
  onBoardCreated: (board: { id: number; reference: string }) => void;
}) {
  switch (form.kind) {
    case 'new-site':
      return (
        <FormDialog title="New site" onClose={onClose}>
          <SiteForm onSaved={(site) => onSiteAdded(site.id, site.client)} />
        </FormDialog>
      );
    case 'edit-site': {
      const site = tree.find((entry) => entry.site.id === form.siteId)?.site;
      return (
        <FormDialog title={site ? `Edit site ${site.client}` : 'Edit site'} onClose={onClose}>
          {site ? <SiteForm key={site.id} site={site} onSaved={(saved) => onSiteSaved(saved.client)} /> : <p>That site is no longer there.</p>}
        </FormDialog>
      );
    }
    case 'new-job':
      return (
        <FormDialog title="New job" onClose={onClose}>
          <NewJobForm key={form.siteId ?? 'any'} tree={tree} siteId={form.siteId} onCreated={onJobCreated} />
        </FormDialog>
      );
    case 'new-board':
      return (
        <FormDialog title="New board" onClose={onClose}>
          <NewBoardForm tree={tree} jobId={form.jobId} onCreated={onBoardCreated} />
        </FormDialog>
      );
  }
}


function SiteSection({
  entry,
  activeBoardId,
  onRowClick,
}: {
  entry: SiteWithJobs;
  activeBoardId: number | null;
  onRowClick: (event: MouseEvent<HTMLTableRowElement>, board: BoardSummary) => void;
}) {
  const headingId = `jobs-site-${entry.site.id}`;
  return (
    <section aria-labelledby={headingId} className="rounded border border-line bg-surface">
      <h2 id={headingId} className="flex flex-wrap items-baseline gap-x-2 border-b border-line px-3 py-1.5">
        <span className="font-semibold">{entry.site.client}</span>
        <span className="text-muted">{entry.site.address}</span>
      </h2>
      {entry.jobs.length === 0 && <p className="px-3 py-2 text-muted">No jobs at this site yet.</p>}
      {entry.jobs.map(({ job, boards }) => (
        <div key={job.id} className="border-b border-line last:border-b-0">
          <h3 className="flex items-baseline gap-2 px-3 pt-2 pb-1">
            <abbr title={jobKindNames[job.kind]} className="rounded bg-accent-soft px-1.5 text-xs font-semibold text-accent no-underline">
              {job.kind}
            </abbr>
            <Link to={`/jobs/${job.id}`} className="font-medium text-accent underline-offset-2 hover:underline" aria-label={`Job ${job.kind} ${job.reference}`}>
              {job.reference}
            </Link>
            <span className="text-muted">visited {formatVisitDate(job.visitDate)}</span>
            <span className="rounded border border-line px-1.5 text-xs text-muted">{jobStateLabels[job.state]}</span>
          </h3>
          {boards.length === 0 ? (
            <p className="px-3 pb-2 text-muted">No boards on this job yet.</p>
          ) : (
            <table className="mb-1 w-full table-fixed border-collapse">
              <caption className="sr-only">
                Boards of {job.kind} {job.reference}, {entry.site.client}
              </caption>
              <colgroup>
                <col className="w-40" />
                <col />
                <col className="w-28" />
                <col className="w-24" />
                <col className="w-56" />
              </colgroup>
              <thead>
                <tr className="text-left text-xs text-muted">
                  <th scope="col" className="px-3 py-1 font-medium">Board</th>
                  <th scope="col" className="px-3 py-1 font-medium">Location</th>
                  <th scope="col" className="px-3 py-1 font-medium">State</th>
                  <th scope="col" className="px-3 py-1 text-right font-medium">Circuits</th>
                  <th scope="col" className="px-3 py-1 font-medium">Progress</th>
                </tr>
              </thead>
              <tbody>
                {boards.map((board) => {
                  const active = board.id === activeBoardId;
                  return (
                    <tr
                      key={board.id}
                      id={boardRowId(board.id)}
                      aria-current={active ? 'true' : undefined}
                      onClick={(event) => onRowClick(event, board)}
                      className={`cursor-pointer border-t border-line ${
                        active ? 'bg-accent-soft outline-2 -outline-offset-2 outline-accent' : 'hover:bg-paper'
                      }`}
                    >
                      <td className="truncate px-3 py-1">
                        <Link to={`/boards/${board.id}`} className="font-medium text-accent underline-offset-2 hover:underline">
                          {board.reference}
                        </Link>
                        {board.phases === 3 && <span className="ml-1.5 text-xs text-muted">3-phase</span>}
                      </td>
                      <td className="truncate px-3 py-1">{board.location || <span className="text-muted">—</span>}</td>
                      <td className="px-3 py-1">
                        <BoardStateLabel state={board.state} />
                      </td>
                      <td className="px-3 py-1 text-right tabular-nums">{board.circuitCount}</td>
                      <td className="px-3 py-1">
                        <BoardProgress readingsDone={board.readingsDone} readingsRequired={board.readingsRequired} />
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          )}
        </div>
      ))}
    </section>
  );
}
