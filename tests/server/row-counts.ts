import type { DB } from '../../server/db/database.ts';

/** Row counts of every table a job, site or board write touches: "nothing written" means these do not move. */
export async function rowCounts(db: DB): Promise<Record<string, number>> {
  const tables = ['sites', 'site_history', 'jobs', 'job_sections', 'job_history', 'boards', 'circuits', 'cells', 'history', 'app_settings'] as const;
  const counts: Record<string, number> = {};
  for (const table of tables) {
    const row = await db.selectFrom(table).select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
    counts[table] = Number(row.n);
  }
  return counts;
}
