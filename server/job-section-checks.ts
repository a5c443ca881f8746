import { ZodError, type z } from 'zod';
import { inspectionItemsById } from '../shared/schemas/inspection-items.ts';
import type { JobSectionData, JobSectionKey } from '../shared/schemas/job-record.ts';

/** One problem with a section write, at the field it concerns (path relative to the section). */
export interface SectionIssue {
  path: string[];
  message: string;
}

/** Section titles in the words the job screen uses, for messages. */
export const sectionTitles: Record<JobSectionKey, string> = {
  client: 'client and reason',
  installation: 'installation',
  work: 'work covered',
  supply: 'supply characteristics',
  origin: 'particulars at the origin',
  extent: 'extent and limitations',
  inspections: 'schedule of inspections',
  observations: 'observations',
  summary: 'summary',
  declaration: 'declaration',
};

/** Zod's issues for a section change, reworded where zod's own words are not a tester's. */
export function describeSectionIssues(key: JobSectionKey, error: z.ZodError): SectionIssue[] {
  return error.issues.flatMap((issue): SectionIssue[] => {
    const path = issue.path.map(String);
    if (issue.code === 'unrecognized_keys') {
      return issue.keys.map((field) => ({ path: [...path, field], message: `The ${sectionTitles[key]} section has no field "${field}".` }));
    }
    if (issue.code === 'invalid_value' && issue.message.startsWith('Invalid option')) {
      return [{ path, message: `Choose one of: ${issue.values.map(String).join(', ')} (or leave it blank).` }];
    }
    if (issue.code === 'invalid_type' && issue.message.startsWith('Invalid input')) {
      return [{ path, message: `Expected ${issue.expected === 'object' ? 'a group of fields' : `a ${issue.expected}`} here.` }];
    }
    return [{ path, message: issue.message }];
  });
}

/** Issues as a ZodError, so the error middleware answers 400 with every issue, as for a body. */
export function issuesError(issues: readonly SectionIssue[]): ZodError {
  return new ZodError(issues.map((i) => ({ code: 'custom' as const, path: i.path, message: i.message, input: undefined })));
}

/** A job's boards and their circuits, for checking what an observation is tied to. */
export type JobBoardsIndex = ReadonlyMap<number, { reference: string; circuits: ReadonlyMap<number, string> }>;

/**
 * Checks a parsed section change against the job: inspection items that exist and outcomes that
 * belong to the document (✗ on a certificate, C1/C2/C3 on a report), observations tied to a board
 * and circuit of this job, observation numbers unique after the change.
 */
export function sectionChangeIssues<K extends JobSectionKey>(input: {
  kind: 'EIC' | 'EICR';
  key: K;
  changes: Record<string, unknown>;
  merged: JobSectionData[K];
  boards: JobBoardsIndex;
}): SectionIssue[] {
  const { kind, key, changes, boards } = input;
  const issues: SectionIssue[] = [];
  if (key === 'inspections') {
    for (const [itemId, outcome] of Object.entries(changes as JobSectionData['inspections'])) {
      if (!inspectionItemsById.has(itemId)) {
        issues.push({ path: [itemId], message: `There is no inspection item ${itemId}.` });
      } else if (outcome === 'fail' && kind === 'EICR') {
        issues.push({ path: [itemId], message: 'A condition report codes what is not acceptable as C1, C2 or C3 (with an observation), not ✗.' });
      } else if ((outcome === 'C1' || outcome === 'C2' || outcome === 'C3') && kind === 'EIC') {
        issues.push({ path: [itemId], message: `${outcome} belongs to a condition report; on a certificate mark what is not acceptable ✗ and put it right before certifying.` });
      }
    }
  }
  if (key === 'observations') {
    const merged = input.merged as JobSectionData['observations'];
    for (const [id, observation] of Object.entries(changes as JobSectionData['observations'])) {
      if (!observation) continue;
      if (observation.boardId !== null) {
        const board = boards.get(observation.boardId);
        if (!board) issues.push({ path: [id, 'boardId'], message: `Board ${observation.boardId} is not a board of this job.` });
        else if (observation.circuitId !== null && !board.circuits.has(observation.circuitId)) {
          issues.push({ path: [id, 'circuitId'], message: `Circuit ${observation.circuitId} is not on board ${board.reference}.` });
        }
      } else if (observation.circuitId !== null) {
        issues.push({ path: [id, 'boardId'], message: 'Say which board the circuit is on.' });
      }
      if (observation.inspectionItem !== null && !inspectionItemsById.has(observation.inspectionItem)) {
        issues.push({ path: [id, 'inspectionItem'], message: `There is no inspection item ${observation.inspectionItem}.` });
      }
      const sameNumber = Object.entries(merged).find(([otherId, other]) => otherId !== id && other?.number === observation.number);
      if (sameNumber) issues.push({ path: [id, 'number'], message: `Observation ${observation.number} already exists; give this one another number.` });
    }
  }
  return issues;
}
