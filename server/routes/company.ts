import { Router } from 'express';
import { companyFieldsSchema, companyResponseSchema } from '../../shared/schemas/company.ts';
import { loadCompany, saveCompany } from '../db/company.ts';
import type { DB } from '../db/database.ts';
import { requireRole } from '../middleware/auth.ts';

/** The company's details: anyone signed in reads them (they head every document); admins change them. */
export function companyRoutes(db: DB): Router {
  const router = Router();

  router.get('/', async (_req, res) => {
    res.json(companyResponseSchema.parse({ company: await loadCompany(db) }));
  });

  router.put('/', requireRole('admin'), async (req, res) => {
    const fields = companyFieldsSchema.parse(req.body);
    const company = await db.transaction().execute((trx) => saveCompany(trx, fields));
    res.json(companyResponseSchema.parse({ company }));
  });

  return router;
}
