import { useMailbox } from '../api/get-mailbox.ts';

const size = (bytes: number) => (bytes >= 1024 * 1024 ? `${(bytes / (1024 * 1024)).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} kB`);
const when = (iso: string) => new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'medium' });

/**
 * Admins only: the messages Boardwalk's own local mail server received (used when no SMTP_URL
 * is set: development, the demo, tests), newest first, each with its attachments to open.
 */
export function MailboxPage() {
  const mailbox = useMailbox();
  return (
    <div className="mx-auto w-full max-w-6xl space-y-3 p-4">
      <div className="flex flex-wrap items-baseline gap-3">
        <h1 className="text-lg font-semibold">Local mailbox</h1>
        <button
          type="button"
          className="rounded border border-line-strong px-2 py-0.5 font-medium hover:bg-accent-soft"
          onClick={() => void mailbox.refetch()}
        >
          {mailbox.isFetching ? 'Looking…' : 'Look again'}
        </button>
      </div>
      {mailbox.isSuccess && (
        <p className="text-muted">
          {mailbox.data.localServerPort === null
            ? 'E-mail goes to the mail server set in SMTP_URL; this list shows only what the local mail server kept earlier.'
            : `Without SMTP_URL, e-mail goes to Boardwalk's own mail server on port ${mailbox.data.localServerPort}, which keeps every message here and delivers nothing onwards.`}
        </p>
      )}
      {mailbox.isPending && <p className="text-muted">Loading the mailbox…</p>}
      {mailbox.isError && (
        <div role="alert" className="space-y-2 rounded border border-danger bg-danger-soft px-3 py-2 text-danger">
          <p>The mailbox could not be loaded: {mailbox.error.message}</p>
          <button type="button" className="rounded border border-danger bg-surface px-2 py-0.5 font-medium" onClick={() => void mailbox.refetch()}>
            Try again
          </button>
        </div>
      )}
      {mailbox.isSuccess && mailbox.data.messages.length === 0 && <p>No messages yet.</p>}
      {mailbox.isSuccess && mailbox.data.messages.length > 0 && (
        <table className="w-full border-collapse rounded border border-line bg-surface">
          <caption className="sr-only">Messages received by the local mail server, newest first</caption>
          <thead>
            <tr className="text-left text-xs text-muted">
              <th scope="col" className="px-3 py-1.5 font-medium">Received</th>
              <th scope="col" className="px-3 py-1.5 font-medium">From</th>
              <th scope="col" className="px-3 py-1.5 font-medium">To</th>
              <th scope="col" className="px-3 py-1.5 font-medium">Subject</th>
              <th scope="col" className="px-3 py-1.5 font-medium">Attachments</th>
            </tr>
          </thead>
          <tbody>
            {mailbox.data.messages.map((m) => (
              <tr key={m.id} className="border-t border-line align-top">
                <td className="px-3 py-1.5 whitespace-nowrap">{when(m.receivedAt)}</td>
                <td className="px-3 py-1.5 break-all">{m.from || m.envelopeFrom}</td>
                <td className="px-3 py-1.5 break-all">{m.envelopeTo.join(', ') || m.to}</td>
                <th scope="row" className="px-3 py-1.5 text-left font-normal">
                  {m.subject || '(no subject)'}{' '}
                  <a className="text-xs text-accent underline" href={`/api/admin/mailbox/${m.id}/raw`}>
                    whole message
                  </a>
                </th>
                <td className="px-3 py-1.5">
                  {m.attachments.length === 0 ? (
                    <span className="text-muted">none</span>
                  ) : (
                    <ul className="space-y-0.5">
                      {m.attachments.map((a) => (
                        <li key={a.index}>
                          <a className="text-accent underline" href={`/api/admin/mailbox/${m.id}/attachments/${a.index}`} target="_blank" rel="noreferrer">
                            {a.filename}
                          </a>{' '}
                          <span className="text-xs text-muted">
                            {size(a.sizeBytes)} · SHA-256 <span className="font-mono">{a.sha256.slice(0, 12)}…</span>
                          </span>
                        </li>
                      ))}
                    </ul>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </div>
  );
}
