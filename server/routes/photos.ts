import { Router } from 'express';
import type { BoardPhoto } from '../../shared/schemas/import.ts';
import { photoSendChoiceBodySchema, type JobPhoto, type JobPhotos } from '../../shared/schemas/job-photos.ts';
import type { DB } from '../db/database.ts';
import type { FileRow } from '../db/types.ts';
import { userNames } from '../db/users.ts';
import { singleUpload, type FileStore, type UploadedFile } from '../files.ts';
import { HttpError, notFound } from '../http-error.ts';
import { currentUser, requireRole } from '../middleware/auth.ts';
import { stripLocation, UnreadablePhotoError } from '../photos/strip-location.ts';
import { requireBoard, requireOpen } from './boards.ts';
import { idParam } from './params.ts';

/** Largest photo taken: a phone's full-size JPEG is 3–8 MB. */
export const maxPhotoBytes = 15 * 1024 * 1024;

/** Accepted by content; HEIC is recognised only to be refused with the reason. */
const photoTypes = { 'image/jpeg': 'JPEG', 'image/png': 'PNG', 'image/heic': 'HEIC', 'image/heif': 'HEIF' } as const;

const storedNote = 'Location data (GPS, XMP, IPTC) is removed before a photo is stored.';

function toPhoto(row: FileRow, names: ReadonlyMap<number, string>, locationNote: string | null = storedNote): BoardPhoto {
  return {
    id: row.id,
    mime: row.mime,
    sizeBytes: row.size_bytes,
    sha256: row.sha256,
    originalName: row.original_name,
    uploadedBy: row.uploaded_by ? { id: row.uploaded_by, name: names.get(row.uploaded_by) ?? 'former user' } : null,
    uploadedAt: row.created_at,
    locationNote,
  };
}

function toJobPhoto(row: FileRow, names: ReadonlyMap<number, string>): JobPhoto {
  return {
    id: row.id,
    mime: row.mime,
    originalName: row.original_name,
    uploadedBy: row.uploaded_by ? { id: row.uploaded_by, name: names.get(row.uploaded_by) ?? 'former user' } : null,
    uploadedAt: row.created_at,
    sendToClient: row.send_to_client === 1,
  };
}

/**
 * Photos of the paper notes, attached to a board (files of kind `photo` with the board and its
 * job set). They belong to the job's record: anyone signed in sees them (the reviewer too), by
 * board on the job screen and the review screen (`GET /api/jobs/:jobId/photos`). A photo goes to
 * the client only when a reviewer or admin chose it (`PUT /api/photos/:fileId/send-choice`,
 * default off); the choice may change in any state of the job, since it only says what the next
 * e-mail carries — it changes nothing in the issued document.
 */
export function photoRoutes(db: DB, files: FileStore): Router {
  const router = Router();

  router.get('/boards/:boardId/photos', async (req, res) => {
    const boardId = idParam(req, 'boardId');
    const board = await db.selectFrom('boards').select('id').where('id', '=', boardId).executeTakeFirst();
    if (!board) throw notFound(`Board ${boardId}`);
    const rows = await db.selectFrom('files').selectAll().where('board_id', '=', boardId).where('kind', '=', 'photo').orderBy('id').execute();
    const names = await userNames(db);
    res.json({ photos: rows.map((r) => toPhoto(r, names)) });
  });

  router.post(
    '/boards/:boardId/photos',
    async (req, _res, next) => {
      const board = await requireBoard(db, idParam(req, 'boardId'));
      requireOpen(board);
      next();
    },
    ...singleUpload({ field: 'photo', maxBytes: maxPhotoBytes, types: photoTypes, what: 'a photo of the notes' }),
    async (req, res) => {
      const boardId = idParam(req, 'boardId');
      const upload = res.locals.upload as UploadedFile;
      if (upload.mime === 'image/heic' || upload.mime === 'image/heif') {
        throw new HttpError(
          'unsupported_type',
          'HEIC photos are not taken: Boardwalk cannot yet remove the location (GPS) they carry, and most browsers cannot show them. Save the photo as JPEG (most phones can, or share it "as JPEG") and attach that. Nothing was saved.',
        );
      }
      let stripped;
      try {
        stripped = stripLocation(upload.bytes, upload.mime);
      } catch (error) {
        if (error instanceof UnreadablePhotoError) {
          throw new HttpError('unsupported_type', `This photo could not be read safely (${error.message}), so its location data could not be removed; it was not stored. Save it again as JPEG or PNG and attach that.`);
        }
        throw error;
      }
      const user = currentUser(req);
      let storedPath: string | null = null;
      const row = await db
        .transaction()
        .execute(async (trx) => {
          const board = await requireBoard(trx, boardId);
          requireOpen(board);
          const file = await files.save(trx, {
            kind: 'photo', bytes: stripped.bytes, mime: upload.mime, originalName: upload.originalName || null, boardId, jobId: board.job_id, uploadedBy: user.id,
          });
          storedPath = file.path;
          return file;
        })
        .catch((error: unknown) => {
          if (storedPath) files.remove(storedPath);
          throw error;
        });
      const note = stripped.removed.length > 0 ? `Removed before storing: ${stripped.removed.join('; ')}.` : 'The photo carried no location data.';
      res.status(201).json({ photo: toPhoto(row, await userNames(db), note) });
    },
  );

  router.get('/jobs/:jobId/photos', async (req, res) => {
    const jobId = idParam(req, 'jobId');
    const job = await db.selectFrom('jobs').select('id').where('id', '=', jobId).executeTakeFirst();
    if (!job) throw notFound(`Job ${jobId}`);
    const boards = await db.selectFrom('boards').select(['id', 'reference']).where('job_id', '=', jobId).orderBy('id').execute();
    const rows = await db.selectFrom('files').selectAll().where('job_id', '=', jobId).where('kind', '=', 'photo').orderBy('id').execute();
    const names = await userNames(db);
    const body: JobPhotos = {
      boards: boards
        .map((b) => ({ boardId: b.id, reference: b.reference, photos: rows.filter((r) => r.board_id === b.id).map((r) => toJobPhoto(r, names)) }))
        .filter((b) => b.photos.length > 0),
    };
    res.json(body);
  });

  router.put('/photos/:fileId/send-choice', requireRole('reviewer', 'admin'), async (req, res) => {
    const fileId = idParam(req, 'fileId');
    const body = photoSendChoiceBodySchema.parse(req.body ?? {});
    const user = currentUser(req);
    const row = await db.transaction().execute(async (trx) => {
      const file = await trx.selectFrom('files').selectAll().where('id', '=', fileId).where('kind', '=', 'photo').executeTakeFirst();
      if (!file || file.job_id === null) throw notFound(`Photo ${fileId}`);
      const wanted = body.sendToClient ? 1 : 0;
      if (file.send_to_client === wanted) return file;
      const updated = await trx.updateTable('files').set({ send_to_client: wanted }).where('id', '=', fileId).returningAll().executeTakeFirstOrThrow();
      await trx
        .insertInto('job_history')
        .values({
          job_id: file.job_id,
          section: null,
          field: null,
          action: 'photo-send-choice',
          old_text: JSON.stringify({ fileId, boardId: file.board_id, sendToClient: file.send_to_client === 1 }),
          new_text: JSON.stringify({ fileId, boardId: file.board_id, sendToClient: body.sendToClient }),
          reason: null,
          user_id: user.id,
          at: new Date().toISOString(),
          version: null,
        })
        .execute();
      return updated;
    });
    res.json({ photo: toJobPhoto(row, await userNames(db)) });
  });

  return router;
}
