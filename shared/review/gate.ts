/**
 * The completeness gate: why a board cannot be locked yet, and why a job cannot be approved yet.
 *
 * Pure functions over what the server already has (a board's findings, the reviewer's acceptances,
 * the job record): the server answers a refused lock or approval with these reasons (409), and the
 * console, the job screen and the review screen show the same list before anyone tries.
 */
import { columnByKey, type ColumnKey } from '../schemas/columns.ts';
import type { Finding } from '../schemas/findings.ts';
import { inspectionAreas, inspectionItemsById } from '../schemas/inspection-items.ts';
import { overallAssessment, usualIntervalMonths, type JobSectionData, type Observation } from '../schemas/job-record.ts';
import { findingKey } from '../schemas/review.ts';

// ---- findings a reviewer may accept ------------------------------------------------------------

/**
 * Codes that meant "a reading is not recorded yet" before the checker gave those findings a
 * severity of their own (`todo`). Matched by code as well, so the gate reads both.
 */
const missingReadingCodes: ReadonlySet<string> = new Set(['cells-missing', 'rcd-time-missing']);

/** A finding that says a required reading is not recorded yet (not a fault in a value). */
export function isMissingReading(finding: Pick<Finding, 'code' | 'severity'>): boolean {
  if ((finding.severity as string) === 'todo') return true;
  // An RCD time written N/A is a value the tester chose, not a reading still to take.
  return missingReadingCodes.has(finding.code);
}

/**
 * Job findings about a required part of the record, which the gate's own record reasons already
 * name: they are put right in the record, never accepted, and not listed twice.
 */
const requiredPartCodes: ReadonlySet<string> = new Set(['observation-without-code', 'limitation-without-reason', 'agreed-limitation-without-whom']);

/**
 * Job findings that say the summary contradicts the observations: whatever their severity, they
 * stop approval (an overall assessment that contradicts the observations is never issued).
 */
const contradictionCodes: ReadonlySet<string> = new Set(['summary-says-satisfactory']);

/**
 * Whether a reviewer may accept a finding with a reason, or why not. Only error findings about
 * values can be accepted: a reading not yet recorded is taken, and a LIM is given its reason —
 * neither is put right by a reviewer's note (a schedule is never issued with a LIM that has no reason).
 */
export function acceptability(finding: Pick<Finding, 'code' | 'severity'>): true | string {
  if (isMissingReading(finding)) return 'A reading not yet recorded cannot be accepted: record it, or write LIM with its reason.';
  if (finding.code === 'lim-without-reason') return 'A LIM without a reason cannot be accepted: record why the test could not be done.';
  if (requiredPartCodes.has(finding.code)) return 'A required part of the record cannot be accepted: fill it in on the job screen.';
  if (contradictionCodes.has(finding.code)) return 'The summary must agree with the observations: reword it on the job screen.';
  if (finding.severity !== 'error') return `Only error findings need accepting; this one is a ${finding.severity}.`;
  return true;
}

/**
 * The key an acceptance is stored under. Board findings use `findingKey(boardId, finding)` as it
 * is. A job finding names no columns but a section and field (and maybe a board), so those stand
 * in for the columns: two inspection items coded without an observation are two findings.
 */
export function gateFindingKey(boardId: number | null, finding: Finding): string {
  if (boardId !== null) return findingKey(boardId, finding);
  const place = [finding.section ? `section=${finding.section}` : null, finding.field ? `field=${finding.field}` : null, finding.boardId ? `board=${finding.boardId}` : null];
  return findingKey(null, { circuitId: finding.circuitId, code: finding.code, columns: [...finding.columns, ...place.filter((p): p is string => p !== null)] });
}

// ---- boards ------------------------------------------------------------------------------------

export interface BoardGateInput {
  board: { id: number; reference: string };
  /** Circuit numbers by id, to name circuits in words. */
  circuits: ReadonlyArray<{ id: number; number: string }>;
  findings: readonly Finding[];
  /** Keys (`gateFindingKey`) of the findings a reviewer accepted. */
  acceptedKeys: ReadonlySet<string>;
}

const columnLabel = (key: string) => columnByKey[key as ColumnKey]?.label ?? key;

function numberSort(a: string, b: string): number {
  return a.localeCompare(b, undefined, { numeric: true });
}

/**
 * Why this board cannot be locked, in words (empty: it can be). Readings not yet recorded are
 * grouped by column ("Zs not recorded on circuits 3, 5"); every LIM without its reason and every
 * error finding that is neither resolved nor accepted is a reason of its own.
 */
export function boardLockReasons(input: BoardGateInput): string[] {
  const numberOf = new Map(input.circuits.map((c) => [c.id, c.number]));
  const where = (f: Finding) => (f.circuitId === null ? 'Board' : `Circuit ${numberOf.get(f.circuitId) ?? f.circuitId}`);
  const missingByColumn = new Map<string, Set<string>>();
  const limReasons: string[] = [];
  const errorReasons: string[] = [];
  for (const f of input.findings) {
    if (isMissingReading(f)) {
      for (const column of f.columns.length > 0 ? f.columns : ['(a reading)']) {
        const set = missingByColumn.get(column) ?? new Set<string>();
        set.add(f.circuitId === null ? 'the board' : (numberOf.get(f.circuitId) ?? String(f.circuitId)));
        missingByColumn.set(column, set);
      }
    } else if (f.code === 'lim-without-reason') {
      limReasons.push(`${where(f)}: LIM in ${f.columns.map(columnLabel).join(', ')} has no reason recorded.`);
    } else if (f.severity === 'error' && !input.acceptedKeys.has(gateFindingKey(input.board.id, f))) {
      errorReasons.push(`${where(f)}: ${f.message} (an error, neither resolved nor accepted by a reviewer)`);
    }
  }
  const missing = [...missingByColumn.entries()].map(([column, circuits]) => {
    const list = [...circuits].sort(numberSort);
    return `${columnLabel(column)} not recorded on ${list.length === 1 ? 'circuit' : 'circuits'} ${list.join(', ')}.`;
  });
  return [...missing, ...limReasons, ...errorReasons];
}

/** Readings not yet recorded on a board: how many cells, and how many per column. */
export function missingReadingCounts(findings: readonly Finding[]): { total: number; byColumn: Record<string, number> } {
  const byColumn: Record<string, number> = {};
  let total = 0;
  for (const f of findings) {
    if (!isMissingReading(f)) continue;
    for (const column of f.columns) {
      byColumn[column] = (byColumn[column] ?? 0) + 1;
      total++;
    }
  }
  return { total, byColumn };
}

// ---- jobs --------------------------------------------------------------------------------------

export interface JobGateInput {
  kind: 'EIC' | 'EICR';
  record: JobSectionData;
  boards: ReadonlyArray<{ id: number; reference: string; state: 'open' | 'locked' }>;
  /** The checker's job findings (`checkJob`). */
  jobFindings: readonly Finding[];
  /** Keys (`gateFindingKey(null, …)`) of the job findings a reviewer accepted. */
  acceptedKeys: ReadonlySet<string>;
}

const blank = (text: string) => text.trim() === '';
const list = (items: readonly string[]) => (items.length <= 1 ? items.join('') : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`);

/** Supply characteristics every certificate and report states (BS 7671 Appendix 6 model forms ask for each). */
const requiredSupplyFields: ReadonlyArray<[keyof JobSectionData['supply'], string]> = [
  ['earthing', 'the earthing arrangement'],
  ['liveConductors', 'the number and type of live conductors'],
  ['u0V', 'the nominal voltage U0'],
  ['frequencyHz', 'the frequency'],
  ['zeOhm', 'Ze'],
  ['ipfKa', 'Ipf at the origin'],
];

function recordReasons(kind: 'EIC' | 'EICR', record: JobSectionData): string[] {
  const reasons: string[] = [];

  // Supply characteristics.
  const supplyMissing = requiredSupplyFields.filter(([key]) => record.supply[key] === null || record.supply[key] === '').map(([, label]) => label);
  if (supplyMissing.length > 0) reasons.push(`Supply characteristics: ${list(supplyMissing)} not given.`);

  // Extent (EIC: the work covered; EICR: what the inspection covered) and limitations.
  if (kind === 'EIC') {
    if (blank(record.work.description)) reasons.push('The work: its description is not given.');
    if (blank(record.work.extent)) reasons.push('The work: its extent (what this certificate covers) is not given.');
  } else if (blank(record.extent.extentCovered)) {
    reasons.push('Extent and limitations: what the inspection and testing covered is not given.');
  }
  record.extent.limitations.forEach((limitation, index) => {
    const n = index + 1;
    if (blank(limitation.what)) reasons.push(`Limitation ${n}: what was not inspected or tested is not said.`);
    if (blank(limitation.reason)) reasons.push(`Limitation ${n}${blank(limitation.what) ? '' : ` (${limitation.what.trim()})`}: no reason is given.`);
  });
  if (record.extent.limitations.some((l) => l.kind === 'agreed') && blank(record.extent.agreedWith)) {
    reasons.push('Extent and limitations: agreed limitations are listed but not with whom they were agreed.');
  }

  // The declaration's people.
  const d = record.declaration;
  if (kind === 'EIC') {
    if (d.samePersonForAll) {
      if (blank(d.inspector.name)) reasons.push('Declaration: the person responsible for design, construction, and inspection and testing is not named.');
    } else {
      const roles: Array<[keyof typeof d, string]> = [
        ['designer', 'design'],
        ['constructor', 'construction'],
        ['inspector', 'inspection and testing'],
      ];
      for (const [role, words] of roles) {
        const person = d[role];
        if (typeof person === 'object' && blank(person.name)) reasons.push(`Declaration: the person responsible for ${words} is not named.`);
      }
    }
  } else if (blank(d.inspector.name)) {
    reasons.push('Declaration: the inspector is not named.');
  }

  // Schedule of inspections: every item has an outcome.
  const blanks = inspectionAreas.flatMap((area) => area.items.map((item) => item.id)).filter((id) => !record.inspections[id]);
  if (blanks.length > 0) {
    reasons.push(
      `Schedule of inspections: ${blanks.length === 1 ? 'item' : `${blanks.length} items`} ${list(blanks)} left blank (write N/A where an item does not apply).`,
    );
  }
  for (const [id, outcome] of Object.entries(record.inspections)) {
    if (kind === 'EIC' && outcome === 'fail') {
      reasons.push(`Schedule of inspections: item ${id} is not acceptable (✗); new work is put right before it is certified.`);
    }
    if (kind === 'EIC' && (outcome === 'C1' || outcome === 'C2' || outcome === 'C3')) {
      reasons.push(`Schedule of inspections: item ${id} carries the code ${outcome}, which belongs on a condition report; on a certificate it is ✓ or ✗.`);
    }
    if (kind === 'EICR' && outcome === 'fail') {
      reasons.push(`Schedule of inspections: item ${id} is marked ✗; on a condition report give it a code (C1, C2 or C3).`);
    }
  }

  // Observations and the overall assessment (EICR).
  if (kind === 'EICR') {
    const observations = Object.values(record.observations).filter((o): o is Observation => o !== null);
    const uncoded = observations.filter((o) => o.code === null).sort((a, b) => a.number - b.number);
    if (uncoded.length > 0) {
      reasons.push(`Observations: ${list(uncoded.map((o) => String(o.number)))} ${uncoded.length === 1 ? 'has' : 'have'} no code (C1, C2, C3 or FI).`);
    }
    const assessment = overallAssessment(record.observations);
    if (assessment.assessment === 'satisfactory') {
      const serious = Object.entries(record.inspections).filter(([, outcome]) => outcome === 'C1' || outcome === 'C2');
      for (const [id, outcome] of serious) {
        const item = inspectionItemsById.get(id);
        reasons.push(
          `The overall assessment reads satisfactory, but inspection item ${id}${item ? ` (${item.text})` : ''} is coded ${outcome}: raise the observation with its code, which makes the report unsatisfactory.`,
        );
      }
    }
    if (blank(record.summary.generalCondition)) reasons.push('Summary: the general condition of the installation is not described.');
  }

  // The recommended interval to the next (EIC: first) inspection, and why when it is shorter than usual.
  const months = record.summary.nextInspectionMonths;
  if (months === null) {
    reasons.push(`Summary: the recommended interval to the ${kind === 'EIC' ? 'first' : 'next'} inspection is not given.`);
  } else {
    const usual = record.installation.premises ? usualIntervalMonths[record.installation.premises] : null;
    if (usual !== null && months < usual && blank(record.summary.nextInspectionReason)) {
      reasons.push(`Summary: the interval of ${months} months is shorter than the usual ${usual} for these premises; say why.`);
    }
  }
  return reasons;
}

/**
 * Why this job cannot be approved, in words (empty: it can be): a board not locked, a missing
 * part of the record, an inspection item left blank, an observation without its code, an overall
 * assessment the observations contradict (an inspection item coded C1 or C2 under a satisfactory
 * assessment, or a summary that calls an unsatisfactory installation satisfactory), or a job
 * finding in error that is neither resolved nor accepted.
 */
export function jobApprovalReasons(input: JobGateInput): string[] {
  const reasons: string[] = [];
  if (input.boards.length === 0) reasons.push('The job has no board: a certificate or report carries a schedule of test results for each board.');
  for (const board of input.boards) {
    if (board.state !== 'locked') reasons.push(`Board ${board.reference} is not locked.`);
  }
  reasons.push(...recordReasons(input.kind, input.record));
  for (const f of input.jobFindings) {
    if (requiredPartCodes.has(f.code)) continue; // said above, in the record's own words
    if (contradictionCodes.has(f.code)) reasons.push(`Summary: ${f.message}`);
    else if (f.severity === 'error' && !input.acceptedKeys.has(gateFindingKey(null, f))) {
      reasons.push(`${f.message} (an error, neither resolved nor accepted by a reviewer)`);
    }
  }
  return reasons;
}
