import type { DB } from './database.ts';

export function listSites(db: DB) {
  return db.selectFrom('sites').selectAll().orderBy('client').orderBy('id').execute();
}

export function listJobs(db: DB, siteId?: number) {
  let query = db.selectFrom('jobs').selectAll();
  if (siteId !== undefined) query = query.where('site_id', '=', siteId);
  return query.orderBy('visit_date', 'desc').orderBy('id').execute();
}

/** Every board with its site, job, circuit count and filled reading cells, for the jobs page. */
export function listBoardSummaries(db: DB) {
  return db
    .selectFrom('boards')
    .innerJoin('jobs', 'jobs.id', 'boards.job_id')
    .innerJoin('sites', 'sites.id', 'jobs.site_id')
    .select((eb) => [
      'boards.id',
      'boards.reference',
      'boards.location',
      'boards.phases',
      'boards.state',
      'jobs.id as job_id',
      'jobs.kind as job_kind',
      'jobs.reference as job_reference',
      'sites.id as site_id',
      'sites.client as site_client',
      'sites.address as site_address',
      eb
        .selectFrom('circuits')
        .select((e) => e.fn.countAll<number>().as('n'))
        .whereRef('circuits.board_id', '=', 'boards.id')
        .as('circuit_count'),
      eb
        .selectFrom('cells')
        .innerJoin('circuits', 'circuits.id', 'cells.circuit_id')
        .select((e) => e.fn.countAll<number>().as('n'))
        .whereRef('circuits.board_id', '=', 'boards.id')
        .where('cells.text', '!=', '')
        .as('cells_filled'),
    ])
    .orderBy('sites.client')
    .orderBy('jobs.visit_date', 'desc')
    .orderBy('boards.reference')
    .execute();
}
