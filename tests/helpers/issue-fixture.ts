import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import type { ReadingKey } from '../../shared/schemas/columns.ts';
import type { JobSectionData, JobSectionKey } from '../../shared/schemas/job-record.ts';
import type { DB } from '../../server/db/database.ts';

/**
 * Invented data for tests and the PDF benchmark: a full EICR record (Halden & Brook Electrical,
 * a block of flats on Quince Row), readings on every circuit, a three-phase board numbered per
 * phase, signatures and a logo as PNG files under a data folder. None of it is a real place,
 * person or reading.
 */

/** A small greyscale PNG of a wavy pen stroke, made without any image library. */
export function signaturePng(seed = 1, width = 160, height = 48): Buffer {
  const raw = Buffer.alloc((width + 1) * height, 255);
  for (let x = 4; x < width - 4; x++) {
    const y = Math.round(height / 2 + Math.sin((x + seed * 7) / (9 + seed)) * (height / 3) * Math.cos(x / 37));
    for (let dy = -1; dy <= 1; dy++) {
      const row = Math.min(height - 1, Math.max(0, y + dy));
      raw[row * (width + 1) + 1 + x] = 20;
    }
  }
  for (let row = 0; row < height; row++) raw[row * (width + 1)] = 0; // filter: none
  const chunk = (type: string, data: Buffer) => {
    const length = Buffer.alloc(4);
    length.writeUInt32BE(data.length);
    const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
    const crc = Buffer.alloc(4);
    crc.writeUInt32BE(zlib.crc32(body) >>> 0);
    return Buffer.concat([length, body, crc]);
  };
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header[8] = 8; // bit depth
  header[9] = 0; // greyscale
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', header),
    chunk('IDAT', zlib.deflateSync(raw)),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

async function storeFile(db: DB, dataDir: string, kind: string, name: string, bytes: Buffer, jobId: number | null, userId: number): Promise<number> {
  const relative = path.join('test-files', `${kind}-${crypto.randomBytes(6).toString('hex')}-${name}`);
  fs.mkdirSync(path.join(dataDir, 'test-files'), { recursive: true });
  fs.writeFileSync(path.join(dataDir, relative), bytes);
  const row = await db
    .insertInto('files')
    .values({
      kind,
      path: relative,
      sha256: crypto.createHash('sha256').update(bytes).digest('hex'),
      mime: 'image/png',
      size_bytes: bytes.length,
      original_name: name,
      job_id: jobId,
      board_id: null,
      uploaded_by: userId,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

export async function writeSection<K extends JobSectionKey>(db: DB, jobId: number, key: K, data: JobSectionData[K], userId: number): Promise<void> {
  await db
    .insertInto('job_sections')
    .values({ job_id: jobId, section: key, data: JSON.stringify(data), version: 1, updated_by: userId, updated_at: '2026-11-30T16:00:00.000Z' })
    .onConflict((oc) => oc.columns(['job_id', 'section']).doUpdateSet({ data: JSON.stringify(data) }))
    .execute();
}

/** Company details and a logo, as the company page would store them. */
export async function addCompany(db: DB, dataDir: string, userId: number): Promise<void> {
  const logo = await storeFile(db, dataDir, 'logo', 'logo.png', signaturePng(5, 200, 60), null, userId);
  const company = {
    name: 'Halden & Brook Electrical Ltd',
    address: 'Unit 4, Mill Yard, Harrowgate Lane, Eastbridge EB4 2QT',
    phone: '01632 960418',
    email: 'office@halden-brook.example',
    registration: 'Registered contractor no. 55-0913',
    referencePattern: '{kind}-{yyyy}-{seq:4}',
    logoFileId: logo,
  };
  await db.insertInto('app_settings').values({ key: 'company', value: JSON.stringify(company) }).execute();
}

/** Every section of an EICR record filled in, with three observations (one C2). */
export async function addEicrRecord(db: DB, jobId: number, userId: number): Promise<void> {
  await writeSection(db, jobId, 'client', { orderedBy: 'Quince Row Housing Co-operative', orderedByAddress: '2 Quince Row, Eastbridge EB2 7LA', reason: 'letting', reasonDetail: 'Before the flats are let again in January.' }, userId);
  await writeSection(db, jobId, 'installation', { premises: 'rented-dwelling', wiringAgeYears: 22, alterationsEvident: 'yes', alterationsAgeYears: 6, recordsAvailable: 'yes', recordsHeldBy: 'The co-operative’s office', lastInspectionDate: '2021-11-18' }, userId);
  await writeSection(db, jobId, 'supply', { earthing: 'TN-C-S', liveConductors: '1-phase 2-wire', u0V: 230, uV: 230, frequencyHz: 50, zeOhm: 0.21, ipfKa: 1.9, supplyDeviceStandard: 'BS 88-3', supplyDeviceType: 'gG', supplyDeviceRatingA: 80, supplyNeutralCsaMm2: 25 }, userId);
  await writeSection(db, jobId, 'origin', {
    meansOfEarthing: 'supplier', electrodeType: '', electrodeLocation: '', electrodeRaOhm: null, mainSwitchStandard: 'BS EN 60947-3', mainSwitchPoles: 2,
    mainSwitchRatingA: 100, mainSwitchRcdMa: null, mainSwitchRcdTimeMs: null, earthingConductorMaterial: 'copper', earthingConductorCsaMm2: 16,
    earthingConductorVerified: 'yes', bondingConductorMaterial: 'copper', bondingConductorCsaMm2: 10, bondingVerified: 'yes', bondedWater: 'yes',
    bondedGas: 'yes', bondedOil: 'none', bondedStructuralSteel: 'none', bondedLightningProtection: 'none', bondedOther: '',
  }, userId);
  await writeSection(db, jobId, 'extent', {
    extentCovered: 'The whole fixed installation of flat 3, from the meter tails to every accessory.',
    agreedWith: 'Mrs Ilse Varga, co-operative secretary',
    limitations: [{ kind: 'agreed', what: 'Cables under the fitted kitchen floor', reason: 'Floor not lifted at the client’s request' }],
  }, userId);
  const inspections: JobSectionData['inspections'] = {};
  for (const id of ['1.1', '1.2', '1.3', '3.1', '3.3', '3.4', '4.1', '4.3', '4.4', '4.5', '4.6', '4.10', '5.1', '5.2', '5.4', '5.5', '5.7', '6.1', '6.2']) inspections[id] = 'ok';
  Object.assign(inspections, { '1.4': 'N/A', '2.1': 'N/A', '2.2': 'N/A', '3.2': 'N/A', '3.5': 'N/A', '4.2': 'C3', '4.7': 'C3', '4.8': 'not-verified', '4.9': 'N/A', '5.3': 'LIM', '5.6': 'N/A', '5.8': 'C2', '6.3': 'N/A', '6.4': 'N/A', '7.1': 'N/A', '7.2': 'N/A', '7.3': 'N/A' });
  await writeSection(db, jobId, 'inspections', inspections, userId);
  await writeSection(db, jobId, 'observations', {
    'o-a1': { number: 1, text: 'Socket-outlet on the balcony has no RCD protection.', location: 'Balcony', code: 'C2', boardId: null, circuitId: null, inspectionItem: '5.8' },
    'o-b2': { number: 2, text: 'Consumer unit enclosure is plastic under the stairs.', location: 'Hall cupboard', code: 'C3', boardId: null, circuitId: null, inspectionItem: '4.2' },
    'o-c3': { number: 3, text: 'No notice reminding the occupier to press the RCD test button.', location: 'Consumer unit', code: 'C3', boardId: null, circuitId: null, inspectionItem: '4.7' },
  }, userId);
  await writeSection(db, jobId, 'summary', { generalCondition: 'Generally sound for its age; the balcony socket needs RCD protection.', nextInspectionMonths: 60, nextInspectionReason: '' }, userId);
  await writeSection(db, jobId, 'declaration', {
    samePersonForAll: false,
    designer: { name: '', position: '', date: '' },
    constructor: { name: '', position: '', date: '' },
    inspector: { name: 'Priya Okonkwo', position: 'Inspector', date: '2026-11-30' },
    reviewer: { name: 'Daniel Marsh', position: 'Qualified supervisor', date: '2026-12-01' },
  }, userId);
}

/** Inspector's and reviewer's signatures, as the signing step stores them. */
export async function addSignatures(db: DB, dataDir: string, jobId: number, inspectorId: number, reviewerId: number): Promise<void> {
  for (const [role, name, userId, seed] of [['inspector', 'Priya Okonkwo', inspectorId, 2], ['reviewer', 'Daniel Marsh', reviewerId, 3]] as const) {
    const fileId = await storeFile(db, dataDir, 'signature', `${role}.png`, signaturePng(seed), jobId, userId);
    await db.insertInto('signatures').values({ job_id: jobId, role, name, file_id: fileId, user_id: userId, signed_at: '2026-12-01T10:15:00.000Z' }).execute();
  }
}

/** Readings for one circuit, a little different per circuit so each can be found in the PDF. */
export function readingsFor(index: number, kind: 'ring' | 'radial'): Partial<Record<ReadingKey, string>> {
  const r = (base: number, step: number) => (base + ((index * step) % 37) / 100).toFixed(2);
  const common: Partial<Record<ReadingKey, string>> = {
    irTestVoltage: '500',
    irLiveLive: index % 3 === 0 ? '>999' : String(150 + index),
    irLiveEarth: index % 4 === 0 ? '>200' : String(90 + index),
    polarity: '✓',
    zs: r(0.35, 7),
    rcdTimeMs: String(18 + (index % 11)),
    rcdButton: '✓',
    afddButton: 'N/A',
  };
  if (kind === 'ring') return { ...common, ringR1: r(0.3, 3), ringRn: r(0.31, 3), ringR2: r(0.5, 5), r1PlusR2: r(0.2, 2), r2: 'N/A' };
  return { ...common, ringR1: 'N/A', ringRn: 'N/A', ringR2: 'N/A', r1PlusR2: r(0.4, 9), r2: 'N/A' };
}

export async function writeReadings(db: DB, circuitId: number, readings: Partial<Record<ReadingKey, string>>, userId: number, reasons: Partial<Record<ReadingKey, string>> = {}): Promise<void> {
  const rows = Object.entries(readings).map(([key, text]) => ({
    circuit_id: circuitId,
    column_key: key,
    text: text ?? '',
    reason: reasons[key as ReadingKey] ?? null,
    version: 1,
    updated_by: userId,
    updated_at: '2026-11-30T15:00:00.000Z',
  }));
  if (rows.length > 0) await db.insertInto('cells').values(rows).execute();
}

/**
 * A board of `ways` circuits with readings in every cell. Three-phase boards number their
 * circuits per phase (1L1, 1L2, 1L3, 2L1 …) with the phase stored beside the number.
 */
export async function addBoard(db: DB, jobId: number, userId: number, options: { reference: string; ways: number; phases: 1 | 3; locked?: boolean }): Promise<number> {
  const { id: boardId } = await db
    .insertInto('boards')
    .values({
      job_id: jobId, reference: options.reference, location: 'Plant room', supplied_from: 'Main switchboard', phases: options.phases,
      zdb_ohm: 0.24, ipf_ka: 2.1, polarity_confirmed: 1, phase_sequence_confirmed: options.phases === 3 ? 1 : 0,
      instruments: 'Multifunction tester serial KP-20417, calibrated 2026-06-12', state: options.locked ? 'locked' : 'open',
      locked_by: options.locked ? userId : null, locked_at: options.locked ? '2026-12-01T09:00:00.000Z' : null,
    })
    .returning('id')
    .executeTakeFirstOrThrow();
  for (let i = 0; i < options.ways; i++) {
    const way = options.phases === 3 ? Math.floor(i / 3) + 1 : i + 1;
    const phase = options.phases === 3 ? (['L1', 'L2', 'L3'] as const)[i % 3]! : null;
    const kind = i % 4 === 0 ? 'ring' : 'radial';
    const { id } = await db
      .insertInto('circuits')
      .values({
        board_id: boardId, position: i + 1, number: phase ? `${way}${phase}` : String(way), phase,
        description: kind === 'ring' ? `Sockets, workshop bay ${way}` : `Lighting and small power, area ${way}`,
        kind, wiring_type: 'A', reference_method: 'C', points: 4 + (i % 6), live_csa_mm2: kind === 'ring' ? 2.5 : 1.5, cpc_csa_mm2: 1.5,
        max_disconnection_s: 0.4, device_standard: '61009', device_type: 'B', rating_a: kind === 'ring' ? 32 : 16, breaking_ka: 6,
        rcd_type: 'A', rcd_rated_residual_ma: 30, afdd: 'no', remarks: i % 5 === 0 ? 'Labelled at the board' : '',
        spur_ring_id: null, spur_origin_point: null, spur_length_m: null,
      })
      .returning('id')
      .executeTakeFirstOrThrow();
    await writeReadings(db, id, readingsFor(i + 1, kind), userId);
  }
  return boardId;
}
