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

/** The entries of a stored outbox text, as stored (none when the text is missing or damaged). */
function storedEntries(text: string | null): unknown[] {
  if (!text) return [];
  try {
    const parsed = storedSchema.safeParse(JSON.parse(text));
    return parsed.success ? parsed.data.entries : [];
  } catch {
    return [];
  }
}

function readRaw(storage: Storage, boardId: number, ownerId: number | null): unknown[] {
  try {
    return storedEntries(storage.getItem(outboxStorageKey(boardId, ownerId)));
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

/** What a page knows of the stored text after writing it: the text, and the entries of other pages in it. */
interface LastWrite {
  text: string | null;
  others: ReadonlyArray<{ id: string | undefined; json: string }>;
}

/**
 * Stores one page's outbox of one board, cheaply enough to run on every keystroke (an edit is
 * stored before the key's handler returns). The text stored is the same as ever:
 * `{"version":1,"entries":[…]}` with other pages' entries first, then this page's.
 *
 * - Each entry is turned into JSON once: entries are replaced, never changed in place, so an
 *   entry's text is kept with the entry and the stored text is put together from those pieces.
 * - The stored text is read back and parsed only when something else changed it since this page
 *   last wrote it (another tab with the same board open): `ownIds` are the ids of every edit this
 *   page has held, and stored entries with other ids (or unreadable ones) are kept, so two tabs
 *   never wipe each other's edits.
 */
export class OutboxWriter {
  private readonly storage: Storage | null;
  private readonly key: string;
  private readonly json = new WeakMap<OutboxEntry, string>();
  /** Unknown (null) until this page has written, and again after a write failed. */
  private last: LastWrite | null = null;

  constructor(storage: Storage | null, boardId: number, ownerId: number | null = null) {
    this.storage = storage;
    this.key = outboxStorageKey(boardId, ownerId);
  }

  write(entries: readonly OutboxEntry[], ownIds: ReadonlySet<string>): void {
    const storage = this.storage;
    if (!storage) return;
    try {
      const stored = storage.getItem(this.key);
      const known = this.last !== null && this.last.text === stored ? this.last.others : storedEntries(stored).map((raw) => ({ id: rawId(raw), json: JSON.stringify(raw) }));
      const others = known.filter((other) => other.id === undefined || !ownIds.has(other.id));
      const pieces = others.map((other) => other.json);
      for (const entry of entries) pieces.push(this.entryJson(entry));
      const text = pieces.length === 0 ? null : `{"version":1,"entries":[${pieces.join(',')}]}`;
      if (text === null) storage.removeItem(this.key);
      else if (text !== stored) storage.setItem(this.key, text);
      this.last = { text, others };
    } catch {
      // Storage full or refused: the edits are still held in memory and sent as usual; the next
      // write reads the stored text again.
      this.last = null;
    }
  }

  private entryJson(entry: OutboxEntry): string {
    let text = this.json.get(entry);
    if (text === undefined) {
      text = JSON.stringify(entry);
      this.json.set(entry, text);
    }
    return text;
  }
}

/**
 * Stores a page's outbox once (see `OutboxWriter`, which a page keeps to store it on every change).
 * `ownIds` are the ids of every edit this page has held: stored entries with other ids (written by
 * another tab with the same board open, or unreadable) are kept, so two tabs never wipe each
 * other's edits.
 */
export function writeOutbox(
  storage: Storage | null,
  boardId: number,
  entries: readonly OutboxEntry[],
  ownIds: ReadonlySet<string>,
  ownerId: number | null = null,
): void {
  new OutboxWriter(storage, boardId, ownerId).write(entries, ownIds);
}
