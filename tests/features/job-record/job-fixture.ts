import { checkJob } from '../../../shared/checker/index.ts';
import type { BoardSummary } from '../../../shared/schemas/boards.ts';
import { blankSection, jobSectionKeys, parseSectionChanges, type JobSectionData, type JobSectionKey } from '../../../shared/schemas/job-record.ts';
import type { Job, Site } from '../../../shared/schemas/sites.ts';
import { json, type ApiCall } from '../../helpers/render.tsx';

/** An invented site and job: a condition report on a small café, one board. */
export const site: Site = {
  id: 7,
  client: 'Lantern Row Café',
  address: '3 Lantern Row, Millbrook',
  description: 'Café with a kitchen at the back',
  contactName: 'Priya Okafor',
  contactEmail: 'priya@lantern-row.example',
  earthing: 'TN-C-S',
  nominalVoltageV: 230,
  zeOhm: 0.28,
  pfcKa: 1.9,
  version: 1,
};

export const job = (kind: 'EIC' | 'EICR' = 'EICR', state: Job['state'] = 'entering'): Job => ({
  id: 41,
  siteId: site.id,
  kind,
  reference: `${kind}-2026-0041`,
  visitDate: '2026-11-20',
  visitEndDate: null,
  limitations: '',
  state,
  startedFromJobId: null,
  createdAt: '2026-11-20T08:00:00.000Z',
  version: 1,
});

export const board: BoardSummary = {
  id: 301,
  reference: 'DB-K',
  location: 'Kitchen store',
  phases: 1,
  state: 'open',
  circuitCount: 10,
  cellsFilled: 4,
  readingsRequired: 60,
  readingsDone: 4,
  site: { id: site.id, client: site.client, address: site.address },
  job: { id: 41, kind: 'EICR', reference: 'EICR-2026-0041' },
};

/**
 * A small fake of the job record API, keeping per-field versions like the real one: a write is
 * refused (409, current section in `details`) only when a field it sends changed after the
 * version it carries. Findings come from the shared checker's job rules.
 */
export function createFakeJobServer(kind: 'EIC' | 'EICR' = 'EICR', state: Job['state'] = 'entering') {
  const record = Object.fromEntries(jobSectionKeys.map((key) => [key, { data: blankSection(key), version: 0 }])) as {
    [K in JobSectionKey]: { data: JobSectionData[K]; version: number };
  };
  /** section.field → version at which it last changed. */
  const changedAt = new Map<string, number>();
  const history: unknown[] = [];
  const theJob = job(kind, state);
  let locked = state === 'approved' || state === 'issued';
  const findings = () => checkJob({ kind, record: Object.fromEntries(jobSectionKeys.map((k) => [k, record[k].data])) as JobSectionData, boards: [] });

  const detail = () => ({ job: theJob, site, boards: [board], record: structuredClone(record), findings: findings(), cursor: 1 });

  /** Someone else writes a field (for conflict tests). */
  function writeAsOther(section: JobSectionKey, field: string, value: unknown) {
    const entry = record[section];
    entry.version += 1;
    (entry.data as Record<string, unknown>)[field] = value;
    changedAt.set(`${section}.${field}`, entry.version);
  }

  function put(call: ApiCall) {
    const section = call.path.split('/').pop() as JobSectionKey;
    const body = call.body as { version: number; changes: Record<string, unknown> };
    if (locked) return json(423, { error: { code: 'locked', message: 'This job is approved: its record can no longer change.' } });
    const parsed = parseSectionChanges(section, body.changes);
    if (!parsed.success) {
      return json(400, { error: { code: 'bad_request', message: parsed.error.issues[0]!.message, issues: parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })) } });
    }
    const entry = record[section];
    const stale = Object.keys(body.changes).filter((field) => (changedAt.get(`${section}.${field}`) ?? 0) > body.version);
    if (stale.length > 0) {
      return json(409, { error: { code: 'conflict', message: 'Someone else changed this since.', details: { data: entry.data, version: entry.version } } });
    }
    entry.version += 1;
    for (const [field, value] of Object.entries(parsed.data as Record<string, unknown>)) {
      const oldValue = (entry.data as Record<string, unknown>)[field] ?? null;
      history.push({ id: history.length + 1, section, field, action: 'record', oldValue, newValue: value, reason: null, by: { id: 2, name: 'Dana Whitlock' }, at: '2026-11-20T10:15:00.000Z' });
      if (value === null && (section === 'inspections' || section === 'observations')) delete (entry.data as Record<string, unknown>)[field];
      else (entry.data as Record<string, unknown>)[field] = value;
      changedAt.set(`${section}.${field}`, entry.version);
    }
    return json(200, { section: structuredClone(entry), findings: findings(), cursor: 2 });
  }

  return {
    record,
    writeAsOther,
    lock: () => {
      locked = true;
    },
    /** Someone else moves the job on (submits, approves…): its state and version change. */
    setJobState: (next: Job['state']) => {
      theJob.state = next;
      theJob.version += 1;
      locked = next === 'approved' || next === 'issued';
    },
    handlers: {
      [`GET /api/jobs/${theJob.id}`]: () => json(200, detail()),
      [`GET /api/jobs/${theJob.id}/history`]: () => json(200, { entries: history }),
      ...Object.fromEntries(jobSectionKeys.map((key) => [`PUT /api/jobs/${theJob.id}/record/${key}`, put])),
      [`GET /api/boards/${board.id}`]: () =>
        json(200, {
          circuits: [
            { id: 9001, number: '1', description: 'Kitchen sockets' },
            { id: 9002, number: '2', description: 'Café lighting' },
          ],
        }),
      'GET /api/sites': () => json(200, { sites: [site] }),
      'GET /api/jobs': () => json(200, { jobs: [theJob] }),
      'GET /api/boards': () => json(200, { boards: [board] }),
    } as Record<string, (call: ApiCall) => Response | Promise<Response>>,
  };
}
