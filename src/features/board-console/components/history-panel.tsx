import { useQuery } from '@tanstack/react-query';
import { useState, type KeyboardEvent } from 'react';
import { z } from 'zod';
import { boardHistoryResponseSchema } from '../../../../shared/schemas/boards.ts';
import { columnByKey, columns, isDetailKey, isReadingKey, type ColumnKey } from '../../../../shared/schemas/columns.ts';
import { apiGet } from '../../../lib/api-client.ts';
import { boardKeys } from '../api/board-keys.ts';

const cellHistorySchema = z.object({
  history: z.array(
    z.object({
      id: z.number().int(),
      oldText: z.string().nullable(),
      newText: z.string().nullable(),
      by: z.object({ id: z.number().int(), name: z.string() }).nullable(),
      at: z.string(),
      how: z.string(),
    }),
  ),
});

export type HistoryTarget = { kind: 'cell'; circuitId: number; circuitNumber: string; column: ColumnKey } | { kind: 'board' };

function columnName(key: string | null): string {
  if (key === null) return '';
  return isReadingKey(key) || isDetailKey(key) ? columnByKey[key].label : key;
}

function when(at: string): string {
  const d = new Date(at);
  return Number.isNaN(d.getTime()) ? at : d.toLocaleString(undefined, { dateStyle: 'short', timeStyle: 'medium' });
}

function change(oldText: string | null, newText: string | null): string {
  const shown = (t: string | null) => (t === null || t === '' ? '(empty)' : `“${t}”`);
  return `${shown(oldText)} → ${shown(newText)}`;
}

/**
 * A cell's history (who, when, how: typed, dictated, pasted, imported…) or the board's, newest
 * first; the board's filterable by person and by column. Esc closes and gives the grid the keys.
 */
export function HistoryPanel({ boardId, target, onClose }: { boardId: number; target: HistoryTarget; onClose: () => void }) {
  const [person, setPerson] = useState('');
  const [column, setColumn] = useState('');
  const cell = useQuery({
    queryKey: [...boardKeys.all, 'history', boardId, 'cell', target.kind === 'cell' ? `${target.circuitId}:${target.column}` : ''],
    queryFn: ({ signal }) =>
      target.kind === 'cell' ? apiGet(`/api/boards/${boardId}/circuits/${target.circuitId}/cells/${target.column}/history`, cellHistorySchema, { signal }) : null,
    enabled: target.kind === 'cell',
  });
  const board = useQuery({
    queryKey: [...boardKeys.all, 'history', boardId, 'board', person, column],
    queryFn: ({ signal }) => {
      const params = new URLSearchParams();
      if (person) params.set('person', person);
      if (column) params.set('column', column);
      return apiGet(`/api/boards/${boardId}/history?${params.toString()}`, boardHistoryResponseSchema, { signal });
    },
    enabled: target.kind === 'board',
  });
  const onKeyDown = (event: KeyboardEvent<HTMLElement>) => {
    event.stopPropagation();
    if (event.key === 'Escape') {
      event.preventDefault();
      onClose();
    }
  };
  const title = target.kind === 'cell' ? `History of ${columnByKey[target.column].label}, circuit ${target.circuitNumber}` : 'Board history';
  return (
    <section aria-label={title} tabIndex={-1} onKeyDown={onKeyDown} className="flex max-h-72 shrink-0 flex-col border-b border-line bg-paper px-3 py-2 text-sm">
      <div className="flex flex-wrap items-end gap-3">
        <h2 className="font-semibold">{title}</h2>
        {target.kind === 'board' && (
          <>
            <label className="flex items-center gap-1">
              <span className="text-xs text-muted">Person</span>
              <select autoFocus value={person} onChange={(e) => setPerson(e.target.value)} className="rounded border border-line-strong px-1 py-0.5">
                <option value="">everyone</option>
                {(board.data?.people ?? []).map((p) => (
                  <option key={p.id} value={String(p.id)}>
                    {p.name}
                  </option>
                ))}
              </select>
            </label>
            <label className="flex items-center gap-1">
              <span className="text-xs text-muted">Column</span>
              <select value={column} onChange={(e) => setColumn(e.target.value)} className="rounded border border-line-strong px-1 py-0.5">
                <option value="">every column</option>
                {columns.map((c) => (
                  <option key={c.key} value={c.key}>
                    {c.label}
                  </option>
                ))}
              </select>
            </label>
          </>
        )}
        <button type="button" autoFocus={target.kind === 'cell'} onClick={onClose} className="ml-auto rounded border border-line-strong px-2 py-0.5">
          Close (Esc)
        </button>
      </div>
      <ol aria-label="Changes, newest first" className="mt-1 min-h-0 flex-1 overflow-auto font-mono text-[13px]">
        {target.kind === 'cell' &&
          (cell.isLoading ? (
            <li className="text-muted">Loading…</li>
          ) : (cell.data?.history.length ?? 0) === 0 ? (
            <li className="text-muted">Nothing recorded for this cell yet.</li>
          ) : (
            [...(cell.data?.history ?? [])].reverse().map((h) => (
              <li key={h.id}>
                {when(h.at)} · {h.by?.name ?? 'someone'} · {h.how} · {change(h.oldText, h.newText)}
              </li>
            ))
          ))}
        {target.kind === 'board' &&
          (board.isLoading ? (
            <li className="text-muted">Loading…</li>
          ) : (board.data?.history.length ?? 0) === 0 ? (
            <li className="text-muted">No change matches.</li>
          ) : (
            (board.data?.history ?? []).map((h) => (
              <li key={h.id}>
                {when(h.at)} · {h.by?.name ?? 'someone'} · {h.action}
                {h.circuitNumber ? ` · circuit ${h.circuitNumber}` : ''}
                {h.column ? ` · ${columnName(h.column)}` : ''} · {h.how} · {change(h.oldText, h.newText)}
              </li>
            ))
          ))}
      </ol>
    </section>
  );
}
