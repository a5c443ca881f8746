import type { BoardSummary } from '../../../shared/schemas/boards.ts';
import type { Job, Site } from '../../../shared/schemas/sites.ts';

/** Two invented sites: one with an EICR of two boards, one with an EIC of one locked board. */
export const sites: Site[] = [
  { id: 1, client: 'Harbour Bakery', address: '4 Quay Street, Porthmoor', description: '', contactName: '', contactEmail: '', earthing: 'TN-C-S', nominalVoltageV: 230, zeOhm: 0.21, pfcKa: 2.1, version: 1 },
  { id: 2, client: 'Ellis Lodge', address: '12 Fern Road, Ashby', description: '', contactName: '', contactEmail: '', earthing: 'TT', nominalVoltageV: 230, zeOhm: 21, pfcKa: 0.4, version: 1 },
  { id: 3, client: 'Tollgate Garage', address: '1 Mill Lane, Ashby', description: '', contactName: '', contactEmail: '', earthing: 'TN-S', nominalVoltageV: 230, zeOhm: null, pfcKa: null, version: 1 },
];

export const jobs: Job[] = [
  { id: 10, siteId: 1, kind: 'EICR', reference: 'HB-2026-01', visitDate: '2026-11-20', visitEndDate: null, limitations: '', state: 'entering', startedFromJobId: null, createdAt: '2026-11-01T09:00:00.000Z', version: 1 },
  { id: 20, siteId: 2, kind: 'EIC', reference: 'EL-NEW-3', visitDate: '2026-10-02', visitEndDate: null, limitations: '', state: 'entering', startedFromJobId: null, createdAt: '2026-11-01T09:00:00.000Z', version: 1 },
];

const board = (id: number, jobId: number, reference: string, location: string, state: 'open' | 'locked', circuitCount: number, cellsFilled: number): BoardSummary => {
  const job = jobs.find((j) => j.id === jobId)!;
  const site = sites.find((s) => s.id === job.siteId)!;
  return {
    id,
    reference,
    location,
    phases: 1,
    state,
    circuitCount,
    cellsFilled,
    // Radials without an RCD need six readings each (the checker's required columns).
    readingsRequired: circuitCount * 6,
    readingsDone: Math.min(cellsFilled, circuitCount * 6),
    site: { id: site.id, client: site.client, address: site.address },
    job: { id: job.id, kind: job.kind, reference: job.reference },
  };
};

export const boards: BoardSummary[] = [
  board(101, 10, 'DB1', 'Shop floor', 'open', 12, 40),
  board(102, 10, 'DB2', 'Ovens', 'open', 6, 0),
  board(201, 20, 'CU', 'Hall cupboard', 'locked', 8, 104),
];
