import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { RequestHandler } from 'express';
import { fileTypeFromBuffer } from 'file-type';
import multer from 'multer';
import type { DB } from './db/database.ts';
import type { FileRow } from './db/types.ts';
import { HttpError } from './http-error.ts';

/** What a stored file is for (the `files.kind` column). */
export type FileKind = 'signature' | 'logo' | 'photo' | 'issued-pdf' | (string & {});

export interface NewFile {
  kind: FileKind;
  bytes: Buffer;
  mime: string;
  /** The file's name as the person's computer called it, kept for downloads only. */
  originalName?: string | null;
  jobId?: number | null;
  boardId?: number | null;
  uploadedBy?: number | null;
}

const extensionByMime: Record<string, string> = {
  'image/png': 'png',
  'image/jpeg': 'jpg',
  'image/heic': 'heic',
  'application/pdf': 'pdf',
};

export const sha256Hex = (bytes: Buffer | Uint8Array) => crypto.createHash('sha256').update(bytes).digest('hex');

/**
 * Files kept on disk under the data folder, one `files` row each with the file's SHA-256. Bytes
 * are written first (to a temporary name, then renamed, so a crash never leaves half a file under
 * a real name) and the row second; if the row cannot be written the bytes are removed again.
 * A stored file is never rewritten: every save makes a new path.
 */
export class FileStore {
  readonly dataDir: string;

  constructor(dataDir: string) {
    this.dataDir = path.resolve(dataDir);
  }

  /** Stores the bytes and their row; `db` may be a transaction. */
  async save(db: DB, file: NewFile): Promise<FileRow> {
    const now = new Date();
    const ext = extensionByMime[file.mime] ?? 'bin';
    // files/<kind>/<yyyy-mm>/<random>.<ext>: the name carries no person's input.
    const relative = path.posix.join(
      'files',
      file.kind.replace(/[^a-z0-9-]/gi, '_'),
      now.toISOString().slice(0, 7),
      `${crypto.randomUUID()}.${ext}`,
    );
    const absolute = this.absolutePath(relative);
    fs.mkdirSync(path.dirname(absolute), { recursive: true });
    const temporary = `${absolute}.part`;
    fs.writeFileSync(temporary, file.bytes, { flag: 'wx' });
    fs.renameSync(temporary, absolute);
    try {
      return await db
        .insertInto('files')
        .values({
          kind: file.kind,
          path: relative,
          sha256: sha256Hex(file.bytes),
          mime: file.mime,
          size_bytes: file.bytes.length,
          original_name: file.originalName ?? null,
          job_id: file.jobId ?? null,
          board_id: file.boardId ?? null,
          uploaded_by: file.uploadedBy ?? null,
        })
        .returningAll()
        .executeTakeFirstOrThrow();
    } catch (error) {
      fs.rmSync(absolute, { force: true });
      throw error;
    }
  }

  /** The bytes of a stored file. */
  read(row: Pick<FileRow, 'path'>): Buffer {
    return fs.readFileSync(this.absolutePath(row.path));
  }

  /** Reads the bytes and checks them against the SHA-256 recorded when they were stored. */
  readVerified(row: Pick<FileRow, 'path' | 'sha256'>): Buffer {
    const bytes = this.read(row);
    if (sha256Hex(bytes) !== row.sha256) {
      throw new Error(`The stored file ${row.path} no longer matches its SHA-256; it was changed on disk.`);
    }
    return bytes;
  }

  /** Removes bytes whose row was never committed (a failed transaction). Stored files are otherwise kept. */
  remove(relative: string): void {
    fs.rmSync(this.absolutePath(relative), { force: true });
  }

  absolutePath(relative: string): string {
    const absolute = path.resolve(this.dataDir, relative);
    if (!absolute.startsWith(this.dataDir + path.sep)) throw new Error(`A file path must stay inside the data folder: ${relative}`);
    return absolute;
  }
}

export function findFile(db: DB, id: number): Promise<FileRow | undefined> {
  return db.selectFrom('files').selectAll().where('id', '=', id).executeTakeFirst();
}

/** Image types accepted for signatures and logos, by what their bytes say they are. */
export const imageTypes = { 'image/png': 'PNG', 'image/jpeg': 'JPEG' } as const;

export interface UploadedFile {
  bytes: Buffer;
  /** The type read from the content (magic bytes), never the declared type or the name. */
  mime: string;
  originalName: string;
}

const describeSize = (bytes: number) => (bytes >= 1024 * 1024 ? `${bytes / (1024 * 1024)} MB` : `${Math.round(bytes / 1024)} kB`);

/**
 * Takes one file from a multipart form (field `field`) into memory, refusing one larger than
 * `maxBytes` (413) and one whose content is not of the accepted types (415). Nothing is written to
 * disk here: the route stores the file only once everything else in the request is valid. The
 * checked file is left on `res.locals.upload` (an `UploadedFile`), the form's text fields on
 * `req.body`.
 */
export function singleUpload(options: {
  field: string;
  maxBytes: number;
  /** Accepted types by content; null for a text file, which has no magic bytes (the route reads it). */
  types: Record<string, string> | null;
  what: string;
}): RequestHandler[] {
  const parse = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: options.maxBytes, files: 1, fields: 20, fieldSize: 10_000, parts: 25 },
  }).single(options.field);
  const accepted = options.types ? Object.values(options.types).join(' or ') : 'a text file';

  const receive: RequestHandler = (req, res, next) => {
    if (!req.is('multipart/form-data')) {
      next(new HttpError('bad_request', `Send ${options.what} as a form upload (multipart/form-data) in the field "${options.field}".`));
      return;
    }
    parse(req, res, (error: unknown) => {
      if (!error) return next();
      if (error instanceof multer.MulterError) {
        if (error.code === 'LIMIT_FILE_SIZE') {
          return next(new HttpError('too_large', `${capitalise(options.what)} may be at most ${describeSize(options.maxBytes)}; this one is larger. Nothing was saved.`));
        }
        if (error.code === 'LIMIT_UNEXPECTED_FILE') {
          return next(new HttpError('bad_request', `Send one file only, in the field "${options.field}".`));
        }
        return next(new HttpError('bad_request', `The upload was not understood (${error.message}). Nothing was saved.`));
      }
      // busboy's own errors: a cut-off or malformed form.
      return next(new HttpError('bad_request', `The upload was not understood (${error instanceof Error ? error.message : String(error)}). Nothing was saved.`));
    });
  };

  const check: RequestHandler = async (req, res, next) => {
    const file = req.file;
    if (!file || file.size === 0) throw new HttpError('bad_request', `Attach ${options.what} (${accepted}) in the field "${options.field}".`);
    if (options.types === null) {
      res.locals.upload = { bytes: file.buffer, mime: 'text/plain', originalName: file.originalname } satisfies UploadedFile;
      return next();
    }
    const detected = await fileTypeFromBuffer(file.buffer);
    if (!detected || !(detected.mime in options.types)) {
      const found = detected ? `it is ${detected.mime}` : 'its content is not a recognised file type';
      throw new HttpError('unsupported_type', `${capitalise(options.what)} must be a ${accepted} image; ${found}, whatever its name says. Nothing was saved.`);
    }
    const upload: UploadedFile = { bytes: file.buffer, mime: detected.mime, originalName: file.originalname };
    res.locals.upload = upload;
    next();
  };

  return [receive, check];
}

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);
