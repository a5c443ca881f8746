import { useId, useState, type FormEvent } from 'react';
import type { Role } from '../../../../shared/schemas/common.ts';
import { mailStateLabels, type OutgoingMail } from '../../../../shared/schemas/mail.ts';
import { jobStateLabels } from '../../../../shared/schemas/sites.ts';
import { ApiError } from '../../../lib/api-client.ts';
import { useJobMail } from '../api/get-job-mail.ts';
import { useRetryMail, useSendJob } from '../api/send-job.ts';

const inputClass =
  'block w-full rounded border border-line-strong bg-surface px-2 py-1 aria-invalid:border-danger aria-invalid:bg-danger-soft';
const buttonClass = 'rounded bg-accent px-3 py-1.5 font-medium text-white hover:bg-accent-hover aria-disabled:opacity-70';

const stateClass: Record<OutgoingMail['state'], string> = {
  waiting: 'border-line-strong text-muted',
  sending: 'border-accent text-accent',
  sent: 'border-ok bg-ok-soft text-ok',
  failed: 'border-danger bg-danger-soft text-danger',
};

const when = (iso: string) => new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/**
 * "Send to client" on the job screen: once the job is issued, a reviewer or an admin sends the
 * newest revision's PDF to the site's contact (or another address) with a few words of their own.
 * The server answers at once and sends in the background; the list shows each e-mail's progress
 * (asked again every second while one is on its way), why a failed one failed, and a retry.
 */
export function SendPanel({ jobId, personRole }: { jobId: number; personRole: Role }) {
  const mail = useJobMail(jobId);
  const headingId = useId();
  const mayAct = personRole === 'reviewer' || personRole === 'admin';

  return (
    <section aria-labelledby={headingId} className="space-y-3 rounded border border-line bg-surface p-4">
      <h2 id={headingId} className="text-base font-semibold">
        Send to client
      </h2>
      {mail.isPending && <p className="text-muted">Loading the job's e-mails…</p>}
      {mail.isError && (
        <div role="alert" className="space-y-2 text-danger">
          <p>The job's e-mails could not be loaded: {mail.error.message}</p>
          <button type="button" className="rounded border border-danger px-2 py-0.5 font-medium" onClick={() => void mail.refetch()}>
            Try again
          </button>
        </div>
      )}
      {mail.isSuccess && (
        <>
          {mail.data.jobState !== 'issued' || !mail.data.latestIssue ? (
            <p className="text-muted">
              The document can be sent once the job is issued; it is {jobStateLabels[mail.data.jobState]}.
            </p>
          ) : mayAct ? (
            <SendForm jobId={jobId} defaultTo={mail.data.defaultTo} revision={mail.data.latestIssue.revision} photosChosen={mail.data.photosChosen} />
          ) : (
            <p className="text-muted">A reviewer or an admin sends revision {mail.data.latestIssue.revision} to the client.</p>
          )}
          <MailList mail={mail.data.mail} mayRetry={mayAct} />
        </>
      )}
    </section>
  );
}

function SendForm({ jobId, defaultTo, revision, photosChosen }: { jobId: number; defaultTo: string; revision: number; photosChosen: number }) {
  const send = useSendJob();
  const [errors, setErrors] = useState<{ to?: string; message?: string; form?: string }>({});
  const [queued, setQueued] = useState<string | null>(null);
  const baseId = useId();
  const toId = `${baseId}-to`;
  const messageId = `${baseId}-message`;

  function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (send.isPending) return;
    const form = event.currentTarget;
    const data = new FormData(form);
    const to = String(data.get('to') ?? '').trim();
    const message = String(data.get('message') ?? '').trim();
    setErrors({});
    setQueued(null);
    if (!to) {
      setErrors({ to: 'Give the address to send to: the site has no contact e-mail.' });
      document.getElementById(toId)?.focus();
      return;
    }
    send.mutate(
      { jobId, body: { to, ...(message ? { message } : {}) } },
      {
        onSuccess: (mail) => {
          form.reset();
          setQueued(`Revision ${mail.revision ?? revision} is on its way to ${mail.to}.`);
        },
        onError: (error) => {
          const issue = error instanceof ApiError ? error.issues[0] : undefined;
          if (issue?.path === 'to' || issue?.path === 'message') {
            setErrors({ [issue.path]: issue.message });
            document.getElementById(issue.path === 'to' ? toId : messageId)?.focus();
          } else {
            setErrors({ form: error.message });
          }
        },
      },
    );
  }

  return (
    <form noValidate onSubmit={handleSubmit} aria-label="Send the issued document" className="space-y-2">
      <p>
        Sends revision {revision} as a PDF attachment, with a short standard message and your own words if you add some. {photosChosen === 0
          ? 'No photo of the notes goes with it (choose any under “Photos of the notes”).'
          : photosChosen === 1
            ? 'The one photo of the notes chosen under “Photos of the notes” goes with it.'
            : `The ${photosChosen} photos of the notes chosen under “Photos of the notes” go with it.`}
      </p>
      <div className="space-y-1">
        <label htmlFor={toId} className="block font-medium">
          To
        </label>
        <input
          id={toId}
          name="to"
          type="email"
          defaultValue={defaultTo}
          autoComplete="off"
          spellCheck={false}
          className={inputClass}
          aria-invalid={errors.to ? true : undefined}
          aria-describedby={errors.to ? `${toId}-error` : `${toId}-hint`}
        />
        {errors.to ? (
          <p id={`${toId}-error`} className="text-danger">
            {errors.to}
          </p>
        ) : (
          <p id={`${toId}-hint`} className="text-xs text-muted">
            {defaultTo ? "The site's contact; change it to send elsewhere." : 'The site has no contact e-mail yet.'}
          </p>
        )}
      </div>
      <div className="space-y-1">
        <label htmlFor={messageId} className="block font-medium">
          Your message (optional)
        </label>
        <textarea
          id={messageId}
          name="message"
          rows={3}
          maxLength={2000}
          className={inputClass}
          aria-invalid={errors.message ? true : undefined}
          aria-describedby={errors.message ? `${messageId}-error` : `${messageId}-hint`}
          onKeyDown={(e) => {
            // Ctrl+Enter (⌘+Enter) sends from the message; Enter alone starts a new line.
            if (e.key === 'Enter' && (e.ctrlKey || e.metaKey) && !e.nativeEvent.isComposing) {
              e.preventDefault();
              e.currentTarget.form?.requestSubmit();
            }
          }}
        />
        {errors.message ? (
          <p id={`${messageId}-error`} className="text-danger">
            {errors.message}
          </p>
        ) : (
          <p id={`${messageId}-hint`} className="text-xs text-muted">
            Ctrl+Enter sends.
          </p>
        )}
      </div>
      <button type="submit" aria-disabled={send.isPending || undefined} className={buttonClass}>
        {send.isPending ? 'Sending…' : 'Send to client'}
      </button>
      <div role="alert" className="empty:hidden text-danger">
        {errors.form}
      </div>
      <p role="status" className="empty:hidden text-ok">
        {queued}
      </p>
    </form>
  );
}

function MailList({ mail, mayRetry }: { mail: OutgoingMail[]; mayRetry: boolean }) {
  if (mail.length === 0) return <p className="text-muted">Nothing has been sent for this job yet.</p>;
  return (
    <div className="space-y-1">
      <h3 className="font-medium">E-mails sent</h3>
      <ul className="divide-y divide-line rounded border border-line" aria-label="E-mails of this job">
        {mail.map((m) => (
          <MailRow key={m.id} mail={m} mayRetry={mayRetry} />
        ))}
      </ul>
    </div>
  );
}

function MailRow({ mail, mayRetry }: { mail: OutgoingMail; mayRetry: boolean }) {
  const retry = useRetryMail();
  return (
    <li className="space-y-1 px-3 py-2">
      <div className="flex flex-wrap items-center gap-2">
        <span className={`rounded border px-1.5 py-px text-xs font-medium ${stateClass[mail.state]}`}>{mailStateLabels[mail.state]}</span>
        <span className="break-all">
          To {mail.to}
          {mail.revision !== null && <>, revision {mail.revision}</>}
        </span>
        <span className="text-xs text-muted">
          {mail.state === 'sent' && mail.sentAt ? `sent ${when(mail.sentAt)}` : `asked ${when(mail.createdAt)}`}
          {mail.createdBy && ` by ${mail.createdBy.name}`}
          {mail.attempts > 1 && ` · ${mail.attempts} attempts`}
        </span>
      </div>
      {mail.state === 'failed' && (
        <div className="flex flex-wrap items-center gap-2">
          <p className="text-danger">{mail.lastError ?? 'The e-mail was not sent.'}</p>
          {mayRetry && (
            <button
              type="button"
              aria-disabled={retry.isPending || undefined}
              className="rounded border border-line-strong px-2 py-0.5 font-medium hover:bg-accent-soft aria-disabled:opacity-70"
              onClick={() => {
                if (!retry.isPending) retry.mutate(mail.id);
              }}
            >
              {retry.isPending ? 'Retrying…' : `Retry sending to ${mail.to}`}
            </button>
          )}
          {retry.isError && (
            <p role="alert" className="text-danger">
              {retry.error.message}
            </p>
          )}
        </div>
      )}
    </li>
  );
}
