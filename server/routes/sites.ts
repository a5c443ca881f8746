import { Router } from 'express';
import type { DB } from '../db/database.ts';
import { toJob, toSite } from '../db/mappers.ts';
import { listBoardSummaries, listJobs, listSites } from '../db/sites.ts';
import { HttpError } from '../http-error.ts';

export function siteRoutes(db: DB): Router {
  const router = Router();

  router.get('/sites', async (_req, res) => {
    res.json({ sites: (await listSites(db)).map(toSite) });
  });

  router.get('/jobs', async (req, res) => {
    const raw = req.query.siteId;
    let siteId: number | undefined;
    if (raw !== undefined) {
      siteId = Number(raw);
      if (!Number.isSafeInteger(siteId) || siteId <= 0) throw new HttpError('bad_request', 'siteId must be a positive whole number.');
    }
    res.json({ jobs: (await listJobs(db, siteId)).map(toJob) });
  });

  router.get('/boards', async (_req, res) => {
    const rows = await listBoardSummaries(db);
    res.json({
      boards: rows.map((r) => ({
        id: r.id,
        reference: r.reference,
        location: r.location,
        phases: r.phases,
        state: r.state,
        circuitCount: Number(r.circuit_count ?? 0),
        cellsFilled: Number(r.cells_filled ?? 0),
        site: { id: r.site_id, client: r.site_client, address: r.site_address },
        job: { id: r.job_id, kind: r.job_kind, reference: r.job_reference },
      })),
    });
  });

  return router;
}
