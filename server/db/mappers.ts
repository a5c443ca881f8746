import type { Board, Cell, Cells, Circuit, CircuitFields } from '../../shared/schemas/boards.ts';
import { isReadingKey } from '../../shared/schemas/columns.ts';
import type { Job, Site } from '../../shared/schemas/sites.ts';
import type { BoardRow, CellRow, CircuitRow, CircuitUpdate, JobRow, SiteRow } from './types.ts';

/** snake_case rows ⇄ camelCase API shapes, in one place. */

export const circuitFieldColumns = {
  number: 'number',
  phase: 'phase',
  description: 'description',
  kind: 'kind',
  wiringType: 'wiring_type',
  referenceMethod: 'reference_method',
  points: 'points',
  liveCsaMm2: 'live_csa_mm2',
  cpcCsaMm2: 'cpc_csa_mm2',
  maxDisconnectionS: 'max_disconnection_s',
  cableLengthM: 'cable_length_m',
  deviceStandard: 'device_standard',
  deviceType: 'device_type',
  ratingA: 'rating_a',
  breakingKa: 'breaking_ka',
  rcdType: 'rcd_type',
  rcdRatedResidualMa: 'rcd_rated_residual_ma',
  afdd: 'afdd',
  remarks: 'remarks',
  spurRingId: 'spur_ring_id',
  spurOriginPoint: 'spur_origin_point',
  spurLengthM: 'spur_length_m',
  spurProtection: 'spur_protection',
  maxZsByHandOhm: 'max_zs_by_hand_ohm',
} as const satisfies Record<keyof CircuitFields, keyof CircuitRow>;

export type PersonNames = ReadonlyMap<number, string>;

function person(id: number | null, names: PersonNames) {
  return id === null ? null : { id, name: names.get(id) ?? 'former user' };
}

export function toSite(row: SiteRow): Site {
  return {
    id: row.id,
    client: row.client,
    address: row.address,
    description: row.description,
    earthing: row.earthing,
    nominalVoltageV: row.nominal_voltage_v,
    contactName: row.contact_name,
    contactEmail: row.contact_email,
    zeOhm: row.ze_ohm,
    pfcKa: row.pfc_ka,
    version: row.version,
  };
}

export function toJob(row: JobRow): Job {
  return {
    id: row.id,
    siteId: row.site_id,
    kind: row.kind,
    reference: row.reference,
    visitDate: row.visit_date,
    visitEndDate: row.visit_end_date,
    limitations: row.limitations,
    state: row.state,
    startedFromJobId: row.started_from_job_id,
    createdAt: row.created_at,
    version: row.version,
  };
}

export function toBoard(row: BoardRow, names: PersonNames): Board {
  return {
    id: row.id,
    jobId: row.job_id,
    reference: row.reference,
    location: row.location,
    suppliedFrom: row.supplied_from,
    phases: row.phases,
    zdbOhm: row.zdb_ohm,
    ipfKa: row.ipf_ka,
    polarityConfirmed: row.polarity_confirmed === 1,
    phaseSequenceConfirmed: row.phase_sequence_confirmed === 1,
    instruments: row.instruments,
    state: row.state,
    lockedBy: person(row.locked_by, names),
    lockedAt: row.locked_at,
    version: row.version,
  };
}

export function toCell(row: CellRow, names: PersonNames): Cell {
  return {
    text: row.text,
    reason: row.reason,
    version: row.version,
    updatedBy: person(row.updated_by, names),
    updatedAt: row.updated_at,
  };
}

export function toCircuit(row: CircuitRow, cellRows: readonly CellRow[], names: PersonNames): Circuit {
  const cells: Cells = {};
  for (const cell of cellRows) {
    if (isReadingKey(cell.column_key)) cells[cell.column_key] = toCell(cell, names);
  }
  return {
    id: row.id,
    boardId: row.board_id,
    position: row.position,
    version: row.version,
    number: row.number,
    phase: row.phase,
    description: row.description,
    kind: row.kind,
    wiringType: row.wiring_type,
    referenceMethod: row.reference_method,
    points: row.points,
    liveCsaMm2: row.live_csa_mm2,
    cpcCsaMm2: row.cpc_csa_mm2,
    maxDisconnectionS: row.max_disconnection_s,
    cableLengthM: row.cable_length_m,
    deviceStandard: row.device_standard,
    deviceType: row.device_type,
    ratingA: row.rating_a,
    breakingKa: row.breaking_ka,
    rcdType: row.rcd_type,
    rcdRatedResidualMa: row.rcd_rated_residual_ma,
    afdd: row.afdd,
    remarks: row.remarks,
    spurRingId: row.spur_ring_id,
    spurOriginPoint: row.spur_origin_point,
    spurLengthM: row.spur_length_m,
    spurProtection: row.spur_protection ?? null,
    maxZsByHandOhm: row.max_zs_by_hand_ohm,
    cells,
  };
}

/** Partial API fields → a row update. */
export function toCircuitUpdate(changes: Partial<CircuitFields>): CircuitUpdate {
  const update: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(changes)) {
    const column = circuitFieldColumns[key as keyof CircuitFields];
    if (column && value !== undefined) update[column] = value;
  }
  return update as CircuitUpdate;
}

/** A field's value as history text. */
export function fieldText(value: unknown): string | null {
  return value === null || value === undefined ? null : String(value);
}
