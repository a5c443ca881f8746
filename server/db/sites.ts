import type { BoardSummary } from '../../shared/schemas/boards.ts';
import type { CreateSiteBody, SiteFields } from '../../shared/schemas/sites.ts';
import type { DB } from './database.ts';
import { sameValue, stableJson } from './json-values.ts';
import type { SiteRow, SiteTable } from './types.ts';
import { requiredProgress, type ProgressCircuit } from '../../shared/readings/required-progress.ts';
import type { Insertable, Updateable } from 'kysely';

export function listSites(db: DB) {
  return db.selectFrom('sites').selectAll().orderBy('client').orderBy('id').execute();
}

export function findSiteRow(db: DB, siteId: number): Promise<SiteRow | undefined> {
  return db.selectFrom('sites').selectAll().where('id', '=', siteId).executeTakeFirst();
}

export function listJobs(db: DB, siteId?: number) {
  let query = db.selectFrom('jobs').selectAll();
  if (siteId !== undefined) query = query.where('site_id', '=', siteId);
  return query.orderBy('visit_date', 'desc').orderBy('id').execute();
}

/** API field → column of `sites`. */
const siteColumns = {
  client: 'client',
  address: 'address',
  description: 'description',
  contactName: 'contact_name',
  contactEmail: 'contact_email',
  earthing: 'earthing',
  nominalVoltageV: 'nominal_voltage_v',
  zeOhm: 'ze_ohm',
  pfcKa: 'pfc_ka',
} as const satisfies Record<keyof SiteFields, keyof SiteRow>;

/** A new site; what the body leaves out takes the usual defaults (TN-C-S, 230 V, blanks). */
export async function createSite(db: DB, body: CreateSiteBody, userId: number): Promise<number> {
  const values: Insertable<SiteTable> = {
    client: body.client,
    address: body.address,
    description: body.description ?? '',
    contact_name: body.contactName ?? '',
    contact_email: body.contactEmail ?? '',
    earthing: body.earthing ?? 'TN-C-S',
    nominal_voltage_v: body.nominalVoltageV ?? 230,
    ze_ohm: body.zeOhm ?? null,
    pfc_ka: body.pfcKa ?? null,
    version: 1,
  };
  const { id } = await db.insertInto('sites').values(values).returning('id').executeTakeFirstOrThrow();
  await db
    .insertInto('site_history')
    .values({ site_id: id, field: null, action: 'created', old_text: null, new_text: stableJson(body), user_id: userId, at: new Date().toISOString(), version: 1 })
    .execute();
  return id;
}

export type FieldUpdateResult = { ok: true; version: number } | { ok: false; conflictingFields: string[] };

/**
 * Changes a site's details, one history row per changed field. A stale `baseVersion` is refused
 * only for fields somebody else changed after it (and now hold another value than the one sent):
 * two people may correct different details of one site at once.
 */
export async function updateSite(
  db: DB,
  site: SiteRow,
  baseVersion: number,
  changes: Partial<SiteFields>,
  userId: number,
): Promise<FieldUpdateResult> {
  const keys = (Object.keys(changes) as (keyof SiteFields)[]).filter((k) => k in siteColumns && changes[k] !== undefined);
  const current = (key: keyof SiteFields) => site[siteColumns[key]];
  if (baseVersion > site.version) return { ok: false, conflictingFields: keys };
  if (baseVersion < site.version && keys.length > 0) {
    const later = await db
      .selectFrom('site_history')
      .select('field')
      .where('site_id', '=', site.id)
      .where('action', '=', 'details')
      .where('version', '>', baseVersion)
      .where('field', 'in', keys)
      .execute();
    const conflicting = [...new Set(later.map((r) => r.field as keyof SiteFields))].filter((k) => !sameValue(current(k), changes[k]));
    if (conflicting.length > 0) return { ok: false, conflictingFields: conflicting };
  }
  const changed = keys.filter((k) => !sameValue(current(k), changes[k]));
  if (changed.length === 0) return { ok: true, version: site.version };
  const version = site.version + 1;
  const at = new Date().toISOString();
  const update: Record<string, unknown> = { version };
  for (const key of changed) {
    update[siteColumns[key]] = changes[key];
    await db
      .insertInto('site_history')
      .values({ site_id: site.id, field: key, action: 'details', old_text: stableJson(current(key)), new_text: stableJson(changes[key]), user_id: userId, at, version })
      .execute();
  }
  await db.updateTable('sites').set(update as Updateable<SiteTable>).where('id', '=', site.id).execute();
  return { ok: true, version };
}

/** Every board (or one job's boards) with its site, job, circuit count and filled reading cells. */
export async function listBoardSummaries(db: DB, jobId?: number) {
  let query = db
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
    ]);
  if (jobId !== undefined) query = query.where('boards.job_id', '=', jobId);
  const rows = await query.orderBy('sites.client').orderBy('jobs.visit_date', 'desc').orderBy('boards.reference').execute();
  const progress = await readingProgressByBoard(db, rows.map((r) => r.id));
  return rows.map((r) => ({ ...r, readings: progress.get(r.id) ?? { required: 0, done: 0 } }));
}

/**
 * The readings each board's circuits need and how many hold a value (`requiredProgress`), read in
 * two queries for all the boards listed: their circuits, and their reading cells holding text.
 */
async function readingProgressByBoard(db: DB, boardIds: readonly number[]): Promise<Map<number, { required: number; done: number }>> {
  const result = new Map<number, { required: number; done: number }>();
  if (boardIds.length === 0) return result;
  const circuits = await db.selectFrom('circuits').select(['id', 'board_id', 'kind', 'rcd_type', 'afdd']).where('board_id', 'in', [...boardIds]).execute();
  const cells = await db
    .selectFrom('cells')
    .innerJoin('circuits', 'circuits.id', 'cells.circuit_id')
    .select(['cells.circuit_id', 'cells.column_key'])
    .where('circuits.board_id', 'in', [...boardIds])
    .where('cells.text', '!=', '')
    .execute();
  const filled = new Map<number, Set<string>>();
  for (const cell of cells) {
    let set = filled.get(cell.circuit_id);
    if (!set) filled.set(cell.circuit_id, (set = new Set()));
    set.add(cell.column_key);
  }
  const byBoard = new Map<number, ProgressCircuit[]>();
  for (const c of circuits) {
    let list = byBoard.get(c.board_id);
    if (!list) byBoard.set(c.board_id, (list = []));
    list.push({ kind: c.kind, rcdType: c.rcd_type, afdd: c.afdd, filled: filled.get(c.id) ?? new Set() });
  }
  for (const [boardId, list] of byBoard) result.set(boardId, requiredProgress(list));
  return result;
}

export function toBoardSummary(r: Awaited<ReturnType<typeof listBoardSummaries>>[number]): BoardSummary {
  return {
    id: r.id,
    reference: r.reference,
    location: r.location,
    phases: r.phases,
    state: r.state,
    circuitCount: Number(r.circuit_count ?? 0),
    cellsFilled: Number(r.cells_filled ?? 0),
    readingsRequired: r.readings.required,
    readingsDone: r.readings.done,
    site: { id: r.site_id, client: r.site_client, address: r.site_address },
    job: { id: r.job_id, kind: r.job_kind, reference: r.job_reference },
  };
}
