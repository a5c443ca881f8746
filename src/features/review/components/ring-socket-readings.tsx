import type { RingReadings } from '../../../../shared/schemas/ring-sockets.ts';

interface RingSocketReadingsProps {
  boardReference: string;
  rings: readonly RingReadings[];
}

/**
 * A board's rings with socket-by-socket readings, read-only: for each ring the L-N and L-cpc
 * reading at every socket in ring order, the sockets the diagnosis points at marked in words, and
 * the diagnosis itself. Nothing when no ring on the board has socket readings.
 */
export function RingSocketReadings({ boardReference, rings }: RingSocketReadingsProps) {
  if (rings.length === 0) return null;
  return (
    <section aria-label={`Ring socket readings on board ${boardReference}`} className="space-y-3 border-t border-line pt-2">
      {rings.map((ring) => {
        const suspects = new Set(ring.diagnosis?.suspects ?? []);
        const title = `Ring ${ring.circuitNumber}${ring.description ? ` (${ring.description})` : ''}: readings at each socket`;
        return (
          <div key={ring.circuitId} className="space-y-1">
            <h4 className="text-sm font-semibold">{title}</h4>
            <table aria-label={title} className="border-collapse text-sm">
              <thead>
                <tr className="border-b border-line-strong text-left">
                  <th scope="col" className="px-2 py-0.5 font-medium">
                    Socket
                  </th>
                  <th scope="col" className="px-2 py-0.5 font-medium">
                    Label
                  </th>
                  <th scope="col" className="px-2 py-0.5 font-medium">
                    Position along the ring (0–1)
                  </th>
                  <th scope="col" className="px-2 py-0.5 text-right font-medium">
                    L-N (Ω)
                  </th>
                  <th scope="col" className="px-2 py-0.5 text-right font-medium">
                    L-cpc (Ω)
                  </th>
                  <th scope="col" className="px-2 py-0.5 font-medium">
                    Diagnosis
                  </th>
                </tr>
              </thead>
              <tbody>
                {ring.sockets.map((socket, i) => (
                  <tr key={i} className={`border-b border-line ${suspects.has(i) ? 'bg-danger-soft' : ''}`}>
                    <th scope="row" className="px-2 py-0.5 text-left font-normal tabular-nums">
                      {i + 1}
                    </th>
                    <td className="px-2 py-0.5">{socket.label}</td>
                    <td className="px-2 py-0.5 tabular-nums">{socket.position === null ? '' : socket.position}</td>
                    <td className="px-2 py-0.5 text-right tabular-nums">{socket.lineNeutral}</td>
                    <td className="px-2 py-0.5 text-right tabular-nums">{socket.lineCpc}</td>
                    <td className="px-2 py-0.5">{suspects.has(i) ? 'points here' : ''}</td>
                  </tr>
                ))}
              </tbody>
            </table>
            <p className="text-sm">
              {ring.diagnosis
                ? `Diagnosis: ${ring.diagnosis.verdictText}. ${ring.diagnosis.message}`
                : 'No diagnosis: the ring’s end-to-end readings r1 and r2 are not both recorded.'}
            </p>
          </div>
        );
      })}
      <p className="text-xs text-muted">The diagnosis compares the L-cpc readings with what a sound ring reads (common practice); it shows where to look, not a certainty.</p>
    </section>
  );
}
