import { parseCell } from '../../shared/checker/index.ts';
import type { ReadingKey } from '../../shared/schemas/columns.ts';
import type { Finding } from '../../shared/schemas/findings.ts';

interface BoardLike {
  board: { zdbOhm: number | null };
  circuits: ReadonlyArray<{ id: number; kind: string; cells: Partial<Record<string, { text: string } | undefined>> }>;
  findings: readonly Finding[];
}

/**
 * Readings for every cell the checker still marks as to do, as the tester would finish typing the
 * board from the site sheets. Invented but consistent (the browser test's scenario, not a
 * reference): ring ends r1 = rn = 0.30 Ω and r2 = 0.49 Ω (r2/r1 ≈ 1.63, the 2.5/1.5 mm² ratio of
 * IEC 60228 Table 2), R1+R2 of a ring (r1+r2)/4 (the three-step test), a short radial 0.10 Ω,
 * Zs a little over Zdb + R1+R2 as measured, insulation > 200 MΩ at 500 V (Table 64: ≥ 1.0 MΩ),
 * polarity ✓, an RCD 24 ms at IΔn (≤ 300 ms, BS EN 61008-1) and test buttons ✓.
 */
export function finishBoardReadings(detail: BoardLike): Array<{ circuitId: number; column: ReadingKey; text: string }> {
  const writes: Array<{ circuitId: number; column: ReadingKey; text: string }> = [];
  const zdb = detail.board.zdbOhm ?? 0.1;
  const todo = new Map<number, Set<string>>();
  for (const f of detail.findings) {
    if ((f.severity as string) !== 'todo' || f.circuitId === null) continue;
    const set = todo.get(f.circuitId) ?? new Set<string>();
    for (const c of f.columns) set.add(c);
    todo.set(f.circuitId, set);
  }
  for (const circuit of detail.circuits) {
    const columns = todo.get(circuit.id);
    if (!columns) continue;
    const number = (key: string) => {
      const text = circuit.cells[key]?.text;
      const parsed = text ? parseCell(key as ReadingKey, text) : null;
      return parsed && parsed.kind === 'number' ? parsed.value : null;
    };
    const r1 = number('ringR1') ?? 0.3;
    const r2 = number('ringR2') ?? 0.49;
    const r1PlusR2 = number('r1PlusR2') ?? (circuit.kind === 'ring' ? Math.round(((r1 + r2) / 4) * 100) / 100 : 0.1);
    const values: Record<string, string> = {
      ringR1: '0.30',
      ringRn: '0.30',
      ringR2: '0.49',
      r1PlusR2: r1PlusR2.toFixed(2),
      irTestVoltage: '500',
      irLiveLive: '>200',
      irLiveEarth: '>200',
      polarity: '✓',
      zs: (zdb + r1PlusR2 + 0.02).toFixed(2),
      rcdTimeMs: '24',
      rcdButton: '✓',
      afddButton: '✓',
    };
    for (const column of columns) {
      const text = values[column];
      if (text) writes.push({ circuitId: circuit.id, column: column as ReadingKey, text });
    }
  }
  return writes;
}
