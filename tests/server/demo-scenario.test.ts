import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import bcrypt from 'bcryptjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase, type DB } from '../../server/db/database.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { buildDemoScenario, demoAccounts, demoPassword, plantedFaults } from '../../server/db/seed/demo-scenario.ts';
import { databaseHasUsers, seedDemo } from '../../server/db/seed/seed-demo.ts';
import type { BoardRow, CellRow, CircuitRow } from '../../server/db/types.ts';
import { reviewJob } from '../../server/review/review-service.ts';

/** Conductor resistance at 20 °C (Ω/km), IEC 60228 Table 2 (class 2), typed here independently of the seed. */
const iec60228OhmPerKm: Record<number, number> = { 1: 18.1, 1.5: 12.1, 2.5: 7.41, 4: 4.61, 6: 3.08, 10: 1.83, 16: 1.15 };

interface LoadedCircuit extends CircuitRow {
  cells: Map<string, CellRow>;
}

interface LoadedBoard extends BoardRow {
  circuits: LoadedCircuit[];
}

let db: DB;
let close: () => void;
let dataDir: string;
let boards: LoadedBoard[];

async function loadBoards(): Promise<LoadedBoard[]> {
  const boardRows = await db.selectFrom('boards').selectAll().orderBy('id').execute();
  const circuitRows = await db.selectFrom('circuits').selectAll().orderBy('board_id').orderBy('position').execute();
  const cellRows = await db.selectFrom('cells').selectAll().execute();
  return boardRows.map((board) => ({
    ...board,
    circuits: circuitRows
      .filter((c) => c.board_id === board.id)
      .map((c) => ({ ...c, cells: new Map(cellRows.filter((cell) => cell.circuit_id === c.id).map((cell) => [cell.column_key, cell])) })),
  }));
}

function boardByReference(reference: string): LoadedBoard {
  const board = boards.find((b) => b.reference === reference);
  if (!board) throw new Error(`No board ${reference}`);
  return board;
}

function circuitOf(board: LoadedBoard, number: string): LoadedCircuit {
  const circuit = board.circuits.find((c) => c.number === number);
  if (!circuit) throw new Error(`No circuit ${number} on ${board.reference}`);
  return circuit;
}

/** The reading as a number, or null when the cell is empty or not a plain number. */
function reading(circuit: LoadedCircuit, key: string): number | null {
  const text = circuit.cells.get(key)?.text;
  if (text === undefined || !/^\d+(\.\d+)?$/.test(text)) return null;
  return Number(text);
}

function isPlanted(board: LoadedBoard, circuit: LoadedCircuit): boolean {
  return plantedFaults.some((f) => f.expectsFinding && f.boardReference === board.reference && f.circuitNumber === circuit.number);
}

const singlePhase = (): LoadedBoard => {
  const board = boards.find((b) => b.phases === 1);
  if (!board) throw new Error('No single-phase board');
  return board;
};
const threePhase = (): LoadedBoard => {
  const board = boards.find((b) => b.phases === 3);
  if (!board) throw new Error('No three-phase board');
  return board;
};

beforeAll(async () => {
  const opened = openDatabase(':memory:');
  db = opened.db;
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'boardwalk-demo-seed-'));
  close = () => {
    opened.sqlite.close();
    fs.rmSync(dataDir, { recursive: true, force: true });
  };
  await migrateToLatest(db);
  expect(await databaseHasUsers(db)).toBe(false);
  await seedDemo(db, { dataDir });
  boards = await loadBoards();
});

afterAll(() => close());

describe('demo scenario seed', () => {
  it('when the demo is seeded, then there is one user per role, each signing in with the demo password', async () => {
    const users = await db.selectFrom('users').selectAll().orderBy('id').execute();
    expect(await databaseHasUsers(db)).toBe(true);
    expect(users.map((u) => [u.email, u.role])).toEqual([
      ['admin@boardwalk.test', 'admin'],
      ['tester@boardwalk.test', 'tester'],
      ['reviewer@boardwalk.test', 'reviewer'],
    ]);
    expect(users.map((u) => u.name)).toEqual(demoAccounts.map((a) => a.name));
    for (const user of users) {
      expect(user.password_hash).toMatch(/^\$2[aby]\$10\$/);
      expect(await bcrypt.compare(demoPassword, user.password_hash)).toBe(true);
    }
  });

  it('when the demo is seeded, then there are two sites with an EIC and an EICR and plausible supplies', async () => {
    const sites = await db.selectFrom('sites').selectAll().execute();
    const jobs = await db.selectFrom('jobs').selectAll().execute();
    expect(sites.length).toBeGreaterThanOrEqual(2);
    for (const site of sites) {
      expect(['TN-S', 'TN-C-S', 'TT']).toContain(site.earthing);
      expect(site.nominal_voltage_v).toBe(230);
      expect(site.ze_ohm).toBeGreaterThan(0);
      expect(site.pfc_ka).toBeGreaterThan(0);
    }
    expect(jobs.map((j) => j.kind).sort()).toEqual(['EIC', 'EICR']);
    expect(jobs.every((j) => j.limitations.length > 0)).toBe(true);
  });

  it('when the demo is seeded, then a 12–16 way single-phase board and a 60+ way three-phase board exist, positions 1..n', () => {
    expect(singlePhase().circuits.length).toBeGreaterThanOrEqual(12);
    expect(singlePhase().circuits.length).toBeLessThanOrEqual(16);
    expect(threePhase().circuits.length).toBeGreaterThanOrEqual(60);
    for (const board of boards) {
      expect(board.version).toBe(1);
      expect(board.state).toBe('open');
      expect(board.zdb_ohm).toBeGreaterThan(0);
      expect(board.ipf_ka).toBeGreaterThan(0);
      expect(board.circuits.map((c) => c.position)).toEqual(board.circuits.map((_, i) => i + 1));
      expect(board.circuits.every((c) => c.version === 1)).toBe(true);
      // Ipf must not exceed any device's breaking capacity (BS 7671:2018 434.5.1).
      for (const c of board.circuits) expect(c.breaking_ka ?? 0).toBeGreaterThanOrEqual(board.ipf_ka ?? 0);
    }
  });

  it('when the three-phase board is read, then circuits are numbered per phase and the mix of devices is there', () => {
    const board = threePhase();
    for (const c of board.circuits) {
      const match = /^(\d+)(L1|L2|L3|TP)$/.exec(c.number);
      expect(match, c.number).not.toBeNull();
      expect(c.phase).toBe(match?.[2]);
    }
    expect(board.circuits.filter((c) => c.phase === 'TP').length).toBeGreaterThanOrEqual(2);
    expect(new Set(board.circuits.map((c) => c.device_type))).toEqual(new Set(['B', 'C', 'D', 'gG']));
    expect(board.circuits.some((c) => c.device_standard === '88-2' && c.device_type === 'gG')).toBe(true);
    const distribution = board.circuits.filter((c) => c.kind === 'distribution');
    expect(distribution.length).toBeGreaterThan(0);
    // Distribution circuits: 5 s (BS 7671:2018 411.3.2.3, TN).
    expect(distribution.every((c) => c.max_disconnection_s === 5)).toBe(true);
    expect(board.circuits.some((c) => c.kind === 'ring')).toBe(true);
  });

  it('when the boards are read, then every circuit of both boards has every reading a schedule needs', () => {
    for (const board of boards) {
      for (const c of board.circuits) {
        // Common practice (BS 7671 model schedules): continuity, insulation, polarity and Zs on every
        // circuit; the ring's ends on a ring; the RCD's time and button where there is an RCD.
        const needed = ['r1PlusR2', 'irTestVoltage', 'irLiveLive', 'irLiveEarth', 'polarity', 'zs', 'rcdTimeMs', 'rcdButton', 'afddButton'];
        if (c.kind === 'ring') needed.push('ringR1', 'ringRn', 'ringR2');
        for (const key of needed) expect(c.cells.has(key), `${board.reference} ${c.number} ${key}`).toBe(true);
      }
    }
  });

  it('when the ring finals are read, then correct rings follow IEC 60228 ratios and (r1+r2)/4', () => {
    let checked = 0;
    for (const board of boards) {
      for (const ring of board.circuits.filter((c) => c.kind === 'ring' && !isPlanted(board, c))) {
        const r1 = reading(ring, 'ringR1');
        const rn = reading(ring, 'ringRn');
        const r2 = reading(ring, 'ringR2');
        const r1PlusR2 = reading(ring, 'r1PlusR2');
        if (r1 === null || rn === null || r2 === null || r1PlusR2 === null) continue;
        checked += 1;
        const live = iec60228OhmPerKm[ring.live_csa_mm2 ?? 0];
        const cpc = iec60228OhmPerKm[ring.cpc_csa_mm2 ?? 0];
        if (live === undefined || cpc === undefined) throw new Error(`Unexpected csa on ${ring.number}`);
        // r2/r1 equals the ratio of the conductors' resistances: IEC 60228 Table 2, e.g. 12.1/7.41 for 2.5/1.5 mm².
        expect(Math.abs(r2 / r1 / (cpc / live) - 1), `${board.reference} ${ring.number} r2/r1`).toBeLessThanOrEqual(0.02);
        // r1 and rn are the same cable: within 0.05 Ω (common practice).
        expect(Math.abs(rn - r1), `${ring.number} rn`).toBeLessThanOrEqual(0.05);
        // Cross-connected ring: R1+R2 = (r1+r2)/4 (two parallel paths), plus the small spread of the sockets.
        expect(Math.abs(r1PlusR2 - (r1 + r2) / 4), `${ring.number} R1+R2`).toBeLessThanOrEqual(0.02);
      }
    }
    expect(checked).toBeGreaterThanOrEqual(8);
    // The single-phase board's first 2.5/1.5 ring, by name: 12.1/7.41 = 1.633 (IEC 60228 Table 2).
    const kitchen = circuitOf(singlePhase(), '3');
    expect((reading(kitchen, 'ringR2') ?? 0) / (reading(kitchen, 'ringR1') ?? 1)).toBeCloseTo(12.1 / 7.41, 1);
  });

  it('when the spur is read, then it references its ring and adds its own cable to the ring value', () => {
    const board = singlePhase();
    const spurs = board.circuits.filter((c) => c.kind === 'spur');
    expect(spurs.length).toBeGreaterThanOrEqual(1);
    for (const spur of spurs) {
      const ring = board.circuits.find((c) => c.id === spur.spur_ring_id);
      expect(ring?.kind).toBe('ring');
      expect(spur.spur_origin_point).toMatch(/socket \d+/);
      expect(spur.spur_length_m).toBeGreaterThan(0);
      if (!ring) continue;
      // Spur R1+R2 = ring value at its origin + length × (r_live + r_cpc) per metre (IEC 60228: 7.41 + 12.1 mΩ/m for 2.5/1.5).
      const perMetre = ((iec60228OhmPerKm[spur.live_csa_mm2 ?? 0] ?? 0) + (iec60228OhmPerKm[spur.cpc_csa_mm2 ?? 0] ?? 0)) / 1000;
      const expected = (reading(ring, 'r1PlusR2') ?? 0) + (spur.spur_length_m ?? 0) * perMetre;
      expect(Math.abs((reading(spur, 'r1PlusR2') ?? 0) - expected)).toBeLessThanOrEqual(0.02);
    }
  });

  it('when a radial with its cable length is read, then R1+R2 lies between the cable at 20 °C and at 70 °C', () => {
    let checked = 0;
    for (const board of boards) {
      for (const c of board.circuits.filter((x) => x.cable_length_m !== null && !isPlanted(board, x))) {
        const r1PlusR2 = reading(c, 'r1PlusR2');
        if (r1PlusR2 === null) continue;
        checked += 1;
        // Length × (line + cpc) per metre, IEC 60228 Table 2 at 20 °C; × 1.20 at 70 °C (thermoplastic,
        // [memory: IET Guidance Note 3]); ± 0.01 Ω for the two decimals and the meter's last digit.
        const perMetre = ((iec60228OhmPerKm[c.live_csa_mm2 ?? 0] ?? NaN) + (iec60228OhmPerKm[c.cpc_csa_mm2 ?? 0] ?? NaN)) / 1000;
        const cold = (c.cable_length_m ?? 0) * perMetre;
        expect(r1PlusR2, `${board.reference} ${c.number}`).toBeGreaterThanOrEqual(cold - 0.015);
        expect(r1PlusR2, `${board.reference} ${c.number}`).toBeLessThanOrEqual(cold * 1.2 + 0.015);
      }
    }
    expect(checked).toBeGreaterThan(40);
  });

  it('when the readings are read, then radial R1+R2 and Zs hang together and RCD times are N/A only without an RCD', () => {
    for (const board of boards) {
      for (const c of board.circuits) {
        const r1PlusR2 = reading(c, 'r1PlusR2');
        const zs = reading(c, 'zs');
        if (r1PlusR2 !== null && zs !== null && !isPlanted(board, c)) {
          // Zs ≈ Zdb + R1+R2, a little lower where parallel earth paths exist.
          expect(Math.abs(zs - ((board.zdb_ohm ?? 0) + r1PlusR2)), `${board.reference} ${c.number} Zs`).toBeLessThanOrEqual(0.03);
        }
        const rcdTime = c.cells.get('rcdTimeMs')?.text;
        if (rcdTime === undefined) continue;
        if (c.rcd_type === null) expect(rcdTime).toBe('N/A');
        else {
          expect(Number(rcdTime)).toBeGreaterThan(0);
          // General (non-delay) RCD at IΔn: ≤ 300 ms (BS EN 61008-1 / 61009-1).
          expect(Number(rcdTime)).toBeLessThanOrEqual(300);
        }
      }
    }
  });

  it('when the cells are read, then each is typed text in the trade forms, version 1, by the tester, with no history', async () => {
    const tester = await db.selectFrom('users').select('id').where('role', '=', 'tester').executeTakeFirstOrThrow();
    const cells = await db.selectFrom('cells').selectAll().execute();
    expect(cells.length).toBeGreaterThan(300);
    for (const cell of cells) {
      expect(cell.text).toMatch(/^(\d+(\.\d+)?|>\d+|N\/A|LIM|✓|✗)$/);
      expect(cell.version).toBe(1);
      expect(cell.updated_by).toBe(tester.id);
      expect(new Date(cell.updated_at).toISOString()).toBe(cell.updated_at);
    }
    const history = await db.selectFrom('history').select('id').execute();
    expect(history).toHaveLength(0);
  });

  it('when the scenario is built twice, then it is the same both times', () => {
    expect(buildDemoScenario()).toEqual(buildDemoScenario());
  });
});

describe('the demo EICR, waiting for review', () => {
  const eicrJob = () => db.selectFrom('jobs').selectAll().where('kind', '=', 'EICR').executeTakeFirstOrThrow();

  it('when its findings are checked, then its only errors are the planted ones and nothing is left to do', async () => {
    const job = await eicrJob();
    const review = await reviewJob(db, job);
    const numbers = new Map(boards.flatMap((b) => b.circuits.map((c) => [c.id, `${b.reference} ${c.number}`] as const)));
    const errors = review.boards.flatMap((b) => b.findings.filter((f) => f.severity === 'error').map((f) => `${f.circuitId === null ? b.context.board.reference : numbers.get(f.circuitId)} ${f.code}`));
    const planted = plantedFaults
      .filter((f) => f.expectsFinding && boards.some((b) => b.job_id === job.id && b.reference === f.boardReference))
      .map((f) => `${f.boardReference} ${f.circuitNumber}`);
    expect(planted).toHaveLength(3);
    expect(errors.map((e) => e.split(' ').slice(0, 2).join(' ')).sort()).toEqual([...planted].sort());
    expect(errors.sort()).toEqual(['MDB-1 5L1 ir-below-minimum', 'MDB-1 6L1 zs-over-max', 'MDB-1 9L3 lim-without-reason']);
    const todo = review.boards.flatMap((b) => b.findings.filter((f) => (f.severity as string) === 'todo'));
    expect(todo).toEqual([]);
    // And no warning either: the filled readings are consistent (the checker agrees, see the tests above).
    expect(review.boards.flatMap((b) => b.findings.filter((f) => f.severity === 'warning'))).toEqual([]);
    // The job record itself raises no error finding.
    expect(review.jobFindings.filter((f) => f.severity === 'error')).toEqual([]);
  });

  it('when the jobs are read, then the EICR is ready for review with the tester’s note and the EIC is still being entered', async () => {
    const tester = await db.selectFrom('users').select('id').where('email', '=', 'tester@boardwalk.test').executeTakeFirstOrThrow();
    const jobs = await db.selectFrom('jobs').select(['id', 'kind', 'state', 'version']).orderBy('id').execute();
    expect(jobs.map((j) => [j.kind, j.state])).toEqual([['EIC', 'entering'], ['EICR', 'ready']]);
    const eicr = jobs.find((j) => j.kind === 'EICR')!;
    const entries = await db.selectFrom('job_history').selectAll().where('job_id', '=', eicr.id).where('action', '=', 'state').execute();
    expect(entries).toHaveLength(1);
    expect(entries[0]).toMatchObject({ old_text: '"entering"', new_text: '"ready"', user_id: tester.id, version: eicr.version });
    expect(entries[0]!.reason).toMatch(/9L3/);
    const eic = jobs.find((j) => j.kind === 'EIC')!;
    expect(await db.selectFrom('job_history').select('id').where('job_id', '=', eic.id).execute()).toEqual([]);
    expect(await db.selectFrom('signatures').select('id').where('job_id', '=', eic.id).execute()).toEqual([]);
  });

  it('when its signatures are read, then the tester has signed as inspector with a PNG kept under the data folder and its SHA-256', async () => {
    const job = await eicrJob();
    const tester = await db.selectFrom('users').select(['id', 'name']).where('email', '=', 'tester@boardwalk.test').executeTakeFirstOrThrow();
    const rows = await db.selectFrom('signatures').innerJoin('files', 'files.id', 'signatures.file_id').select(['signatures.role', 'signatures.name', 'signatures.user_id', 'files.path', 'files.sha256', 'files.mime', 'files.size_bytes', 'files.kind']).where('signatures.job_id', '=', job.id).execute();
    expect(rows.map((r) => [r.role, r.name, r.user_id, r.kind, r.mime])).toEqual([['inspector', tester.name, tester.id, 'signature', 'image/png']]);
    const bytes = fs.readFileSync(path.join(dataDir, rows[0]!.path));
    expect(bytes.length).toBe(rows[0]!.size_bytes);
    expect(crypto.createHash('sha256').update(bytes).digest('hex')).toBe(rows[0]!.sha256);
    // PNG signature bytes and the IHDR chunk (ISO/IEC 15948): 600 × 200, 8-bit greyscale.
    expect(bytes.subarray(0, 8)).toEqual(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]));
    expect(bytes.subarray(12, 16).toString('ascii')).toBe('IHDR');
    expect([bytes.readUInt32BE(16), bytes.readUInt32BE(20), bytes[24], bytes[25]]).toEqual([600, 200, 8, 0]);
    const history = await db.selectFrom('job_history').selectAll().where('job_id', '=', job.id).where('action', '=', 'signed').execute();
    expect(history.map((h) => h.field)).toEqual(['inspector']);
  });
});

describe('planted faults', () => {
  it.each(plantedFaults.map((f) => [f.id, f] as const))('when %s is looked for, then its cells are in the data as planted', (_id, fault) => {
    const circuit = circuitOf(boardByReference(fault.boardReference), fault.circuitNumber);
    for (const [key, planted] of Object.entries(fault.cells)) {
      const cell = circuit.cells.get(key);
      expect(cell?.text, key).toBe(planted.text);
      expect(cell?.reason ?? null, key).toBe(planted.reason);
    }
    for (const key of fault.columns) expect(circuit.cells.has(key)).toBe(true);
  });

  it('when the Zs fault is checked, then Zs is over the B32 maximum of 1.37 Ω', () => {
    const fault = plantedFaults.find((f) => f.id === 'zs-over-max');
    if (!fault) throw new Error('missing');
    const circuit = circuitOf(boardByReference(fault.boardReference), fault.circuitNumber);
    expect([circuit.device_type, circuit.rating_a, circuit.rcd_type]).toEqual(['B', 32, null]);
    // BS 7671:2018 Table 41.3 / Regulation 411.4.4: Zs ≤ Cmin·U0/Ia = 0.95 × 230 / (5 × 32) = 1.37 Ω.
    const maxZs = Math.round(((0.95 * 230) / (5 * 32)) * 100) / 100;
    expect(maxZs).toBe(1.37);
    expect(reading(circuit, 'zs')).toBeGreaterThan(maxZs);
  });

  it('when the wrongly linked ring is checked, then R1+R2 is about (r1+r2)/2, far from (r1+r2)/4', () => {
    const fault = plantedFaults.find((f) => f.id === 'ring-ends-linked-wrongly');
    if (!fault) throw new Error('missing');
    const ring = circuitOf(boardByReference(fault.boardReference), fault.circuitNumber);
    expect(ring.kind).toBe('ring');
    const r1 = reading(ring, 'ringR1') ?? 0;
    const r2 = reading(ring, 'ringR2') ?? 0;
    const r1PlusR2 = reading(ring, 'r1PlusR2') ?? 0;
    // A correctly cross-connected ring reads (r1+r2)/4; this one reads about twice that.
    expect(r1PlusR2 - (r1 + r2) / 4).toBeGreaterThan(0.2);
    expect(Math.abs(r1PlusR2 - (r1 + r2) / 2)).toBeLessThanOrEqual(0.01);
  });

  it('when the insulation fault is checked, then L-E is below 1.0 MΩ at 500 V', () => {
    const fault = plantedFaults.find((f) => f.id === 'insulation-below-minimum');
    if (!fault) throw new Error('missing');
    const circuit = circuitOf(boardByReference(fault.boardReference), fault.circuitNumber);
    expect(circuit.cells.get('irTestVoltage')?.text).toBe('500');
    // BS 7671:2018 Table 64: circuits up to 500 V, tested at 500 V DC, at least 1.0 MΩ.
    expect(reading(circuit, 'irLiveEarth')).toBeLessThan(1.0);
  });

  it('when the LIMs are checked, then one has no reason and the other has one', () => {
    const without = plantedFaults.find((f) => f.id === 'lim-without-reason');
    const withReason = plantedFaults.find((f) => f.id === 'lim-with-reason');
    if (!without || !withReason) throw new Error('missing');
    const bare = circuitOf(boardByReference(without.boardReference), without.circuitNumber).cells.get('irLiveLive');
    const explained = circuitOf(boardByReference(withReason.boardReference), withReason.circuitNumber).cells.get('irLiveLive');
    expect([bare?.text, bare?.reason]).toEqual(['LIM', null]);
    expect(explained?.text).toBe('LIM');
    expect(explained?.reason?.length ?? 0).toBeGreaterThan(10);
    expect(withReason.expectsFinding).toBe(false);
  });
});
