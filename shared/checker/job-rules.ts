import type { Finding } from '../schemas/findings.ts';
import { inspectionItemsById } from '../schemas/inspection-items.ts';
import type { JobSectionData } from '../schemas/job-record.ts';
import type { CheckInput } from '../schemas/check.ts';

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

const jobFinding = (f: Omit<Finding, 'circuitId' | 'columns'> & Partial<Pick<Finding, 'circuitId' | 'columns'>>): Finding => ({
  circuitId: null,
  columns: [],
  ...f,
});

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
          severity: 'error',
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

/** The job rules, in order. Each returns findings with their limit and source. */
export const jobRules: readonly JobRule[] = [codedItemWithoutObservation];

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
