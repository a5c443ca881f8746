import type { Finding, Severity } from '../schemas/findings.ts';
import { inspectionItemsById } from '../schemas/inspection-items.ts';
import { overallAssessment, type JobSectionData, type Observation } from '../schemas/job-record.ts';
import type { CheckInput } from '../schemas/check.ts';
import { formatFixed } from './decimal.ts';
import {
  ELECTRODE_STABILITY_SOURCE,
  ELECTRODE_STABLE_MAX_OHM,
  mainBondingMinimum,
  REG_411_5_3_SOURCE,
  TT_TOUCH_VOLTAGE_V,
} from './earthing-and-bonding.ts';
import { ohmReading, ohmText } from './format.ts';

/** One board of a job as the job rules need it: its details, its circuits and its own findings. */
export interface JobCheckBoard {
  id: number;
  reference: string;
  zdbOhm: number | null;
  ipfKa: number | null;
  circuits: ReadonlyArray<CheckInput['circuits'][number] & { number: string }>;
  /** The board checker's findings for this board (`checkBoard`), e.g. to find Zs over its maximum. */
  findings: readonly Finding[];
}

/** The checker's input for a whole job: its kind, its record's sections and its boards. */
export interface JobCheckInput {
  kind: 'EIC' | 'EICR';
  record: JobSectionData;
  boards: readonly JobCheckBoard[];
}

type JobRule = (input: JobCheckInput) => Finding[];

/** Every code the job rules emit, with its severity. */
export const jobFindingCodes = {
  'inspection-coded-without-observation': 'error',
  'zs-over-max-without-observation': 'error',
  'zdb-below-ze': 'warning',
  'zdb-far-below-ze-tt': 'note',
  'board-ipf-above-origin': 'warning',
  'electrode-ra-times-idn-over-50v': 'error',
  'electrode-ra-may-be-unstable': 'warning',
  'observation-without-code': 'error',
  'summary-says-satisfactory': 'warning',
  /** Error on an EIC (new work must comply); a warning on an EICR, where the inspector codes it. */
  'main-bonding-csa-too-small': 'error',
  'limitation-without-reason': 'error',
  'agreed-limitation-without-whom': 'warning',
} as const satisfies Record<string, Severity>;
export type JobFindingCode = keyof typeof jobFindingCodes;

const EPS = 1e-9;

const jobFinding = (
  f: Omit<Finding, 'circuitId' | 'columns' | 'severity' | 'code'> & { code: JobFindingCode; severity?: Severity } & Partial<Pick<Finding, 'circuitId' | 'columns'>>,
): Finding => ({
  circuitId: null,
  columns: [],
  ...f,
  severity: f.severity ?? jobFindingCodes[f.code],
});

function observationList(record: JobSectionData): Array<Observation & { id: string }> {
  const list: Array<Observation & { id: string }> = [];
  for (const [id, o] of Object.entries(record.observations)) if (o) list.push({ ...o, id });
  return list.sort((a, b) => a.number - b.number);
}

/** Whether the installation is TT: as recorded, or (earthing not yet recorded) earthed by an electrode. */
function isTT(record: JobSectionData): boolean {
  return record.supply.earthing === 'TT' || (record.supply.earthing === null && record.origin.meansOfEarthing === 'electrode');
}

function listText(items: readonly string[], max = 6): string {
  if (items.length <= max) return items.join(', ');
  return `${items.slice(0, max).join(', ')} and ${items.length - max} more`;
}

/** A loop impedance as read: "0.35" below 10 Ω, "95" or "95.5" above (TT values). */
function ohmShown(value: number): string {
  return value >= 10 ? String(value) : ohmReading(value);
}

function kiloampText(value: number): string {
  return formatFixed(value, value >= 10 ? 1 : 2);
}

/** An inspection item coded C1, C2 or C3 needs an observation that says what was found. */
const codedItemWithoutObservation: JobRule = ({ kind, record }) => {
  if (kind !== 'EICR') return [];
  const itemsWithObservation = new Set(
    Object.values(record.observations).flatMap((o) => (o && o.inspectionItem ? [o.inspectionItem] : [])),
  );
  const findings: Finding[] = [];
  for (const [itemId, outcome] of Object.entries(record.inspections)) {
    if ((outcome === 'C1' || outcome === 'C2' || outcome === 'C3') && !itemsWithObservation.has(itemId)) {
      const item = inspectionItemsById.get(itemId);
      findings.push(
        jobFinding({
          code: 'inspection-coded-without-observation',
          message: `Inspection item ${itemId}${item ? ` (${item.text})` : ''} is marked ${outcome} but no observation says what was found.`,
          limit: 'an observation for every item coded C1, C2 or C3',
          source: 'BS 7671:2018 Appendix 6 (condition report: each code is backed by an observation) — common practice',
          section: 'inspections',
          field: itemId,
        }),
      );
    }
  }
  return findings;
};

/**
 * EICR: a measured Zs over its maximum (the board checker's `zs-over-max`) means the circuit's
 * device cannot be relied on to disconnect in time; the report must say so in a C1 or C2
 * observation tied to that board and circuit.
 */
const zsOverMaxWithoutObservation: JobRule = ({ kind, record, boards }) => {
  if (kind !== 'EICR') return [];
  const observations = observationList(record);
  const out: Finding[] = [];
  for (const board of boards) {
    for (const f of board.findings) {
      if (f.code !== 'zs-over-max' || f.circuitId === null) continue;
      const tied = observations.filter((o) => o.boardId === board.id && o.circuitId === f.circuitId);
      if (tied.some((o) => o.code === 'C1' || o.code === 'C2')) continue;
      const circuit = board.circuits.find((c) => c.id === f.circuitId);
      const name = `circuit ${circuit ? circuit.number : f.circuitId} on board ${board.reference}`;
      const others = tied.length > 0 ? ` (${tied.map((o) => `observation ${o.number} is tied to it coded ${o.code ?? 'nothing yet'}`).join('; ')})` : '';
      out.push(
        jobFinding({
          code: 'zs-over-max-without-observation',
          boardId: board.id,
          circuitId: f.circuitId,
          columns: ['zs'],
          message: `Zs on ${name} is over its maximum (${f.limit ?? 'see the board'}) but no C1 or C2 observation is tied to that circuit${others}: raise one, or correct the reading.`,
          limit: 'a C1 or C2 observation tied to the board and circuit',
          source: `maximum from ${f.source ?? 'the board checker'}; a circuit whose device cannot disconnect in time is potentially dangerous (C2) or worse — common practice`,
          section: 'observations',
        }),
      );
    }
  }
  return out;
};

/** Zdb against Ze: the loop to any board is the origin's loop plus the cables to it. */
export const ZDB_BELOW_ZE_ALLOWANCE_OHM = 0.05;
export const ZDB_BELOW_ZE_ALLOWANCE_FRACTION = 0.1;
export const ZDB_BELOW_ZE_SOURCE =
  'Zdb = Ze + the distribution cables’ R1+R2, so a board reads at least Ze — common practice; allowance the larger of 0.05 Ω and 10 % for parallel earth paths and the meter (the checker’s choice)';
export const ZDB_BELOW_ZE_TT_SOURCE =
  'TT: the loop runs through the ground and Ze is mostly the electrode; parallel paths through bonded metalwork can lower Zdb, so only a board below half of Ze is noted — common practice; the half is the checker’s choice';

const zdbBelowZe: JobRule = ({ record, boards }) => {
  const ze = record.supply.zeOhm;
  if (ze === null) return [];
  const tt = isTT(record);
  const out: Finding[] = [];
  for (const board of boards) {
    const zdb = board.zdbOhm;
    if (zdb === null) continue;
    if (tt) {
      const floor = ze / 2;
      if (zdb < floor - EPS) {
        out.push(
          jobFinding({
            code: 'zdb-far-below-ze-tt',
            boardId: board.id,
            message: `Zdb at board ${board.reference} (${ohmShown(zdb)} Ω) is far below Ze at the origin (${ohmShown(ze)} Ω) on a TT installation: is the board’s earth reaching another earth (a metallic service pipe, a neighbouring supply’s earth), or was a value typed on the wrong board?`,
            limit: `≥ ${ohmText(floor)} Ω (half of Ze)`,
            source: ZDB_BELOW_ZE_TT_SOURCE,
            section: 'supply',
            field: 'zeOhm',
          }),
        );
      }
      continue;
    }
    const allowance = Math.max(ZDB_BELOW_ZE_ALLOWANCE_OHM, ZDB_BELOW_ZE_ALLOWANCE_FRACTION * ze);
    if (zdb < ze - allowance - EPS) {
      out.push(
        jobFinding({
          code: 'zdb-below-ze',
          boardId: board.id,
          message: `Zdb at board ${board.reference} (${ohmShown(zdb)} Ω) is below Ze at the origin (${ohmShown(ze)} Ω): a board fed from the origin reads at least Ze. Parallel earth paths through the bonding can lower it a little; this much suggests a slip, a reading on another board, or Ze measured wrongly.`,
          limit: `≥ ${ohmText(ze - allowance)} Ω (Ze ${ohmShown(ze)} Ω less ${formatFixed(allowance, 2)} Ω)`,
          source: ZDB_BELOW_ZE_SOURCE,
          section: 'supply',
          field: 'zeOhm',
        }),
      );
    }
  }
  return out;
};

/** Ipf at a board against Ipf at the origin: fault current only falls along the cables. */
export const IPF_ABOVE_ORIGIN_ALLOWANCE_KA = 0.05;
export const IPF_ABOVE_ORIGIN_ALLOWANCE_FRACTION = 0.1;
export const IPF_ABOVE_ORIGIN_SOURCE =
  'the fault current at a board is limited by the origin’s impedance plus the cables to it, so it is at most Ipf at the origin — common practice; allowance the larger of 0.05 kA and 10 % for the meter (the checker’s choice)';

const boardIpfAboveOrigin: JobRule = ({ record, boards }) => {
  const origin = record.supply.ipfKa;
  if (origin === null) return [];
  const allowance = Math.max(IPF_ABOVE_ORIGIN_ALLOWANCE_KA, IPF_ABOVE_ORIGIN_ALLOWANCE_FRACTION * origin);
  const out: Finding[] = [];
  for (const board of boards) {
    const ipf = board.ipfKa;
    if (ipf === null || ipf <= origin + allowance + EPS) continue;
    out.push(
      jobFinding({
        code: 'board-ipf-above-origin',
        boardId: board.id,
        message: `Ipf at board ${board.reference} (${kiloampText(ipf)} kA) is above Ipf at the origin (${kiloampText(origin)} kA): one of them is a slip, or they were recorded on different bases (record the greater of the short-circuit and earth fault current, both the same way).`,
        limit: `≤ ${kiloampText(origin + allowance)} kA (origin ${kiloampText(origin)} kA + ${kiloampText(allowance)} kA)`,
        source: IPF_ABOVE_ORIGIN_SOURCE,
        section: 'supply',
        field: 'ipfKa',
      }),
    );
  }
  return out;
};

/**
 * TT: every RCD giving fault protection must hold the touch voltage to 50 V with the electrode as
 * it is (RA × IΔn ≤ 50 V); and an electrode above 200 Ω may not stay where it was measured.
 */
const ttElectrode: JobRule = ({ record, boards }) => {
  const ra = record.origin.electrodeRaOhm;
  if (ra === null || !isTT(record)) return [];
  const out: Finding[] = [];
  // Each rated residual current, and where RCDs of that rating are.
  const byRating = new Map<number, string[]>();
  const add = (ma: number, where: string) => {
    const list = byRating.get(ma);
    if (list) list.push(where);
    else byRating.set(ma, [where]);
  };
  if (record.origin.mainSwitchRcdMa !== null) add(record.origin.mainSwitchRcdMa, 'the main switch');
  for (const board of boards) {
    for (const c of board.circuits) {
      if (c.rcdType !== null && c.rcdRatedResidualMa !== null) add(c.rcdRatedResidualMa, `circuit ${c.number} on ${board.reference}`);
    }
  }
  const failing = [...byRating.entries()].filter(([ma]) => (ra * ma) / 1000 > TT_TOUCH_VOLTAGE_V + EPS).sort((a, b) => b[0] - a[0]);
  if (failing.length > 0) {
    const parts = failing.map(([ma, where]) => `× ${ma} mA = ${formatFixed((ra * ma) / 1000, 0)} V (${listText(where)})`);
    const worst = failing[0]![0];
    out.push(
      jobFinding({
        code: 'electrode-ra-times-idn-over-50v',
        message: `RA ${ohmText(ra)} Ω ${parts.join('; ')}: above 50 V, so with this electrode those RCDs cannot hold a fault’s touch voltage to a safe level. Improve the electrode, or use RCDs of lower IΔn.`,
        limit: `RA × IΔn ≤ ${TT_TOUCH_VOLTAGE_V} V (RA ≤ ${ohmText((TT_TOUCH_VOLTAGE_V * 1000) / worst)} Ω for ${worst} mA)`,
        source: REG_411_5_3_SOURCE,
        section: 'origin',
        field: 'electrodeRaOhm',
      }),
    );
  }
  if (ra > ELECTRODE_STABLE_MAX_OHM + EPS) {
    out.push(
      jobFinding({
        code: 'electrode-ra-may-be-unstable',
        message: `RA ${ohmText(ra)} Ω is above ${ELECTRODE_STABLE_MAX_OHM} Ω: an electrode this high may not stay stable as the ground dries or freezes.`,
        limit: `≤ ${ELECTRODE_STABLE_MAX_OHM} Ω`,
        source: ELECTRODE_STABILITY_SOURCE,
        section: 'origin',
        field: 'electrodeRaOhm',
      }),
    );
  }
  return out;
};

/**
 * EICR: the overall assessment is derived from the observations' codes (`overallAssessment`), so
 * "satisfactory while a C1, C2 or FI stands" cannot be typed. What can still go wrong: an
 * observation with no code (the assessment cannot be known), and the summary's own words calling
 * the installation satisfactory while the codes make it unsatisfactory.
 */
const assessmentHonest: JobRule = ({ kind, record }) => {
  if (kind !== 'EICR') return [];
  const out: Finding[] = [];
  for (const o of observationList(record)) {
    if (o.code !== null) continue;
    out.push(
      jobFinding({
        code: 'observation-without-code',
        message: `Observation ${o.number} has no code: give it C1, C2, C3 or FI; until then the overall assessment cannot be known.`,
        limit: 'a code on every observation',
        source: 'BS 7671:2018 Appendix 6 (condition report: each observation is classified) — common practice',
        section: 'observations',
        field: o.id,
      }),
    );
  }
  if (overallAssessment(record.observations).assessment === 'unsatisfactory' && claimsSatisfactory(record.summary.generalCondition)) {
    const serious = observationList(record)
      .filter((o) => o.code === 'C1' || o.code === 'C2' || o.code === 'FI')
      .map((o) => `observation ${o.number} (${o.code})`);
    out.push(
      jobFinding({
        code: 'summary-says-satisfactory',
        message: `The general condition calls the installation satisfactory, but ${listText(serious)} make${serious.length === 1 ? 's' : ''} the report unsatisfactory: reword the general condition.`,
        limit: 'the summary’s words agree with the overall assessment',
        source: 'any C1, C2 or FI makes a condition report unsatisfactory (BS 7671:2018 Appendix 6, notes on the condition report) — common practice',
        section: 'summary',
        field: 'generalCondition',
      }),
    );
  }
  return out;
};

const NEGATION_BEFORE = /(?:\bnot|n[’']t|\bnever|\bless than|\bfar from|\bhardly)\s+(?:[a-z]+\s+)?$/;

/**
 * Whether a text calls something "satisfactory" (not "unsatisfactory", "not satisfactory" or
 * "isn't entirely satisfactory"). Plain word matching, nothing cleverer: it flags the obvious case.
 */
export function claimsSatisfactory(text: string): boolean {
  const re = /\bsatisfactory\b/gi;
  for (let m = re.exec(text); m !== null; m = re.exec(text)) {
    const before = text.slice(Math.max(0, m.index - 30), m.index).toLowerCase();
    if (!NEGATION_BEFORE.test(before)) return true;
  }
  return false;
}

/** Main protective bonding csa against the earthing conductor and (PME) the supply neutral. */
const mainBondingSize: JobRule = ({ kind, record }) => {
  const { bondingConductorCsaMm2: csa, bondingConductorMaterial: material, earthingConductorCsaMm2 } = record.origin;
  // The published sizes are copper; another material is compared by its copper equivalent, by hand.
  if (csa === null || (material !== null && material !== 'copper')) return [];
  const minimum = mainBondingMinimum({ earthing: record.supply.earthing, earthingConductorCsaMm2, supplyNeutralCsaMm2: record.supply.supplyNeutralCsaMm2 });
  if (csa >= minimum.minMm2 - EPS) return [];
  return [
    jobFinding({
      code: 'main-bonding-csa-too-small',
      severity: kind === 'EIC' ? 'error' : 'warning',
      message: `Main protective bonding ${csa} mm²${material === null ? ' (copper assumed)' : ''} is smaller than the ${formatFixed(minimum.minMm2, Number.isInteger(minimum.minMm2) ? 0 : 1)} mm² required: ${minimum.basis}.${kind === 'EICR' ? ' Raise an observation.' : ''}`,
      limit: `≥ ${formatFixed(minimum.minMm2, Number.isInteger(minimum.minMm2) ? 0 : 1)} mm² copper`,
      source: minimum.source,
      section: 'origin',
      field: 'bondingConductorCsaMm2',
    }),
  ];
};

/** Every limitation gives its reason; agreed ones say with whom they were agreed. */
const limitationsExplained: JobRule = ({ record }) => {
  const out: Finding[] = [];
  const limitations = record.extent.limitations;
  limitations.forEach((l, index) => {
    if (l.reason.trim() !== '') return;
    out.push(
      jobFinding({
        code: 'limitation-without-reason',
        message: `Limitation ${index + 1}${l.what.trim() ? ` (${l.what.trim()})` : ''} gives no reason: say why it could not be inspected or tested.`,
        limit: 'a reason for every limitation',
        source: 'BS 7671:2018 Appendix 6 (extent and limitations, each with its reason) — common practice',
        section: 'extent',
        field: `limitations.${index}`,
      }),
    );
  });
  if (limitations.some((l) => l.kind === 'agreed') && record.extent.agreedWith.trim() === '') {
    out.push(
      jobFinding({
        code: 'agreed-limitation-without-whom',
        message: 'Limitations were agreed, but not with whom: name the person (and their role) who agreed them.',
        limit: 'the person who agreed the limitations',
        source: 'BS 7671:2018 Appendix 6 (agreed limitations are recorded with whom they were agreed) — common practice',
        section: 'extent',
        field: 'agreedWith',
      }),
    );
  }
  return out;
};

/** The job rules, in order. Each returns findings with their limit and source. */
export const jobRules: readonly JobRule[] = [
  codedItemWithoutObservation,
  zsOverMaxWithoutObservation,
  zdbBelowZe,
  boardIpfAboveOrigin,
  ttElectrode,
  assessmentHonest,
  mainBondingSize,
  limitationsExplained,
];

/**
 * Every finding about a job as a whole (its record and what ties the record to its boards),
 * sorted by section, field, board and code. Board findings stay with `checkBoard`.
 */
export function checkJob(input: JobCheckInput): Finding[] {
  const findings = jobRules.flatMap((rule) => rule(input));
  return findings.sort(
    (a, b) =>
      (a.section ?? '').localeCompare(b.section ?? '') ||
      (a.field ?? '').localeCompare(b.field ?? '', undefined, { numeric: true }) ||
      (a.boardId ?? 0) - (b.boardId ?? 0) ||
      (a.circuitId ?? 0) - (b.circuitId ?? 0) ||
      a.code.localeCompare(b.code),
  );
}
