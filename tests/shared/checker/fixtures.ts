/**
 * Small boards for the checker's tests. The defaults are a clean board: a radial and a ring whose
 * readings agree with each other and with the limits, so each test changes one thing and expects one
 * finding.
 */

import type { CheckCircuit, CheckInput } from '../../../shared/schemas/check.ts';
import type { ReadingKey } from '../../../shared/schemas/columns.ts';

export type CellsSpec = Partial<Record<ReadingKey, string | { text: string; reason: string | null }>>;

export type CircuitSpec = Partial<Omit<CheckCircuit, 'cells'>> & { cells?: CellsSpec };

function toCells(spec: CellsSpec): CheckCircuit['cells'] {
  const cells: CheckCircuit['cells'] = {};
  for (const [key, value] of Object.entries(spec) as Array<[ReadingKey, CellsSpec[ReadingKey]]>) {
    if (value === undefined) continue;
    cells[key] = typeof value === 'string' ? { text: value, reason: null } : value;
  }
  return cells;
}

/**
 * A clean lighting/radial circuit on a B20 with an RCD: R1+R2 0.30 Ω (about 15 m of 2.5/1.5 at
 * 19.51 mΩ/m, IEC 60228), Zs 0.62 Ω (a little under Zdb 0.35 + 0.30, as parallel paths make it).
 */
export const cleanRadialCells: CellsSpec = {
  r1PlusR2: '0.30',
  irTestVoltage: '500',
  irLiveLive: '>200',
  irLiveEarth: '>200',
  polarity: '✓',
  zs: '0.62',
  rcdTimeMs: '24',
  rcdButton: '✓',
};

/**
 * A clean ring on a B32: r1 0.52, rn 0.53, r2 0.85 Ω (r2/r1 = 1.63, IEC 60228 2.5/1.5), R1+R2 0.35
 * ≈ (0.52+0.85)/4 = 0.3425 Ω, Zs 0.68 Ω ≈ 0.35 + 0.35.
 */
export const cleanRingCells: CellsSpec = {
  ringR1: '0.52',
  ringRn: '0.53',
  ringR2: '0.85',
  r1PlusR2: '0.35',
  irTestVoltage: '500',
  irLiveLive: '>200',
  irLiveEarth: '>200',
  polarity: '✓',
  zs: '0.68',
  rcdTimeMs: '22',
  rcdButton: '✓',
};

export function radial(spec: CircuitSpec = {}): CheckCircuit {
  const { cells, ...fields } = spec;
  return {
    id: 1,
    number: String(fields.id ?? 1),
    phase: null,
    description: 'Lighting',
    kind: 'radial',
    wiringType: 'A',
    referenceMethod: 'C',
    points: 8,
    liveCsaMm2: 2.5,
    cpcCsaMm2: 1.5,
    maxDisconnectionS: 0.4,
    deviceStandard: '60898',
    deviceType: 'B',
    ratingA: 20,
    breakingKa: 6,
    rcdType: 'A',
    rcdRatedResidualMa: 30,
    afdd: null,
    remarks: '',
    spurRingId: null,
    spurOriginPoint: null,
    spurLengthM: null,
    maxZsByHandOhm: null,
    ...fields,
    cells: toCells(cells ?? cleanRadialCells),
  };
}

export function ring(spec: CircuitSpec = {}): CheckCircuit {
  return radial({ description: 'Sockets', kind: 'ring', ratingA: 32, points: 10, cells: cleanRingCells, ...spec });
}

export function board(circuits: CheckCircuit[], overrides: { board?: Partial<CheckInput['board']>; site?: Partial<CheckInput['site']> } = {}): CheckInput {
  return {
    board: { phases: 1, zdbOhm: 0.35, ipfKa: 1.6, polarityConfirmed: true, ...overrides.board },
    site: { earthing: 'TN-C-S', nominalVoltageV: 230, ...overrides.site },
    circuits,
  };
}
