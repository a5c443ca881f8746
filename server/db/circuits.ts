import { circuitFieldsSchema, type CircuitFields, type CreateCircuitBody } from '../../shared/schemas/boards.ts';
import type { DB } from './database.ts';
import { appendHistory } from './history.ts';
import { circuitFieldColumns, fieldText, toCircuitUpdate } from './mappers.ts';
import type { CircuitRow } from './types.ts';

export function findCircuitRow(db: DB, boardId: number, circuitId: number): Promise<CircuitRow | undefined> {
  return db
    .selectFrom('circuits')
    .selectAll()
    .where('id', '=', circuitId)
    .where('board_id', '=', boardId)
    .executeTakeFirst();
}

/** The longest circuit number the schema takes (`circuitFieldsSchema.number`). */
const numberMaxLength = circuitFieldsSchema.shape.number.maxLength ?? 12;

/**
 * Next free plain number on a board: one more than the highest number ("13" after "12",
 * "5" after "4L3") when that fits the circuit-number field, else the
 * lowest whole number not yet used, which always fits (a board has far fewer than 10¹² circuits).
 */
export function nextCircuitNumber(numbers: readonly string[]): string {
  // Leading digits count ("4L1" is circuit 4's first line), as a tester numbers ways.
  const plain = numbers.map((n) => /^\d+/.exec(n.trim())?.[0]).filter((d): d is string => d !== undefined).map((d) => BigInt(d));
  const highest = plain.reduce((max, n) => (n > max ? n : max), 0n);
  const next = String(highest + 1n);
  if (next.length <= numberMaxLength) return next;
  const used = new Set(plain);
  let candidate = 1n;
  while (used.has(candidate)) candidate += 1n;
  return String(candidate);
}

/** Inserts a circuit after another (or at the end) and renumbers positions 1..n. */
export async function createCircuit(db: DB, boardId: number, body: CreateCircuitBody, userId: number): Promise<number> {
  const { afterCircuitId, ...fields } = body;
  const order = (
    await db.selectFrom('circuits').select('id').where('board_id', '=', boardId).orderBy('position').orderBy('id').execute()
  ).map((r) => r.id);
  const number =
    fields.number ??
    nextCircuitNumber((await db.selectFrom('circuits').select('number').where('board_id', '=', boardId).execute()).map((r) => r.number));
  const inserted = await db
    .insertInto('circuits')
    .values({ board_id: boardId, position: 0, phase: null, points: null, live_csa_mm2: null, cpc_csa_mm2: null,
      max_disconnection_s: null, rating_a: null, breaking_ka: null, rcd_type: null, rcd_rated_residual_ma: null,
      afdd: null, spur_ring_id: null, spur_origin_point: null, spur_length_m: null, ...toCircuitUpdate(fields), number })
    .returning('id')
    .executeTakeFirstOrThrow();
  // The route has checked that afterCircuitId is on this board.
  const at = afterCircuitId ? order.indexOf(afterCircuitId) + 1 : order.length;
  order.splice(at, 0, inserted.id);
  await writePositions(db, order);
  await appendHistory(db, {
    board_id: boardId,
    circuit_id: inserted.id,
    column_key: null,
    action: 'circuit-created',
    old_text: null,
    new_text: number,
    user_id: userId,
    how: 'typed',
    version: 1,
  });
  return inserted.id;
}

async function writePositions(db: DB, order: readonly number[]): Promise<void> {
  for (const [index, id] of order.entries()) {
    await db.updateTable('circuits').set({ position: index + 1 }).where('id', '=', id).execute();
  }
}

export type CircuitUpdateResult =
  | { ok: true; version: number }
  | { ok: false; conflictingFields: string[] };

/**
 * Applies field changes to a circuit. A stale `version` is refused only for the fields that
 * somebody else changed after it: two people may fill different details of one circuit at once.
 */
export async function updateCircuit(
  db: DB,
  circuit: CircuitRow,
  baseVersion: number,
  changes: Partial<CircuitFields>,
  userId: number,
  how: string,
): Promise<CircuitUpdateResult> {
  const keys = Object.keys(changes).filter((k) => k in circuitFieldColumns);
  if (baseVersion !== circuit.version) {
    const later = await db
      .selectFrom('history')
      .select('column_key')
      .where('circuit_id', '=', circuit.id)
      .where('action', '=', 'field')
      .where('version', '>', baseVersion)
      .where('column_key', 'in', keys)
      .execute();
    const conflicting = [...new Set(later.map((r) => r.column_key ?? ''))].filter((k) => {
      const column = circuitFieldColumns[k as keyof CircuitFields];
      // Same value as now: nothing to decide, so no conflict.
      return fieldText(circuit[column]) !== fieldText(changes[k as keyof CircuitFields]);
    });
    if (conflicting.length > 0) return { ok: false, conflictingFields: conflicting };
  }
  // Values the circuit already holds change nothing: no new version, no history (a retried
  // request after a lost answer is harmless, and the live feed has nothing to bring).
  const changedKeys = keys.filter((k) => {
    const column = circuitFieldColumns[k as keyof CircuitFields];
    return fieldText(circuit[column]) !== fieldText(changes[k as keyof CircuitFields]);
  });
  if (changedKeys.length === 0) return { ok: true, version: circuit.version };
  const version = circuit.version + 1;
  const now = new Date().toISOString();
  for (const key of changedKeys) {
    const column = circuitFieldColumns[key as keyof CircuitFields];
    const oldText = fieldText(circuit[column]);
    const newText = fieldText(changes[key as keyof CircuitFields]);
    if (oldText === newText) continue;
    await appendHistory(db, {
      board_id: circuit.board_id,
      circuit_id: circuit.id,
      column_key: key,
      action: 'field',
      old_text: oldText,
      new_text: newText,
      user_id: userId,
      how,
      version,
      at: now,
    });
  }
  await db.updateTable('circuits').set({ ...toCircuitUpdate(changes), version }).where('id', '=', circuit.id).execute();
  return { ok: true, version };
}

export async function deleteCircuit(db: DB, circuit: CircuitRow, userId: number): Promise<void> {
  await db.deleteFrom('circuits').where('id', '=', circuit.id).execute();
  const remaining = (
    await db.selectFrom('circuits').select('id').where('board_id', '=', circuit.board_id).orderBy('position').execute()
  ).map((r) => r.id);
  await writePositions(db, remaining);
  await appendHistory(db, {
    board_id: circuit.board_id,
    circuit_id: circuit.id,
    column_key: null,
    action: 'circuit-removed',
    old_text: circuit.number,
    new_text: null,
    user_id: userId,
    how: 'typed',
    version: circuit.version + 1,
  });
}

/** Sets the order of a board's circuits; `ids` must be exactly the board's circuits. */
export async function reorderCircuits(db: DB, boardId: number, ids: readonly number[], userId: number): Promise<void> {
  await writePositions(db, ids);
  await appendHistory(db, {
    board_id: boardId,
    circuit_id: null,
    column_key: null,
    action: 'reordered',
    old_text: null,
    new_text: ids.join(','),
    user_id: userId,
    how: 'typed',
    version: null,
  });
}
