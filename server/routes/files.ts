import { Router } from 'express';
import type { DB } from '../db/database.ts';
import { findFile, type FileStore } from '../files.ts';
import { notFound } from '../http-error.ts';
import { idParam } from './params.ts';

/**
 * `GET /api/files/:fileId`: a stored file's bytes with the type recorded when it was checked
 * (signatures, the logo, issued PDFs), for anyone signed in. Files never change once stored, so
 * the answer may be cached privately.
 */
export function fileRoutes(db: DB, files: FileStore): Router {
  const router = Router();

  router.get('/:fileId', async (req, res) => {
    const row = await findFile(db, idParam(req, 'fileId'));
    if (!row) throw notFound('That file');
    let bytes: Buffer;
    try {
      bytes = files.read(row);
    } catch {
      throw notFound(`The bytes of file ${row.id}`);
    }
    const name = (row.original_name ?? `file-${row.id}`).replace(/[^\w. -]/g, '_');
    res.set({
      'Content-Type': row.mime,
      'Content-Length': String(bytes.length),
      'Content-Disposition': `inline; filename="${name}"`,
      'Cache-Control': 'private, max-age=86400, immutable',
      ETag: `"${row.sha256}"`,
    });
    res.send(bytes);
  });

  return router;
}
