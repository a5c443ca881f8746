/**
 * The review screen's commands: one list that the palette, the key bindings and the keys overlay
 * are built from (src/lib/commands). Single keys (j, k, a, l, b, o) act on the selected finding or
 * its board and are ignored while typing in a field; approving needs Alt+Shift+A so a stray key
 * never approves a job. Commands that change data (accept, withdraw, lock, send back, approve) are
 * marked `changesData`: chosen in the palette by a loose match, they ask before they run.
 */
import type { Role } from '../../../shared/schemas/common.ts';
import type { ReviewFinding, ReviewJob } from '../../../shared/schemas/review.ts';
import type { Command } from '../../lib/commands/types.ts';

export interface ReviewSelection {
  /** The board the finding is on; null for a finding about the job record. */
  boardId: number | null;
  finding: ReviewFinding;
}

export interface ReviewContext {
  review: ReviewJob;
  role: Role | null;
  selected: ReviewSelection | null;
  /** A request of the screen is on its way: commands wait for it. */
  busy: boolean;
  ui: {
    moveSelection(delta: 1 | -1): void;
    openAccept(): void;
    withdrawAcceptance(): void;
    focusSendBack(): void;
    lockBoard(boardId: number): void;
    approve(): void;
    openBoard(boardId: number): void;
    openPalette(): void;
    openKeys(): void;
  };
}

type ReviewCommand = Command<ReviewContext>;

const isReviewer = (ctx: ReviewContext) => ctx.role === 'reviewer' || ctx.role === 'admin';

function frozen(ctx: ReviewContext): string | null {
  const state = ctx.review.job.state;
  if (state === 'approved') return 'The job is approved: send it back before anything changes';
  if (state === 'issued') return 'The job is issued: a reviewer reopens it with a reason to change anything';
  return null;
}

function boardOfSelection(ctx: ReviewContext) {
  const id = ctx.selected?.boardId;
  return id === null || id === undefined ? null : (ctx.review.boards.find((b) => b.board.id === id) ?? null);
}

export function createReviewCommands(): ReviewCommand[] {
  return [
    {
      id: 'review.next-finding',
      label: 'Next finding',
      group: 'Findings',
      keywords: ['down', 'move'],
      shortcut: 'j',
      run: (ctx) => ctx.ui.moveSelection(1),
    },
    {
      id: 'review.previous-finding',
      label: 'Previous finding',
      group: 'Findings',
      keywords: ['up', 'move'],
      shortcut: 'k',
      run: (ctx) => ctx.ui.moveSelection(-1),
    },
    {
      id: 'review.accept',
      label: 'Accept the finding with a reason',
      group: 'Findings',
      changesData: true,
      keywords: ['accept', 'observation', 'reason', 'error'],
      shortcut: 'a',
      when: (ctx) => {
        if (!isReviewer(ctx)) return 'Only a reviewer or an admin accepts findings';
        const blocked = frozen(ctx);
        if (blocked) return blocked;
        const finding = ctx.selected?.finding;
        if (!finding) return 'Select a finding first (j / k)';
        if (finding.acceptance) return `Already accepted by ${finding.acceptance.acceptedBy.name}`;
        return finding.acceptable === true ? true : finding.acceptable.replace(/\.$/, '');
      },
      run: (ctx) => ctx.ui.openAccept(),
    },
    {
      id: 'review.withdraw',
      label: 'Withdraw the acceptance of the finding',
      group: 'Findings',
      changesData: true,
      keywords: ['undo', 'withdraw', 'reopen finding'],
      when: (ctx) => {
        if (!isReviewer(ctx)) return 'Only a reviewer or an admin withdraws an acceptance';
        const blocked = frozen(ctx);
        if (blocked) return blocked;
        if (!ctx.selected?.finding.acceptance) return 'The selected finding is not accepted';
        const board = boardOfSelection(ctx);
        if (board?.board.state === 'locked') return `Board ${board.board.reference} is locked: unlock it first`;
        return true;
      },
      run: (ctx) => ctx.ui.withdrawAcceptance(),
    },
    {
      id: 'review.lock-board',
      label: 'Lock the board of the finding',
      group: 'Boards',
      changesData: true,
      keywords: ['lock', 'freeze', 'board'],
      shortcut: 'l',
      when: (ctx) => {
        if (!isReviewer(ctx)) return 'Only a reviewer or an admin can lock a board';
        if (ctx.busy) return 'Wait for the last change to be saved';
        const board = boardOfSelection(ctx) ?? (ctx.review.boards.length === 1 ? ctx.review.boards[0]! : null);
        if (!board) return 'Select a finding on the board to lock (j / k)';
        if (board.board.state === 'locked') return `Board ${board.board.reference} is already locked`;
        const blocked = frozen(ctx);
        if (blocked) return blocked;
        const { reasons } = board.gate;
        return reasons.length === 0 ? true : `Board ${board.board.reference} cannot be locked yet: ${reasons.join(' · ')}`;
      },
      run: (ctx) => {
        const board = boardOfSelection(ctx) ?? ctx.review.boards[0];
        if (board) ctx.ui.lockBoard(board.board.id);
      },
    },
    {
      id: 'review.open-board',
      label: 'Open the board in the console',
      group: 'Boards',
      keywords: ['console', 'readings', 'grid', 'edit'],
      shortcut: 'o',
      when: (ctx) => (boardOfSelection(ctx) ? true : 'Select a finding on a board first (j / k)'),
      run: (ctx) => {
        const board = boardOfSelection(ctx);
        if (board) ctx.ui.openBoard(board.board.id);
      },
    },
    {
      id: 'review.send-back',
      label: 'Send the job back with a reason',
      group: 'Job',
      changesData: true,
      keywords: ['return', 'reject', 'send back', 'tester'],
      shortcut: 'b',
      when: (ctx) => {
        if (!isReviewer(ctx)) return 'Only a reviewer or an admin sends a job back';
        const state = ctx.review.job.state;
        if (state === 'entering') return 'The job is already being entered';
        if (state === 'issued') return 'An issued job is reopened with a reason, not sent back';
        return true;
      },
      run: (ctx) => ctx.ui.focusSendBack(),
    },
    {
      id: 'review.approve',
      label: 'Approve the job',
      group: 'Job',
      changesData: true,
      keywords: ['approve', 'pass', 'sign off'],
      shortcut: 'Alt+Shift+KeyA',
      when: (ctx) => {
        if (!isReviewer(ctx)) return 'Only a reviewer or an admin approves a job';
        if (ctx.busy) return 'Wait for the last change to be saved';
        const state = ctx.review.job.state;
        if (state !== 'ready') return state === 'entering' ? 'The job has not been submitted for review' : `The job is ${state} already`;
        const { reasons } = ctx.review.gate;
        return reasons.length === 0 ? true : `Not yet: ${reasons.join(' · ')}`;
      },
      run: (ctx) => ctx.ui.approve(),
    },
  ];
}
