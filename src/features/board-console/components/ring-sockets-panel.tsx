import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState, type KeyboardEvent } from 'react';
import { diagnoseRingSockets, socketOhms, type RingProfile } from '../../../../shared/checker/index.ts';
import type { Circuit } from '../../../../shared/schemas/boards.ts';
import { ringSocketsResponseSchema, type RingSocket } from '../../../../shared/schemas/ring-sockets.ts';
import { ApiError, apiGet, apiRequest } from '../../../lib/api-client.ts';
import { boardKeys } from '../api/board-keys.ts';

const blankSocket = (): RingSocket => ({ label: '', position: null, lineNeutral: '', lineCpc: '' });

const ohms = socketOhms;

/** The ring's diagnosis from its end-to-end readings and the L-cpc readings typed; null when r1 or r2 is missing. */
export function diagnose(circuit: Circuit, sockets: readonly RingSocket[]): RingProfile | null {
  return diagnoseRingSockets(circuit.cells, sockets);
}

/**
 * The profile as a plain SVG: measured L-cpc at each socket (dots and a line) against what a sound
 * ring reads there (dashed) and the band a sound ring can read anywhere. Plain SVG, not a charting
 * library: a dozen points and two lines need no axes engine, and it adds nothing to the bundle.
 */
export function RingPlot({ sockets, profile }: { sockets: readonly RingSocket[]; profile: RingProfile | null }) {
  const width = 320;
  const height = 120;
  const pad = 24;
  const measured = sockets.map((s) => ohms(s.lineCpc));
  const values = [...measured.filter((v): v is number => v !== null), ...(profile?.expected ?? []), profile?.soundRange?.low ?? 0, profile?.soundRange?.high ?? 0].filter((v) => v > 0);
  const top = Math.max(0.1, ...values) * 1.15;
  const n = Math.max(1, sockets.length);
  const x = (i: number) => pad + ((i + 1) / (n + 1)) * (width - 2 * pad);
  const y = (v: number) => height - pad / 2 - (v / top) * (height - pad);
  const points = measured.map((v, i) => (v === null ? null : `${x(i)},${y(v)}`)).filter(Boolean);
  return (
    <svg role="img" aria-label={`L-cpc readings at ${sockets.length} sockets against the sound ring's profile`} width={width} height={height} className="shrink-0 rounded border border-line bg-surface">
      {profile?.soundRange && (
        <rect x={pad} width={width - 2 * pad} y={y(profile.soundRange.high)} height={Math.max(1, y(profile.soundRange.low) - y(profile.soundRange.high))} className="fill-ok-soft" />
      )}
      {profile && profile.expected.length > 0 && (
        <polyline points={profile.expected.map((v, i) => `${x(i)},${y(v)}`).join(' ')} fill="none" strokeDasharray="4 3" className="stroke-muted" strokeWidth={1.5} />
      )}
      {points.length > 1 && <polyline points={points.join(' ')} fill="none" className="stroke-accent" strokeWidth={1.5} />}
      {measured.map((v, i) => (v === null ? null : <circle key={i} cx={x(i)} cy={y(v)} r={3} className="fill-accent" />))}
      <text x={4} y={12} className="fill-muted text-[10px]">
        {top.toFixed(2)} Ω
      </text>
      <text x={4} y={height - 4} className="fill-muted text-[10px]">
        0
      </text>
    </svg>
  );
}

export interface RingSocketsPanelProps {
  boardId: number;
  circuit: Circuit;
  locked: boolean;
  /** Puts the value into the circuit's R1+R2 (through the grid, so it is saved and can be undone). */
  onRecord: (text: string) => void;
  onClose: (message?: string) => void;
}

/**
 * A ring's socket-by-socket readings: typed in ring order (label and position optional), the plot,
 * the checker's diagnosis in words, and the highest L-cpc offered as R1+R2 with Alt+Enter. Enter
 * moves down a column (a new socket after the last); the list is saved when the panel closes (Esc)
 * and before R1+R2 is recorded, with the version it was loaded at.
 */
export function RingSocketsPanel({ boardId, circuit, locked, onRecord, onClose }: RingSocketsPanelProps) {
  const queryClient = useQueryClient();
  const key = [...boardKeys.all, 'ring-sockets', boardId, circuit.id] as const;
  const loaded = useQuery({
    queryKey: key,
    queryFn: ({ signal }) => apiGet(`/api/boards/${boardId}/circuits/${circuit.id}/ring-sockets`, ringSocketsResponseSchema, { signal }),
  });
  const [sockets, setSockets] = useState<RingSocket[] | null>(null);
  const [message, setMessage] = useState('');
  const tableRef = useRef<HTMLTableElement>(null);
  useEffect(() => {
    if (loaded.data && sockets === null) setSockets(loaded.data.sockets.length > 0 ? loaded.data.sockets : [blankSocket()]);
  }, [loaded.data, sockets]);

  const rows = sockets ?? [];
  const filled = rows.filter((s) => s.lineCpc.trim() !== '' || s.lineNeutral.trim() !== '' || s.label.trim() !== '');
  const profile = diagnose(circuit, filled);

  const save = async (): Promise<boolean> => {
    if (locked || !loaded.data) return true;
    const same = JSON.stringify(filled) === JSON.stringify(loaded.data.sockets);
    if (same) return true;
    try {
      const answer = await apiRequest('PUT', `/api/boards/${boardId}/circuits/${circuit.id}/ring-sockets`, ringSocketsResponseSchema, { version: loaded.data.version, sockets: filled });
      queryClient.setQueryData(key, answer);
      return true;
    } catch (error) {
      setMessage(error instanceof ApiError || error instanceof Error ? `Not saved — ${error.message}` : 'Not saved.');
      if (error instanceof ApiError && error.status === 409) void loaded.refetch();
      return false;
    }
  };

  const close = async () => {
    if (await save()) onClose(filled.length > 0 ? `Socket readings of circuit ${circuit.number} saved (${filled.length}).` : undefined);
  };

  const record = async () => {
    if (!profile || profile.recordValue === null) {
      setMessage('Type r1 and r2 (end to end) in the grid and at least one L-cpc reading first.');
      return;
    }
    if (!(await save())) return;
    onRecord(profile.recordValue.toFixed(2));
  };

  const set = (index: number, field: keyof RingSocket, value: string) =>
    setSockets((current) => {
      const next = [...(current ?? [])];
      const socket = { ...next[index]! };
      if (field === 'position') {
        const t = value.trim().replace(/%$/, '');
        const n = t === '' ? null : Number(t) / (value.trim().endsWith('%') ? 100 : 1);
        socket.position = n !== null && Number.isFinite(n) && n >= 0 && n <= 1 ? n : null;
      } else socket[field] = value;
      next[index] = socket;
      return next;
    });

  const onKeyDown = (event: KeyboardEvent<HTMLElement>) => {
    event.stopPropagation();
    if (event.key === 'Escape') {
      event.preventDefault();
      void close();
    } else if (event.key === 'Enter' && event.altKey) {
      event.preventDefault();
      void record();
    } else if (event.key === 'Enter' && event.target instanceof HTMLInputElement) {
      event.preventDefault();
      const input = event.target;
      const row = Number(input.dataset.row);
      const field = input.dataset.field;
      if (row === rows.length - 1) setSockets((current) => [...(current ?? []), blankSocket()]);
      setTimeout(() => tableRef.current?.querySelector<HTMLInputElement>(`input[data-row="${row + 1}"][data-field="${field}"]`)?.focus(), 0);
    }
  };

  return (
    <section aria-label={`Socket readings of ring ${circuit.number}`} onKeyDown={onKeyDown} className="flex max-h-80 shrink-0 gap-4 border-b border-line bg-paper px-3 py-2 text-sm">
      <div className="min-h-0 overflow-auto">
        <table ref={tableRef} className="font-mono text-[13px]">
          <thead>
            <tr className="text-left text-xs text-muted">
              <th className="pr-2 font-medium">Socket</th>
              <th className="pr-2 font-medium">Label</th>
              <th className="pr-2 font-medium">Position (0–1)</th>
              <th className="pr-2 font-medium">L-N (Ω)</th>
              <th className="pr-2 font-medium">L-cpc (Ω)</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((socket, i) => (
              <tr key={i} className={profile?.suspects.includes(i) ? 'bg-danger-soft' : ''}>
                <td className="pr-2">{i + 1}</td>
                {(['label', 'position', 'lineNeutral', 'lineCpc'] as const).map((field) => (
                  <td key={field} className="pr-2">
                    <input
                      aria-label={`${field === 'label' ? 'Label' : field === 'position' ? 'Position' : field === 'lineNeutral' ? 'L-N' : 'L-cpc'} of socket ${i + 1}`}
                      data-row={i}
                      data-field={field}
                      autoFocus={i === 0 && field === 'lineCpc'}
                      readOnly={locked}
                      defaultValue={field === 'position' ? (socket.position === null ? '' : String(socket.position)) : socket[field]}
                      onChange={(e) => set(i, field, e.target.value)}
                      className={`${field === 'label' ? 'w-24' : 'w-16'} rounded border border-line-strong px-1 py-0.5`}
                    />
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="flex min-w-0 flex-col gap-1">
        <RingPlot sockets={filled} profile={profile} />
        <p role="status" aria-live="polite" className="max-w-md">
          {profile ? profile.message : 'Type r1 and r2 in the grid, then the L-cpc reading at each socket in ring order.'}
        </p>
        {profile?.recordValue !== null && profile?.recordValue !== undefined && (
          <p className="text-xs">
            Highest L-cpc {profile.recordValue.toFixed(2)} Ω: Alt+Enter records it as R1+R2 of circuit {circuit.number}.
          </p>
        )}
        <p className="text-xs text-muted">Enter: next socket · Esc: save and close · diagnosis from the three-step ring test (common practice), not a certainty</p>
        {message && (
          <p role="alert" className="text-danger">
            {message}
          </p>
        )}
      </div>
    </section>
  );
}
