import { Router } from 'express';
import { maxLogoBytes } from '../../shared/schemas/company-api.ts';
import { companyFieldsSchema, type Company } from '../../shared/schemas/company.ts';
import { readCompany, saveCompany } from '../db/company.ts';
import type { DB } from '../db/database.ts';
import { imageTypes, singleUpload, type FileStore, type UploadedFile } from '../files.ts';
import { currentUser, requireRole } from '../middleware/auth.ts';

/**
 * The company's details printed on issued documents: `GET /api/company` (anyone signed in),
 * `PUT /api/company` (admin: the text details), `POST /api/company/logo` (admin: a PNG or JPEG of
 * at most 1 MB, checked by content, stored as a `logo` file) and `DELETE /api/company/logo`.
 * A replaced logo's file is kept (an issued document may have printed it).
 */
export function companyRoutes(db: DB, files: FileStore): Router {
  const router = Router();

  router.get('/', async (_req, res) => {
    res.json({ company: await readCompany(db) });
  });

  router.put('/', requireRole('admin'), async (req, res) => {
    const fields = companyFieldsSchema.parse(req.body);
    const company: Company = { ...(await readCompany(db)), ...fields };
    await saveCompany(db, company);
    res.json({ company });
  });

  router.post(
    '/logo',
    requireRole('admin'),
    ...singleUpload({ field: 'logo', maxBytes: maxLogoBytes, types: imageTypes, what: 'the logo' }),
    async (_req, res) => {
      const upload = res.locals.upload as UploadedFile;
      const user = currentUser(_req);
      let storedPath: string | null = null;
      const company = await db
        .transaction()
        .execute(async (trx) => {
          const file = await files.save(trx, { kind: 'logo', bytes: upload.bytes, mime: upload.mime, originalName: upload.originalName, uploadedBy: user.id });
          storedPath = file.path;
          const updated: Company = { ...(await readCompany(trx)), logoFileId: file.id };
          await saveCompany(trx, updated);
          return updated;
        })
        .catch((error: unknown) => {
          if (storedPath) files.remove(storedPath);
          throw error;
        });
      res.status(201).json({ company });
    },
  );

  router.delete('/logo', requireRole('admin'), async (_req, res) => {
    const company: Company = { ...(await readCompany(db)), logoFileId: null };
    await saveCompany(db, company);
    res.json({ company });
  });

  return router;
}
