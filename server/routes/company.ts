import { Router } from 'express';
import { maxLogoBytes } from '../../shared/schemas/company-logo.ts';
import { companyFieldsSchema, companyResponseSchema } from '../../shared/schemas/company.ts';
import { loadCompany, saveCompany, saveCompanyLogo } from '../db/company.ts';
import type { DB } from '../db/database.ts';
import { imageTypes, singleUpload, type FileStore, type UploadedFile } from '../files.ts';
import { currentUser, requireRole } from '../middleware/auth.ts';

/**
 * The company's details: anyone signed in reads them (they head every document); admins change
 * them. The logo: `POST /api/company/logo` (admin: a PNG or JPEG of at most 1 MB, checked by
 * content, stored as a `logo` file) and `DELETE /api/company/logo`. A replaced logo's file is kept
 * (an issued document may have printed it).
 */
export function companyRoutes(db: DB, files: FileStore): Router {
  const router = Router();

  router.get('/', async (_req, res) => {
    res.json(companyResponseSchema.parse({ company: await loadCompany(db) }));
  });

  router.put('/', requireRole('admin'), async (req, res) => {
    const fields = companyFieldsSchema.parse(req.body);
    const company = await db.transaction().execute((trx) => saveCompany(trx, fields));
    res.json(companyResponseSchema.parse({ company }));
  });

  router.post(
    '/logo',
    requireRole('admin'),
    ...singleUpload({ field: 'logo', maxBytes: maxLogoBytes, types: imageTypes, what: 'the logo' }),
    async (req, res) => {
      const upload = res.locals.upload as UploadedFile;
      const user = currentUser(req);
      let storedPath: string | null = null;
      const company = await db
        .transaction()
        .execute(async (trx) => {
          const file = await files.save(trx, { kind: 'logo', bytes: upload.bytes, mime: upload.mime, originalName: upload.originalName, uploadedBy: user.id });
          storedPath = file.path;
          return saveCompanyLogo(trx, file.id);
        })
        .catch((error: unknown) => {
          // The row went with the rolled-back transaction; the bytes go too.
          if (storedPath) files.remove(storedPath);
          throw error;
        });
      res.status(201).json(companyResponseSchema.parse({ company }));
    },
  );

  router.delete('/logo', requireRole('admin'), async (_req, res) => {
    res.json(companyResponseSchema.parse({ company: await saveCompanyLogo(db, null) }));
  });

  return router;
}
