import { useId, useRef, useState, type FormEvent } from 'react';
import type { Role } from '../../../../shared/schemas/common.ts';
import { reopenJobBodySchema, type JobIssue } from '../../../../shared/schemas/issues.ts';
import { jobStateLabels } from '../../../../shared/schemas/sites.ts';
import { ApiError } from '../../../lib/api-client.ts';
import { useJobIssues } from '../api/get-issues.ts';
import { useIssueJob } from '../api/issue-job.ts';
import { useReopenJob } from '../api/reopen-job.ts';

function messageOf(error: unknown): string {
  if (error instanceof ApiError) return error.issues[0]?.message ?? error.message;
  return error instanceof Error ? error.message : String(error);
}

/** The reasons a refusal lists (e.g. who has not signed yet), when the server gives them. */
function reasonsOf(error: unknown): string[] {
  if (!(error instanceof ApiError)) return [];
  const details = error.details as { reasons?: unknown } | undefined;
  return Array.isArray(details?.reasons) ? details.reasons.filter((r): r is string => typeof r === 'string') : [];
}

const when = (iso: string) => new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' });
const documentName = { EIC: 'certificate', EICR: 'report' } as const;

/**
 * The job screen's panel for issued documents: issue an approved job (reviewers and admins), the
 * list of issued revisions with their PDFs, and reopening an issued job with a reason. An issued
 * PDF never changes; reopening keeps every revision and the next issue is the next one.
 */
export function IssuePanel({ jobId, role }: { jobId: number; role: Role | null }) {
  const issues = useJobIssues(jobId);
  const issue = useIssueJob(jobId);
  const reopen = useReopenJob(jobId);
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState<string | null>(null);
  const [status, setStatus] = useState<{ text: string; tone: 'info' | 'error'; reasons?: string[] } | null>(null);
  const reasonRef = useRef<HTMLInputElement>(null);
  const id = useId();
  const isReviewer = role === 'reviewer' || role === 'admin';

  if (issues.isPending) return <section aria-label="Issued documents" className="p-3 text-muted">Loading the issued documents…</section>;
  if (issues.isError) {
    return (
      <section aria-label="Issued documents" className="p-3">
        <p role="alert" className="text-danger">
          The issued documents cannot be shown: {messageOf(issues.error)}
        </p>
      </section>
    );
  }
  const { job, issues: revisions } = issues.data;
  const next = (revisions[0]?.revision ?? 0) + 1;
  const kind = documentName[job.kind];

  function doIssue() {
    if (issue.isPending) return;
    setStatus(null);
    issue.mutate(undefined, {
      onSuccess: ({ issue: made }) => setStatus({ text: `Revision ${made.revision} issued: its PDF is stored and will not change.`, tone: 'info' }),
      onError: (error) => setStatus({ text: messageOf(error), tone: 'error', reasons: reasonsOf(error) }),
    });
  }

  function doReopen(event: FormEvent) {
    event.preventDefault();
    if (reopen.isPending) return;
    const parsed = reopenJobBodySchema.safeParse({ reason });
    if (!parsed.success) {
      setReasonError(parsed.error.issues[0]?.message ?? 'Say why the issued document must change.');
      reasonRef.current?.focus();
      return;
    }
    setReasonError(null);
    setStatus(null);
    reopen.mutate(parsed.data, {
      onSuccess: () => {
        setReason('');
        setStatus({ text: `Reopened: the job is being entered again. Revision ${next - 1} stays as issued; the next issue will be revision ${next}. Everyone signs again for it: a signature stays with the revision it was given for.`, tone: 'info' });
      },
      onError: (error) => {
        if (error instanceof ApiError && error.status === 400) {
          setReasonError(messageOf(error));
          reasonRef.current?.focus();
        } else setStatus({ text: messageOf(error), tone: 'error' });
      },
    });
  }

  return (
    <section aria-labelledby={`${id}-heading`} className="space-y-2 rounded border border-line bg-surface p-3">
      <h2 id={`${id}-heading`} className="font-semibold">
        Issued documents
      </h2>

      {job.state === 'approved' && isReviewer && (
        <div className="space-y-1">
          <p className="text-sm">
            Issuing makes the PDF of the whole {kind} — the record, the schedule of inspections, every board’s schedule of test results, the
            signatures — and stores it with its SHA-256. It never changes afterwards.
          </p>
          <button
            type="button"
            onClick={doIssue}
            aria-disabled={issue.isPending || undefined}
            className="rounded bg-accent px-3 py-0.5 font-medium text-white aria-disabled:opacity-70"
          >
            {issue.isPending ? 'Making the PDF…' : `Issue revision ${next}`}
          </button>
        </div>
      )}
      {job.state === 'approved' && !isReviewer && <p className="text-sm">Approved: a reviewer or an admin issues it.</p>}
      {(job.state === 'entering' || job.state === 'ready') && (
        <p className="text-sm text-muted">
          The job is {jobStateLabels[job.state]}. It can be issued once a reviewer has approved it
          {revisions.length > 0 ? `; the next issue will be revision ${next}.` : '.'}
        </p>
      )}

      {status && (
        <div role={status.tone === 'error' ? 'alert' : 'status'} className={status.tone === 'error' ? 'text-sm text-danger' : 'text-sm'}>
          <p>{status.text}</p>
          {status.reasons && status.reasons.length > 0 && (
            <ul className="list-disc pl-5">
              {status.reasons.map((r) => (
                <li key={r}>{r}</li>
              ))}
            </ul>
          )}
        </div>
      )}

      {revisions.length === 0 ? (
        <p className="text-sm text-muted">Nothing has been issued yet.</p>
      ) : (
        <ol aria-label="Revisions" className="space-y-1.5 text-sm">
          {revisions.map((revision) => (
            <RevisionItem key={revision.revision} revision={revision} reference={job.reference} />
          ))}
        </ol>
      )}

      {job.state === 'issued' && isReviewer && (
        <form onSubmit={doReopen} noValidate aria-label="Reopen the job" className="space-y-1 border-t border-line pt-2">
          <label htmlFor={`${id}-reason`} className="block text-sm font-medium">
            Why the issued {kind} must change
          </label>
          <div className="flex gap-2">
            <input
              id={`${id}-reason`}
              ref={reasonRef}
              value={reason}
              onChange={(e) => setReason(e.target.value)}
              aria-invalid={reasonError ? true : undefined}
              aria-describedby={reasonError ? `${id}-reason-error` : `${id}-reason-help`}
              className="min-w-0 flex-1 rounded border border-line-strong px-2 py-0.5"
            />
            <button type="submit" aria-disabled={reopen.isPending || undefined} className="rounded border border-line-strong px-3 py-0.5 font-medium aria-disabled:opacity-70">
              {reopen.isPending ? 'Reopening…' : 'Reopen'}
            </button>
          </div>
          {reasonError ? (
            <p id={`${id}-reason-error`} className="text-sm text-danger">
              {reasonError}
            </p>
          ) : (
            <p id={`${id}-reason-help`} className="text-xs text-muted">
              The job goes back to being entered. Revision {next - 1} is kept as issued; the next issue will be revision {next} and mark it
              superseded. Locked boards stay locked until a reviewer unlocks the ones that need changes.
            </p>
          )}
        </form>
      )}
      {job.state === 'issued' && !isReviewer && <p className="text-sm text-muted">Issued. To change it, a reviewer reopens it with a reason.</p>}

      <p className="text-sm">
        <a href={`/api/jobs/${jobId}/export.json`} download className="underline">
          Download the job as JSON
        </a>{' '}
        <span className="text-muted">(the record and every board’s circuits, for your own records)</span>
      </p>
      <p className="text-xs text-muted">
        Issue only results taken by competent people after safe isolation. The current edition of BS 7671 and local regulations take
        precedence over anything in the document.
      </p>
    </section>
  );
}

function RevisionItem({ revision, reference }: { revision: JobIssue; reference: string }) {
  return (
    <li className="rounded border border-line px-2 py-1">
      <p>
        <span className="font-medium">Revision {revision.revision}</span>{' '}
        {revision.supersededAt ? (
          <span className="text-muted">superseded {when(revision.supersededAt)}</span>
        ) : (
          <span className="rounded border border-line-strong px-1">current</span>
        )}
      </p>
      <p>
        Issued {when(revision.issuedAt)} by {revision.issuedBy.name}
      </p>
      <p className="text-xs text-muted">
        SHA-256 <code title={revision.sha256}>{revision.sha256.slice(0, 16)}…</code>
      </p>
      <a href={revision.pdfUrl} download className="underline">
        Download {reference} revision {revision.revision} (PDF, {Math.max(1, Math.round(revision.sizeBytes / 1024))} kB)
      </a>
    </li>
  );
}
