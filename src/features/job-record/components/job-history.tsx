import { useState } from 'react';
import { inspectionItemsById } from '../../../../shared/schemas/inspection-items.ts';
import type { JobSectionKey } from '../../../../shared/schemas/job-record.ts';
import { useJobHistory } from '../api/get-job-history.ts';
import { sectionTitles } from '../commands.ts';
import { fieldDomId, useRecord } from './record-context.tsx';

const SHOWN = 30;

function valueText(value: unknown): string {
  if (value === null || value === undefined || value === '') return 'blank';
  if (typeof value === 'object') {
    const o = value as Record<string, unknown>;
    // An observation reads by its number, code and text; anything else by its values.
    if ('number' in o && 'text' in o) return `observation ${String(o.number)}${o.code ? ` ${String(o.code)}` : ''}: ${String(o.text)}`;
    if (Array.isArray(value)) return `${value.length} item(s)`;
    return Object.values(o).filter((v) => v !== '' && v !== null).join(', ') || 'blank';
  }
  return String(value);
}

function whereText(section: string | null, field: string | null): string {
  const title = section && section in sectionTitles ? sectionTitles[section as JobSectionKey] : (section ?? 'the job');
  if (!field) return title;
  if (section === 'inspections') return `${title}, item ${field}${inspectionItemsById.get(field) ? ` (${inspectionItemsById.get(field)!.text})` : ''}`;
  if (section === 'observations') return title;
  // The field's own label on the screen, as the person knows it.
  const label = section ? document.querySelector(`label[for="${fieldDomId(section as JobSectionKey, field)}"]`)?.textContent : null;
  return `${title}, ${label ?? field}`;
}

/** Who changed what in the record, newest first; loaded when opened. */
export function JobHistory() {
  const { detail } = useRecord();
  const [open, setOpen] = useState(false);
  const history = useJobHistory(detail.job.id, open);
  const entries = [...(history.data ?? [])].reverse().slice(0, SHOWN);
  return (
    <details className="rounded border border-line bg-surface p-4" onToggle={(event) => setOpen(event.currentTarget.open)}>
      <summary className="cursor-pointer font-semibold">Changes to the record</summary>
      {history.isPending && open && <p className="mt-2 text-muted">Loading…</p>}
      {history.isError && <p className="mt-2 text-danger">The changes could not be loaded: {history.error.message}</p>}
      {history.isSuccess && entries.length === 0 && <p className="mt-2 text-muted">No changes yet.</p>}
      {entries.length > 0 && (
        <ol className="mt-2 space-y-1.5 text-sm">
          {entries.map((entry) => (
            <li key={entry.id}>
              <span className="text-xs text-muted">
                {new Date(entry.at).toLocaleString('en-GB', { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' })} · {entry.by?.name ?? 'the app'}
              </span>
              <span className="block">
                {entry.action === 'record'
                  ? `${whereText(entry.section, entry.field)}: ${valueText(entry.oldValue)} → ${valueText(entry.newValue)}`
                  : `${entry.action.replace(/[-_]/g, ' ')}${entry.section || entry.field ? ` (${whereText(entry.section, entry.field)})` : ''}${entry.newValue !== null && entry.newValue !== undefined ? `: ${valueText(entry.newValue)}` : ''}`}
                {entry.reason && <span className="text-muted"> ({entry.reason})</span>}
              </span>
            </li>
          ))}
        </ol>
      )}
      {(history.data?.length ?? 0) > SHOWN && <p className="mt-1 text-xs text-muted">The {SHOWN} newest of {history.data!.length} changes.</p>}
    </details>
  );
}
