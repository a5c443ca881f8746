import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { openDatabase, type DB } from '../../server/db/database.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { demoPassword, plantedFaults } from '../../server/db/seed/demo-scenario.ts';
import { seedDemo } from '../../server/db/seed/seed-demo.ts';
import { inspectionItemIds } from '../../shared/schemas/inspection-items.ts';
import { jobDetailResponseSchema, type JobDetail } from '../../shared/schemas/jobs.ts';
import { overallAssessment, sectionsFor, usualIntervalMonths, type JobSectionData, type Observation } from '../../shared/schemas/job-record.ts';
import { siteListResponseSchema } from '../../shared/schemas/sites.ts';
import { asOwnPage } from '../helpers/test-app.ts';

let db: DB;
let close: () => void;
let agent: ReturnType<typeof request.agent>;
let eic: JobDetail;
let eicr: JobDetail;

beforeAll(async () => {
  const opened = openDatabase(':memory:');
  db = opened.db;
  await migrateToLatest(db);
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'boardwalk-demo-records-'));
  await seedDemo(db, { dataDir });
  close = () => {
    opened.sqlite.close();
    fs.rmSync(dataDir, { recursive: true, force: true });
  };
  const app = asOwnPage(createApp({ db, sqlite: opened.sqlite, sessionSecret: 'demo-records-test', signInAttemptsPerMinute: 1000, dataDir }));
  agent = request.agent(app);
  expect((await agent.post('/api/auth/sign-in').send({ email: 'tester@boardwalk.test', password: demoPassword })).status).toBe(200);
  const jobs = await db.selectFrom('jobs').select(['id', 'kind']).execute();
  const detail = async (kind: string) => {
    const res = await agent.get(`/api/jobs/${jobs.find((j) => j.kind === kind)!.id}`);
    expect(res.status).toBe(200);
    return jobDetailResponseSchema.parse(res.body) as JobDetail;
  };
  eic = await detail('EIC');
  eicr = await detail('EICR');
});
afterAll(() => close());

const observations = (job: JobDetail): Observation[] =>
  Object.values(job.record.observations.data as JobSectionData['observations']).filter((o): o is Observation => o !== null);

describe('the demo jobs’ records', () => {
  it('when a demo job is read, then every section of its kind is filled (version 1) and every inspection item has an outcome', () => {
    for (const job of [eic, eicr]) {
      for (const key of sectionsFor(job.job.kind)) expect(job.record[key].version, `${job.job.kind} ${key}`).toBe(1);
      expect(Object.keys(job.record.inspections.data).sort()).toEqual([...inspectionItemIds].sort());
      expect(Object.values(job.record.inspections.data).every((outcome) => outcome !== null)).toBe(true);
      const extent = job.record.extent.data as JobSectionData['extent'];
      // Every limitation is recorded with its reason (common practice).
      expect(extent.limitations.length).toBeGreaterThan(0);
      expect(extent.limitations.every((l) => l.reason.trim().length > 0)).toBe(true);
      expect((job.record.declaration.data as JobSectionData['declaration']).inspector.name).not.toBe('');
    }
  });

  it('when the report’s observations are read, then there are several of each code and the report is unsatisfactory', () => {
    const list = observations(eicr);
    for (const code of ['C1', 'C2', 'C3', 'FI'] as const) expect(list.filter((o) => o.code === code).length, code).toBeGreaterThanOrEqual(2);
    expect(list.every((o) => o.code !== null)).toBe(true);
    expect(new Set(list.map((o) => o.number)).size).toBe(list.length);
    // Any C1, C2 or FI makes a condition report unsatisfactory (BS 7671:2018 Appendix 6, notes on the EICR).
    expect(overallAssessment(eicr.record.observations.data as JobSectionData['observations']).assessment).toBe('unsatisfactory');
  });

  it('when the planted Zs fault is looked for, then a C2 observation is tied to its board and circuit', async () => {
    const fault = plantedFaults.find((f) => f.id === 'zs-over-max')!;
    const board = eicr.boards.find((b) => b.reference === fault.boardReference)!;
    const circuit = await db.selectFrom('circuits').select('id').where('board_id', '=', board.id).where('number', '=', fault.circuitNumber).executeTakeFirstOrThrow();
    expect(observations(eicr).filter((o) => o.boardId === board.id && o.circuitId === circuit.id).map((o) => o.code)).toEqual(['C2']);
  });

  it('when items are coded C1, C2 or C3, then each has an observation naming it, and the job checker finds none missing', () => {
    const named = new Set(observations(eicr).map((o) => o.inspectionItem));
    const coded = Object.entries(eicr.record.inspections.data as JobSectionData['inspections']).filter(([, outcome]) => outcome === 'C1' || outcome === 'C2' || outcome === 'C3');
    expect(coded.length).toBeGreaterThanOrEqual(3);
    for (const [item] of coded) expect(named.has(item), item).toBe(true);
    expect(eicr.findings.filter((f) => f.code === 'inspection-coded-without-observation')).toEqual([]);
    // A certificate marks items acceptable or not; codes belong to the report.
    expect(Object.values(eic.record.inspections.data).every((o) => o === 'ok' || o === 'N/A')).toBe(true);
  });

  it('when the supply and origin are read, then they agree with the site and the boards and the bonding is big enough', () => {
    for (const job of [eic, eicr]) {
      const supply = job.record.supply.data as JobSectionData['supply'];
      expect(supply).toMatchObject({ earthing: job.site.earthing, zeOhm: job.site.zeOhm, ipfKa: job.site.pfcKa, u0V: job.site.nominalVoltageV });
    }
    const house = eic.record.origin.data as JobSectionData['origin'];
    // PME (TN-C-S), supply neutral up to 35 mm²: main bonding at least 10 mm² copper — BS 7671:2018 Table 54.8 [memory].
    expect((eic.record.supply.data as JobSectionData['supply']).supplyNeutralCsaMm2).toBeLessThanOrEqual(35);
    expect(house.bondingConductorCsaMm2).toBeGreaterThanOrEqual(10);
    const bakery = eicr.record.origin.data as JobSectionData['origin'];
    // Not PME: at least half the earthing conductor's csa and not less than 6 mm² — BS 7671:2018 544.1.1 [memory].
    expect(bakery.bondingConductorCsaMm2).toBeGreaterThanOrEqual(Math.max(6, bakery.earthingConductorCsaMm2! / 2));
    // The gas bonding that is missing is the C2 on item 3.3.
    expect(bakery.bondedGas).toBe('no');
    expect(observations(eicr).find((o) => o.inspectionItem === '3.3')?.code).toBe('C2');
  });

  it('when the next inspection is read, then the certificate uses the usual interval and the report a shorter one with its reason', () => {
    // Usual intervals: domestic 10 years, commercial 5 — IET Guidance Note 3 Table 3.2 [memory].
    const eicSummary = eic.record.summary.data as JobSectionData['summary'];
    expect(eicSummary.nextInspectionMonths).toBe(usualIntervalMonths.domestic);
    const eicrSummary = eicr.record.summary.data as JobSectionData['summary'];
    expect(eicrSummary.nextInspectionMonths).toBeLessThan(usualIntervalMonths.commercial!);
    expect(eicrSummary.nextInspectionReason).not.toBe('');
  });

  it('when the demo sites are listed, then each has a contact with an e-mail at the reserved .test domain', async () => {
    const { sites } = siteListResponseSchema.parse((await agent.get('/api/sites')).body);
    expect(sites).toHaveLength(2);
    // .test is reserved for testing and never delivered (RFC 6761 section 6.2).
    for (const site of sites) {
      expect(site.contactName).not.toBe('');
      expect(site.contactEmail).toMatch(/^[^@\s]+@[^@\s]+\.test$/);
    }
  });

  it('when a new report is started on the demo, then its reference continues the demo company’s numbering', async () => {
    const res = await agent.post('/api/jobs').send({ siteId: eicr.site.id, kind: 'EICR', visitDate: '2026-12-09' });
    expect(res.status).toBe(201);
    expect(res.body.job.reference).toBe('KVE-EICR-2026-058');
  });
});
