import type { Finding } from '../../../../shared/schemas/findings.ts';
import { useRecord } from './record-context.tsx';

const severityWords = { error: '✗ error', warning: '! warning', note: 'i note', todo: '… to do' } as const;

/**
 * The job's own findings (the checker's job rules, as the server last answered), each with the
 * limit it compared against and the limit's source. Choosing one goes to the field it is about.
 */
export function JobFindings({ onGoTo }: { onGoTo: (finding: Finding) => void }) {
  const { detail } = useRecord();
  const findings = detail.findings;
  return (
    <section aria-labelledby="job-findings-heading" className="space-y-2 rounded border border-line bg-surface p-4">
      <h2 id="job-findings-heading" tabIndex={-1} className="text-base font-semibold focus:outline-none">
        Findings on the record ({findings.length})
      </h2>
      {findings.length === 0 ? (
        <p className="text-muted">Nothing found so far. Findings about readings are with each board.</p>
      ) : (
        <ul className="space-y-1">
          {findings.map((finding, index) => (
            <li key={`${finding.code}-${finding.section ?? ''}-${finding.field ?? ''}-${finding.boardId ?? ''}-${index}`}>
              <button
                type="button"
                data-job-finding
                onClick={() => onGoTo(finding)}
                onKeyDown={(event) => {
                  // ↑/↓ move through the list as in the console's findings.
                  if (event.key !== 'ArrowDown' && event.key !== 'ArrowUp') return;
                  event.preventDefault();
                  const all = [...document.querySelectorAll<HTMLElement>('[data-job-finding]')];
                  all[all.indexOf(event.currentTarget) + (event.key === 'ArrowDown' ? 1 : -1)]?.focus();
                }}
                className="w-full rounded border border-line px-2 py-1 text-left hover:bg-accent-soft"
              >
                <span className={finding.severity === 'error' ? 'font-semibold text-danger' : finding.severity === 'warning' ? 'font-semibold' : 'text-muted'}>
                  {severityWords[finding.severity]}
                </span>{' '}
                {finding.message}
                {(finding.limit || finding.source) && (
                  <span className="block text-xs text-muted">
                    {finding.limit && <>limit: {finding.limit}</>}
                    {finding.limit && finding.source && ' · '}
                    {finding.source && <>source: {finding.source}</>}
                  </span>
                )}
              </button>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
