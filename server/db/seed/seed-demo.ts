import bcrypt from 'bcryptjs';
import type { Insertable, Transaction } from 'kysely';
import type { DB } from '../database.ts';
import type { CellTable, Database } from '../types.ts';
import { jobSectionKeySchema, jobSectionSchemas, type JobSectionKey } from '../../../shared/schemas/job-record.ts';
import { FileStore } from '../../files.ts';
import { buildDemoScenario, demoPassword, type DemoBoard, type DemoJob } from './demo-scenario.ts';
import { demoSignaturePng } from './signature-image.ts';

/** bcrypt work factor for the demo accounts. */
const bcryptCost = 10;

/** True when any user exists: the server seeds the demo only into an empty database. */
export async function databaseHasUsers(db: DB): Promise<boolean> {
  const row = await db.selectFrom('users').select('id').limit(1).executeTakeFirst();
  return row !== undefined;
}

/**
 * Inserts the demo scenario (users, sites, jobs, boards, circuits, reading cells) in one
 * transaction: either all of it lands or none. Expects an empty database (the demo emails are
 * unique); call `databaseHasUsers` first.
 *
 * Seeded cells get no history rows: history records the changes people make after the starting
 * state, and the seed *is* the starting state. Every cell is version 1, typed by the tester.
 *
 * A job the scenario marks as submitted (the EICR) is seeded ready for review: a job history
 * entry of its submission with the tester's note (the one people make through the job screen,
 * so the review queue shows who and when), and the inspector's signature, a PNG drawn in code
 * and stored under `dataDir` like any uploaded signature.
 */
export async function seedDemo(db: DB, options: { dataDir: string }): Promise<void> {
  const files = new FileStore(options.dataDir);
  const storedPaths: string[] = [];
  const scenario = buildDemoScenario();
  // Hash before the transaction opens: bcrypt is slow on purpose, and the write lock need not wait.
  const hashes = await Promise.all(scenario.users.map(() => bcrypt.hash(demoPassword, bcryptCost)));

  const seeded = db.transaction().execute(async (trx) => {
    const userIds = new Map<string, number>();
    for (const [index, user] of scenario.users.entries()) {
      const { id } = await trx
        .insertInto('users')
        .values({ email: user.email, name: user.name, role: user.role, password_hash: hashes[index] ?? '' })
        .returning('id')
        .executeTakeFirstOrThrow();
      userIds.set(user.email, id);
    }
    const typistId = userIds.get(scenario.typistEmail);
    if (typistId === undefined) throw new Error(`The demo typist ${scenario.typistEmail} is not among the demo users`);

    for (const site of scenario.sites) {
      const { id: siteId } = await trx
        .insertInto('sites')
        .values({
          client: site.client,
          address: site.address,
          description: site.description,
          contact_name: site.contactName,
          contact_email: site.contactEmail,
          earthing: site.earthing,
          nominal_voltage_v: site.nominalVoltageV,
          ze_ohm: site.zeOhm,
          pfc_ka: site.pfcKa,
        })
        .returning('id')
        .executeTakeFirstOrThrow();

      for (const job of site.jobs) {
        const { id: jobId } = await trx
          .insertInto('jobs')
          .values({
            site_id: siteId,
            kind: job.kind,
            reference: job.reference,
            visit_date: job.visitDate,
            limitations: job.limitations,
          })
          .returning('id')
          .executeTakeFirstOrThrow();

        const boards = new Map<string, { id: number; circuits: Map<string, number> }>();
        for (const board of job.boards) boards.set(board.reference, await insertBoard(trx, jobId, board, typistId));
        await insertRecord(trx, jobId, job, boards, typistId);
        if (job.submitted) {
          const submitterId = userIds.get(job.submitted.byEmail);
          if (submitterId === undefined) throw new Error(`The demo submitter ${job.submitted.byEmail} is not among the demo users`);
          await submitJob(trx, files, storedPaths, jobId, job.submitted, submitterId);
        }
      }
    }

    // The demo contractor's details; its pattern continues the demo jobs' references.
    await trx
      .insertInto('app_settings')
      .values({ key: 'company', value: JSON.stringify(scenario.company) })
      .onConflict((oc) => oc.column('key').doNothing())
      .execute();
  });
  await seeded.catch((error: unknown) => {
    // The rows went with the rolled-back transaction; the signature bytes go too.
    for (const stored of storedPaths) files.remove(stored);
    throw error;
  });
}

/**
 * Seeds a job as the tester leaves it on submitting: ready for review, the submission in the job
 * history with the note, and the inspector's signature (file row, bytes on disk, signature row and
 * its history entry, as `POST /api/jobs/:jobId/signatures` writes them).
 */
async function submitJob(
  trx: Transaction<Database>,
  files: FileStore,
  storedPaths: string[],
  jobId: number,
  submitted: NonNullable<DemoJob['submitted']>,
  userId: number,
): Promise<void> {
  const file = await files.save(trx, {
    kind: 'signature',
    bytes: demoSignaturePng(jobId),
    mime: 'image/png',
    originalName: 'signature-inspector.png',
    jobId,
    uploadedBy: userId,
  });
  storedPaths.push(file.path);
  const signature = await trx
    .insertInto('signatures')
    .values({ job_id: jobId, role: 'inspector', name: submitted.inspectorName, file_id: file.id, user_id: userId, signed_at: submitted.at })
    .returning('id')
    .executeTakeFirstOrThrow();
  await trx
    .insertInto('job_history')
    .values({
      job_id: jobId,
      section: 'declaration',
      field: 'inspector',
      action: 'signed',
      old_text: null,
      new_text: JSON.stringify({ signatureId: signature.id, name: submitted.inspectorName, fileId: file.id, sha256: file.sha256 }),
      reason: null,
      user_id: userId,
      at: submitted.at,
      version: null,
    })
    .execute();

  // The state change as setJobState records it (server/db/review.ts): version 1 → 2.
  await trx.updateTable('jobs').set({ state: 'ready', version: 2 }).where('id', '=', jobId).execute();
  await trx
    .insertInto('job_history')
    .values({
      job_id: jobId,
      section: null,
      field: 'state',
      action: 'state',
      old_text: JSON.stringify('entering'),
      new_text: JSON.stringify('ready'),
      reason: submitted.note,
      user_id: userId,
      at: submitted.at,
      version: 2,
    })
    .execute();
}

/**
 * The job's record, one row per section at version 1, like the seeded cells (the starting state,
 * so no history rows). Each section is parsed with its schema first: demo data that does not fit
 * the record stops the seed rather than landing.
 */
async function insertRecord(
  trx: Transaction<Database>,
  jobId: number,
  job: DemoJob,
  boards: ReadonlyMap<string, { id: number; circuits: ReadonlyMap<string, number> }>,
  typistId: number,
): Promise<void> {
  const updatedAt = `${job.visitDate}T18:00:00.000Z`;
  for (const [key, demoData] of Object.entries(job.record)) {
    const section: JobSectionKey = jobSectionKeySchema.parse(key);
    let data: unknown = demoData;
    if (section === 'observations') {
      data = Object.fromEntries(
        Object.entries(job.record.observations ?? {}).map(([id, { boardReference, circuitNumber, ...observation }]) => {
          const board = boardReference === null ? undefined : boards.get(boardReference);
          if (boardReference !== null && !board) throw new Error(`Observation ${observation.number} names board ${boardReference}, which is not on job ${job.reference}`);
          const circuitId = circuitNumber === null ? null : (board?.circuits.get(circuitNumber) ?? null);
          if (circuitNumber !== null && circuitId === null) throw new Error(`Observation ${observation.number} names circuit ${circuitNumber}, which is not on ${boardReference}`);
          return [id, { ...observation, boardId: board?.id ?? null, circuitId }];
        }),
      );
    }
    const parsed = jobSectionSchemas[section].parse(data);
    await trx
      .insertInto('job_sections')
      .values({ job_id: jobId, section, data: JSON.stringify(parsed), version: 1, updated_by: typistId, updated_at: updatedAt })
      .execute();
  }
}

async function insertBoard(
  trx: Transaction<Database>,
  jobId: number,
  board: DemoBoard,
  typistId: number,
): Promise<{ id: number; circuits: Map<string, number> }> {
  const { id: boardId } = await trx
    .insertInto('boards')
    .values({
      job_id: jobId,
      reference: board.reference,
      location: board.location,
      supplied_from: board.suppliedFrom,
      phases: board.phases,
      zdb_ohm: board.zdbOhm,
      ipf_ka: board.ipfKa,
      polarity_confirmed: board.polarityConfirmed ? 1 : 0,
      phase_sequence_confirmed: board.phaseSequenceConfirmed ? 1 : 0,
      instruments: board.instruments,
      state: 'open',
      locked_by: null,
      locked_at: null,
      version: 1,
    })
    .returning('id')
    .executeTakeFirstOrThrow();

  const idByNumber = new Map<string, number>();
  for (const [index, circuit] of board.circuits.entries()) {
    const { id: circuitId } = await trx
      .insertInto('circuits')
      .values({
        board_id: boardId,
        position: index + 1,
        number: circuit.number,
        phase: circuit.phase,
        description: circuit.description,
        kind: circuit.kind,
        wiring_type: circuit.wiringType,
        reference_method: circuit.referenceMethod,
        points: circuit.points,
        live_csa_mm2: circuit.liveCsaMm2,
        cpc_csa_mm2: circuit.cpcCsaMm2,
        max_disconnection_s: circuit.maxDisconnectionS,
        cable_length_m: circuit.cableLengthM ?? null,
        device_standard: circuit.deviceStandard,
        device_type: circuit.deviceType,
        rating_a: circuit.ratingA,
        breaking_ka: circuit.breakingKa,
        rcd_type: circuit.rcdType,
        rcd_rated_residual_ma: circuit.rcdRatedResidualMa,
        afdd: circuit.afdd,
        remarks: circuit.remarks,
        // Spurs are linked once every circuit of the board has its id (below).
        spur_ring_id: null,
        spur_origin_point: circuit.spurOriginPoint,
        spur_length_m: circuit.spurLengthM,
        version: 1,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    idByNumber.set(circuit.number, circuitId);

    const cells: Insertable<CellTable>[] = Object.entries(circuit.cells).map(([columnKey, cell]) => ({
      circuit_id: circuitId,
      column_key: columnKey,
      text: cell.text,
      reason: cell.reason,
      version: 1,
      updated_by: typistId,
      updated_at: cell.updatedAt,
    }));
    if (cells.length > 0) await trx.insertInto('cells').values(cells).execute();
  }

  for (const circuit of board.circuits) {
    if (circuit.spurRingNumber === null) continue;
    const ringId = idByNumber.get(circuit.spurRingNumber);
    const spurId = idByNumber.get(circuit.number);
    if (ringId === undefined || spurId === undefined) {
      throw new Error(`Spur ${circuit.number} on ${board.reference} names ring ${circuit.spurRingNumber}, which is not on the board`);
    }
    await trx.updateTable('circuits').set({ spur_ring_id: ringId }).where('id', '=', spurId).execute();
  }
  return { id: boardId, circuits: idByNumber };
}
