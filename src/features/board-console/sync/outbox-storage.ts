import { z } from 'zod';
import { circuitFieldsSchema, entryMethods } from '../../../../shared/schemas/boards.ts';
import { readingKeys } from '../../../../shared/schemas/columns.ts';
import type { Conflict, PendingEdit } from './types.ts';

/**
 * The outbox as kept in localStorage, one key per board, so edits survive a crash, a closed tab or
 * a reload and are sent when the page opens the board again.
 */

/** One edit of the outbox; `conflict` is set while the server's refusal waits for the typist's choice. */
export interface OutboxEntry {
  edit: PendingEdit;
  conflict?: Conflict;
}

/**
 * Outboxes are kept per person: edits typed by one person are only ever sent under that person's
 * session, never by whoever opens the board next in the same browser.
 */
export const outboxStorageKey = (boardId: number, ownerId: number | null = null) =>
  ownerId === null ? `boardwalk.outbox.${boardId}` : `boardwalk.outbox.${ownerId}.${boardId}`;

const fieldKeys = Object.keys(circuitFieldsSchema.shape) as [keyof z.infer<typeof circuitFieldsSchema>, ...(keyof z.infer<typeof circuitFieldsSchema>)[]];

const pendingEditSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('cell'),
    id: z.string().min(1),
    boardId: z.number().int(),
    circuitId: z.number().int(),
    column: z.enum(readingKeys),
    text: z.string(),
    reason: z.string().nullable(),
    baseVersion: z.number().int().min(0),
    how: z.enum(entryMethods),
    at: z.string(),
  }),
  z.object({
    kind: z.literal('field'),
    id: z.string().min(1),
    boardId: z.number().int(),
    circuitId: z.number().int(),
    field: z.enum(fieldKeys),
    value: z.union([z.string(), z.number(), z.null()]),
    baseVersion: z.number().int().min(0),
    how: z.enum(entryMethods),
    at: z.string(),
  }),
]);

const conflictSchema = z.object({
  editId: z.string(),
  circuitId: z.number().int(),
  column: z.enum([...readingKeys, ...fieldKeys]),
  mine: z.string(),
  theirs: z.string(),
  theirsBy: z.string().nullable(),
});

const entrySchema = z.object({ edit: pendingEditSchema, conflict: conflictSchema.optional() });

const storedSchema = z.object({ version: z.literal(1), entries: z.array(z.unknown()) });

/** localStorage, or null where the browser refuses it (storage disabled, sandboxed frame). */
export function browserStorage(): Storage | null {
  try {
    return typeof localStorage === 'undefined' ? null : localStorage;
  } catch {
    return null;
  }
}

function readRaw(storage: Storage, boardId: number, ownerId: number | null): unknown[] {
  try {
    const text = storage.getItem(outboxStorageKey(boardId, ownerId));
    if (!text) return [];
    const parsed = storedSchema.safeParse(JSON.parse(text));
    return parsed.success ? parsed.data.entries : [];
  } catch {
    return [];
  }
}

function rawId(raw: unknown): string | undefined {
  if (typeof raw !== 'object' || raw === null) return undefined;
  const edit = (raw as { edit?: unknown }).edit;
  if (typeof edit !== 'object' || edit === null) return undefined;
  const id = (edit as { id?: unknown }).id;
  return typeof id === 'string' ? id : undefined;
}

/** The board's outbox in the order it was written. Entries this code cannot read are skipped (and left stored). */
export function readOutbox(storage: Storage | null, boardId: number, ownerId: number | null = null): OutboxEntry[] {
  if (!storage) return [];
  const entries: OutboxEntry[] = [];
  for (const raw of readRaw(storage, boardId, ownerId)) {
    const parsed = entrySchema.safeParse(raw);
    if (parsed.success && parsed.data.edit.boardId === boardId) entries.push(parsed.data);
  }
  return entries;
}

/**
 * Stores this page's outbox. `ownIds` are the ids of every edit this page has held: stored
 * entries with other ids (written by another tab with the same board open, or unreadable) are
 * kept, so two tabs never wipe each other's edits.
 */
export function writeOutbox(
  storage: Storage | null,
  boardId: number,
  entries: readonly OutboxEntry[],
  ownIds: ReadonlySet<string>,
  ownerId: number | null = null,
): void {
  if (!storage) return;
  const key = outboxStorageKey(boardId, ownerId);
  try {
    const others = readRaw(storage, boardId, ownerId).filter((raw) => {
      const id = rawId(raw);
      return id === undefined || !ownIds.has(id);
    });
    const all = [...others, ...entries];
    if (all.length === 0) storage.removeItem(key);
    else storage.setItem(key, JSON.stringify({ version: 1, entries: all }));
  } catch {
    // Storage full or refused: the edits are still held in memory and sent as usual.
  }
}
