/**
 * A job's states and who may move it between them (issuing and reopening belong to the issue
 * routes). Pure, so the job screen offers only what the server will allow, with the same words.
 *
 *   being entered ──submit (anyone)──► ready for review ──approve (reviewer, gate passes)──► approved
 *         ▲                                  │                                                │
 *         └────────── send back with a reason (reviewer) ─┴────────────────────────────────────┘
 */
import type { Role } from '../schemas/common.ts';
import { jobStateLabels, type JobState } from '../schemas/sites.ts';

export const jobStateActions = ['submit', 'approve', 'send-back'] as const;
export type JobStateAction = (typeof jobStateActions)[number];

export const jobStateActionLabels: Record<JobStateAction, string> = {
  submit: 'submit for review',
  approve: 'approve',
  'send-back': 'send back',
};

const rolesFor: Record<JobStateAction, readonly Role[]> = {
  submit: ['tester', 'reviewer', 'admin'],
  approve: ['reviewer', 'admin'],
  'send-back': ['reviewer', 'admin'],
};

const fromStates: Record<JobStateAction, readonly JobState[]> = {
  submit: ['entering'],
  approve: ['ready'],
  'send-back': ['ready', 'approved'],
};

const targets: Record<JobStateAction, JobState> = { submit: 'ready', approve: 'approved', 'send-back': 'entering' };

export type TransitionResult =
  | { ok: true; to: JobState }
  | { ok: false; status: 403 | 409; message: string };

function refusalFromState(action: JobStateAction, state: JobState): string {
  const now = `The job is ${jobStateLabels[state]}`;
  switch (action) {
    case 'submit':
      if (state === 'ready') return `${now} already.`;
      if (state === 'approved') return `${now}; a reviewer sends it back before anything changes.`;
      return `${now}; a reviewer reopens it with a reason before it can be submitted again.`;
    case 'approve':
      if (state === 'entering') return `${now}: it is submitted for review before it can be approved.`;
      if (state === 'approved') return `${now} already.`;
      return `${now}; it cannot be approved again (reopen it to make a new revision).`;
    case 'send-back':
      if (state === 'entering') return `${now} already; there is nothing to send back.`;
      return `${now}: an issued document is never changed; reopen it with a reason to make a new revision.`;
  }
}

/** Whether `role` may do `action` on a job in `state`: the new state, or 403 / 409 with the reason in words. */
export function jobTransition(state: JobState, action: JobStateAction, role: Role): TransitionResult {
  if (!rolesFor[action].includes(role)) {
    return { ok: false, status: 403, message: `Only a reviewer or an admin can ${jobStateActionLabels[action]} a job; you are signed in as a ${role}.` };
  }
  if (!fromStates[action].includes(state)) return { ok: false, status: 409, message: refusalFromState(action, state) };
  return { ok: true, to: targets[action] };
}

/** A job in one of these states refuses every write to its boards, circuits, cells and record (423). */
export const frozenJobStates: readonly JobState[] = ['approved', 'issued'];

export function isJobFrozen(state: JobState): boolean {
  return frozenJobStates.includes(state);
}
