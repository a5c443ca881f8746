import type { BoardDetail, Circuit } from '../../../../shared/schemas/boards.ts';
import type { OutboxEntry } from './outbox-storage.ts';
import type { PendingEdit } from './types.ts';

/** Applies edits (in the order they were typed) to a circuit, returning a new circuit. */
function applyEdits(circuit: Circuit, edits: readonly PendingEdit[]): Circuit {
  const next: Circuit = { ...circuit, cells: { ...circuit.cells } };
  for (const edit of edits) {
    if (edit.kind === 'cell') {
      const server = circuit.cells[edit.column];
      next.cells[edit.column] = {
        text: edit.text,
        reason: edit.reason,
        // The version stays the server's: it is what the edit was typed over.
        version: server?.version ?? edit.baseVersion,
        updatedBy: null,
        updatedAt: edit.at,
      };
    } else {
      (next as unknown as Record<string, unknown>)[edit.field] = edit.value;
    }
  }
  return next;
}

/**
 * The board as the typist should see it: the cached server board with every edit still waiting
 * to be sent applied on top, in order. Edits held by a conflict are not applied: until the typist
 * chooses, the cell shows the other person's value.
 *
 * Each overlaid circuit is remembered with the server circuit and edits it was made from, so a
 * circuit keeps its identity while neither changes (rows re-render only when their own data does).
 */
export class PendingOverlay {
  private readonly memo = new Map<number, { base: Circuit; edits: readonly PendingEdit[]; result: Circuit }>();
  private last: { detail: BoardDetail; entries: readonly OutboxEntry[]; result: BoardDetail } | null = null;

  apply(detail: BoardDetail | undefined, entries: readonly OutboxEntry[]): BoardDetail | undefined {
    if (!detail) return undefined;
    if (this.last && this.last.detail === detail && this.last.entries === entries) return this.last.result;

    const byCircuit = new Map<number, PendingEdit[]>();
    for (const entry of entries) {
      if (entry.conflict) continue;
      const list = byCircuit.get(entry.edit.circuitId);
      if (list) list.push(entry.edit);
      else byCircuit.set(entry.edit.circuitId, [entry.edit]);
    }

    let changed = false;
    const circuits = detail.circuits.map((circuit) => {
      const edits = byCircuit.get(circuit.id);
      if (!edits) return circuit;
      changed = true;
      const memo = this.memo.get(circuit.id);
      if (memo && memo.base === circuit && memo.edits.length === edits.length && memo.edits.every((e, i) => e === edits[i])) {
        return memo.result;
      }
      const result = applyEdits(circuit, edits);
      this.memo.set(circuit.id, { base: circuit, edits, result });
      return result;
    });
    for (const id of this.memo.keys()) if (!byCircuit.has(id)) this.memo.delete(id);

    const result = changed ? { ...detail, circuits } : detail;
    this.last = { detail, entries, result };
    return result;
  }
}
