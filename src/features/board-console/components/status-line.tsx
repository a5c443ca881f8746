import type { Circuit } from '../../../../shared/schemas/boards.ts';
import type { ColumnDef } from '../../../../shared/schemas/columns.ts';
import { severitySymbol, severityWord, type CellFindings } from '../grid/findings-index.ts';
import type { EditState } from '../grid/grid-state.ts';
import type { SaveStatus } from '../sync/types.ts';
import { severityBadgeClass } from './board-grid.tsx';
import type { Notice } from './use-grid-controller.ts';
import { describeSaveStatus, saveToneClass } from './save-status.ts';

export interface StatusLineProps {
  circuit: Circuit | null;
  column: ColumnDef | null;
  value: string;
  /** The LIM's reason when the value is a limitation. */
  reason: string | null;
  findings: CellFindings | undefined;
  /**
   * Last time's reading of this cell when the board was started from an earlier job: the text as
   * written then (empty when that circuit had none in this column) and that job.
   */
  previous: { text: string; reason: string | null; job: { kind: string; reference: string; visitDate: string } } | null;
  /** Text refused at this cell (not saved), if any. */
  refused: string | undefined;
  edit: EditState | null;
  selectionSize: { rows: number; cols: number } | null;
  notice: Notice | null;
  status: SaveStatus;
}

/**
 * The line under the grid: where the cursor is and what the column means, the value's finding with
 * its limit and source, what the last key did, and the save state.
 */
export function StatusLine(props: StatusLineProps) {
  const { circuit, column, findings, refused, notice } = props;
  const save = describeSaveStatus(props.status);
  const worst = findings?.worst;
  return (
    <section aria-label="Status line" className="shrink-0 border-t border-line-strong bg-surface px-3 py-1 text-sm">
      <div className="flex flex-wrap items-baseline gap-x-3">
        <span className="font-semibold">
          {circuit ? (
            <>
              Circuit <span className="font-mono">{circuit.number}</span>
              {circuit.description ? <span className="font-normal text-muted"> · {circuit.description}</span> : null}
            </>
          ) : (
            'No circuit'
          )}
        </span>
        {column && (
          <span>
            <span className="font-semibold">
              {column.label}
              {column.unit ? ` (${column.unit})` : ''}
            </span>
            <span className="text-muted"> — {column.meaning}</span>
          </span>
        )}
        <span className="font-mono">{props.value ? `= ${props.value}` : ''}</span>
        {props.reason && <span className="text-muted">Limitation: {props.reason}</span>}
        {props.previous && (
          <span className="text-muted" title={`The same circuit on ${props.previous.job.kind} ${props.previous.job.reference}`}>
            Last time ({props.previous.job.reference}, {props.previous.job.visitDate}):{' '}
            <span className="font-mono text-ink">{props.previous.text || 'not recorded'}</span>
            {props.previous.reason ? ` (limitation: ${props.previous.reason})` : ''}
          </span>
        )}
        {props.edit && (
          <span className="text-muted">
            {props.edit.mode === 'replace' ? 'typing — Enter saves and goes down, Esc cancels' : 'editing in place — ← → move the caret, Enter saves, Esc cancels'}
          </span>
        )}
        {props.selectionSize && (props.selectionSize.rows > 1 || props.selectionSize.cols > 1) && (
          <span className="text-muted">
            {props.selectionSize.rows} × {props.selectionSize.cols} selected
          </span>
        )}
        <span className={`ml-auto ${saveToneClass[save.tone]}`}>
          <span aria-hidden="true">{save.symbol} </span>
          {save.text}
        </span>
      </div>
      <div className="flex min-h-5 flex-wrap items-baseline gap-x-3">
        {refused ? (
          <span className="text-danger">
            <span aria-hidden="true" className={`mr-1 rounded px-0.5 text-[11px] font-bold ${severityBadgeClass.error}`}>
              {severitySymbol.error}
            </span>
            Not saved: {refused}
          </span>
        ) : worst ? (
          <span>
            <span aria-hidden="true" className={`mr-1 rounded px-0.5 text-[11px] font-bold ${severityBadgeClass[worst.severity]}`}>
              {severitySymbol[worst.severity]}
            </span>
            <span className="font-semibold">{severityWord[worst.severity]}:</span> {worst.message}
            {worst.limit && <span className="text-muted"> · Limit {worst.limit}</span>}
            {worst.source && <span className="text-muted"> · Source: {worst.source}</span>}
            {findings && findings.all.length > 1 && <span className="text-muted"> · and {findings.all.length - 1} more</span>}
          </span>
        ) : (
          <span className="text-muted">{circuit ? 'No finding on this cell.' : ''}</span>
        )}
        <span role="status" aria-live="polite" className={`ml-auto ${notice?.tone === 'error' ? 'text-danger' : 'text-muted'}`}>
          {notice ? <span key={notice.id}>{notice.text}</span> : null}
        </span>
      </div>
    </section>
  );
}
