import { Router } from 'express';
import { boardListResponseSchema } from '../../shared/schemas/boards.ts';
import { createSiteBodySchema, siteListResponseSchema, siteResponseSchema, updateSiteBodySchema } from '../../shared/schemas/sites.ts';
import type { DB } from '../db/database.ts';
import { toSite } from '../db/mappers.ts';
import { createSite, findSiteRow, listBoardSummaries, listSites, toBoardSummary, updateSite } from '../db/sites.ts';
import { HttpError, notFound } from '../http-error.ts';
import { currentUser } from '../middleware/auth.ts';
import { idParam } from './params.ts';

/** Sites, and the list of every board for the jobs page. Any signed-in person may create and edit sites. */
export function siteRoutes(db: DB): Router {
  const router = Router();

  router.get('/sites', async (_req, res) => {
    res.json(siteListResponseSchema.parse({ sites: (await listSites(db)).map(toSite) }));
  });

  router.post('/sites', async (req, res) => {
    const body = createSiteBodySchema.parse(req.body);
    const user = currentUser(req);
    const id = await db.transaction().execute((trx) => createSite(trx, body, user.id));
    const site = await findSiteRow(db, id);
    res.status(201).json(siteResponseSchema.parse({ site: site && toSite(site) }));
  });

  router.patch('/sites/:siteId', async (req, res) => {
    const siteId = idParam(req, 'siteId');
    const body = updateSiteBodySchema.parse(req.body);
    const user = currentUser(req);
    await db.transaction().execute(async (trx) => {
      const site = await findSiteRow(trx, siteId);
      if (!site) throw notFound(`Site ${siteId}`);
      const result = await updateSite(trx, site, body.version, body.changes, user.id);
      if (!result.ok) {
        throw new HttpError('conflict', `Someone else changed ${result.conflictingFields.join(', ')} of this site meanwhile; look again and retry.`, {
          current: toSite(site),
          fields: result.conflictingFields,
        });
      }
    });
    const site = await findSiteRow(db, siteId);
    res.json(siteResponseSchema.parse({ site: site && toSite(site) }));
  });

  router.get('/boards', async (_req, res) => {
    res.json(boardListResponseSchema.parse({ boards: (await listBoardSummaries(db)).map(toBoardSummary) }));
  });

  return router;
}
