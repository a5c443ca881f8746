import crypto from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';
import type { DB } from '../db/database.ts';
import type { FileRow } from '../db/types.ts';

/** SHA-256 of some bytes, as lower-case hex. */
export function sha256Hex(bytes: Uint8Array): string {
  return crypto.createHash('sha256').update(bytes).digest('hex');
}

/**
 * The absolute path of a stored file. `relativePath` comes from the `files` table; a path that
 * would leave the data folder is refused (a row must never point outside it).
 */
export function storedFilePath(dataDir: string, relativePath: string): string {
  const root = path.resolve(dataDir);
  const full = path.resolve(root, relativePath);
  if (full !== root && !full.startsWith(root + path.sep)) throw new Error(`Stored file path leaves the data folder: ${relativePath}`);
  return full;
}

/**
 * Writes bytes under the data folder without ever replacing an existing file: written to a
 * temporary name first and then linked into place, so a reader never sees half a file and a
 * second writer of the same name fails instead of overwriting.
 */
export async function writeNewFile(dataDir: string, relativePath: string, bytes: Uint8Array): Promise<string> {
  const full = storedFilePath(dataDir, relativePath);
  await fs.mkdir(path.dirname(full), { recursive: true });
  const temporary = `${full}.${process.pid}.${crypto.randomBytes(4).toString('hex')}.part`;
  await fs.writeFile(temporary, bytes, { flag: 'wx' });
  try {
    await fs.link(temporary, full);
  } finally {
    await fs.rm(temporary, { force: true });
  }
  return full;
}

export interface StoredFile {
  row: FileRow;
  bytes: Buffer;
}

/** A `files` row and its bytes; undefined when the row is absent or the file cannot be read. */
export async function readStoredFile(db: DB, dataDir: string, fileId: number): Promise<StoredFile | undefined> {
  const row = await db.selectFrom('files').selectAll().where('id', '=', fileId).executeTakeFirst();
  if (!row) return undefined;
  try {
    return { row, bytes: await fs.readFile(storedFilePath(dataDir, row.path)) };
  } catch {
    return undefined;
  }
}
