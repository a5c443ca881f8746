import { diagnoseRingSockets, ringVerdictText } from '../../shared/checker/index.ts';
import type { Circuit } from '../../shared/schemas/boards.ts';
import { ringSocketsSchema, type RingReadings } from '../../shared/schemas/ring-sockets.ts';
import type { DB } from './database.ts';

/**
 * The socket readings of every ring among `circuits` that has any, in the circuits' order, each with
 * the checker's diagnosis in words. A stored list that no longer parses is left out rather than
 * shown half-read.
 */
export async function loadRingReadings(db: DB, circuits: readonly Circuit[]): Promise<RingReadings[]> {
  const rings = circuits.filter((c) => c.kind === 'ring');
  if (rings.length === 0) return [];
  const rows = await db.selectFrom('ring_sockets').select(['circuit_id', 'data']).where('circuit_id', 'in', rings.map((c) => c.id)).execute();
  const stored = new Map(rows.map((r) => [r.circuit_id, r.data]));
  const readings: RingReadings[] = [];
  for (const circuit of rings) {
    const data = stored.get(circuit.id);
    if (data === undefined) continue;
    const parsed = ringSocketsSchema.safeParse(JSON.parse(data));
    if (!parsed.success || parsed.data.length === 0) continue;
    const profile = diagnoseRingSockets(circuit.cells, parsed.data);
    readings.push({
      circuitId: circuit.id,
      circuitNumber: circuit.number,
      description: circuit.description,
      sockets: parsed.data,
      diagnosis: profile && { verdict: profile.verdict, verdictText: ringVerdictText[profile.verdict], message: profile.message, suspects: profile.suspects },
    });
  }
  return readings;
}
