import type { Generated, Insertable, Selectable, Updateable } from 'kysely';

/** Table types as SQLite stores them: snake_case, booleans as 0/1, timestamps as ISO text. */
export interface UserTable {
  id: Generated<number>;
  email: string;
  name: string;
  role: 'admin' | 'tester' | 'reviewer';
  password_hash: string;
  created_at: Generated<string>;
  /** Set while the person is deactivated: no sign-in, everything they did keeps their name. */
  deactivated_at: string | null;
  deactivated_by: number | null;
  /** Raised when the password changes or the person is deactivated: older sessions end. */
  session_generation: Generated<number>;
}

export interface SiteTable {
  id: Generated<number>;
  client: string;
  address: string;
  description: Generated<string>;
  earthing: 'TN-S' | 'TN-C-S' | 'TT';
  nominal_voltage_v: Generated<number>;
  ze_ohm: number | null;
  pfc_ka: number | null;
  contact_name: Generated<string>;
  contact_email: Generated<string>;
  version: Generated<number>;
}

export interface JobTable {
  id: Generated<number>;
  site_id: number;
  kind: 'EIC' | 'EICR';
  reference: string;
  visit_date: string;
  limitations: Generated<string>;
  visit_end_date: string | null;
  state: Generated<'entering' | 'ready' | 'approved' | 'issued'>;
  version: Generated<number>;
  started_from_job_id: number | null;
  created_at: Generated<string>;
}

/** One section of a job's record (see shared/schemas/job-record.ts); `data` is JSON text. */
export interface JobSectionTable {
  job_id: number;
  section: string;
  data: string;
  version: Generated<number>;
  updated_by: number | null;
  updated_at: string;
}

/** Append-only history of a job: its record, details and state. Values are JSON text. */
export interface JobHistoryTable {
  id: Generated<number>;
  job_id: number;
  section: string | null;
  field: string | null;
  action: string;
  old_text: string | null;
  new_text: string | null;
  reason: string | null;
  user_id: number | null;
  at: string;
  version: number | null;
}

/** Append-only history of a site's details: one row per changed field, values as JSON text. */
export interface SiteHistoryTable {
  id: Generated<number>;
  site_id: number;
  field: string | null;
  action: string;
  old_text: string | null;
  new_text: string | null;
  user_id: number | null;
  at: string;
  version: number | null;
}

export interface BoardTable {
  id: Generated<number>;
  job_id: number;
  reference: string;
  location: Generated<string>;
  supplied_from: Generated<string>;
  phases: 1 | 3;
  zdb_ohm: number | null;
  ipf_ka: number | null;
  polarity_confirmed: Generated<number>;
  phase_sequence_confirmed: Generated<number>;
  instruments: Generated<string>;
  state: Generated<'open' | 'locked'>;
  locked_by: number | null;
  locked_at: string | null;
  version: Generated<number>;
}

export interface CircuitTable {
  id: Generated<number>;
  board_id: number;
  position: number;
  number: string;
  phase: 'L1' | 'L2' | 'L3' | 'TP' | null;
  description: Generated<string>;
  kind: Generated<'ring' | 'radial' | 'spur' | 'distribution'>;
  wiring_type: Generated<string>;
  reference_method: Generated<string>;
  points: number | null;
  live_csa_mm2: number | null;
  cpc_csa_mm2: number | null;
  max_disconnection_s: number | null;
  /** Length of the circuit cable (m), when known (migration 2026-12-02T0220). */
  cable_length_m: number | null;
  device_standard: Generated<string>;
  device_type: Generated<string>;
  rating_a: number | null;
  breaking_ka: number | null;
  rcd_type: 'AC' | 'A' | 'F' | 'B' | 'S-AC' | 'S-A' | null;
  rcd_rated_residual_ma: number | null;
  afdd: 'yes' | 'no' | null;
  remarks: Generated<string>;
  spur_ring_id: number | null;
  spur_origin_point: string | null;
  spur_length_m: number | null;
  spur_protection: 'fused' | 'unfused' | null;
  max_zs_by_hand_ohm: number | null;
  previous_circuit_id: number | null;
  version: Generated<number>;
}

export interface CellTable {
  circuit_id: number;
  column_key: string;
  text: string;
  reason: string | null;
  version: number;
  updated_by: number | null;
  updated_at: string;
}

/**
 * One change of any kind. `action` says what: `cell` (a reading), `field` (a circuit detail),
 * `circuit-created`, `circuit-removed`, `reordered`, `board` (a board detail), `locked`, `unlocked`.
 */
/** A ring's socket-by-socket readings (migration 2026-12-02T0260-ring-sockets.ts). */
export interface RingSocketsTable {
  circuit_id: number;
  /** JSON: the sockets in ring order (`ringSocketsSchema`). */
  data: string;
  version: number;
  updated_by: number | null;
  updated_at: string;
}

export interface HistoryTable {
  id: Generated<number>;
  board_id: number;
  circuit_id: number | null;
  column_key: string | null;
  action: string;
  old_text: string | null;
  new_text: string | null;
  user_id: number | null;
  at: string;
  how: string;
  version: number | null;
}

/** A file kept on disk under the data folder (`path` is relative to it). */
export interface FileTable {
  id: Generated<number>;
  kind: string;
  path: string;
  sha256: string;
  mime: string;
  size_bytes: number;
  original_name: string | null;
  job_id: number | null;
  board_id: number | null;
  uploaded_by: number | null;
  created_at: Generated<string>;
  /** 1 when a photo is chosen to go with the document to the client (migration 0370); default 0. */
  send_to_client: Generated<number>;
}

/** An error finding a reviewer accepted with a written reason. */
export interface FindingAcceptanceTable {
  id: Generated<number>;
  job_id: number;
  board_id: number | null;
  finding_key: string;
  code: string;
  message: string;
  reason: string;
  accepted_by: number;
  accepted_at: Generated<string>;
}

export interface SignatureTable {
  id: Generated<number>;
  job_id: number;
  role: 'designer' | 'constructor' | 'inspector' | 'reviewer';
  name: string;
  file_id: number;
  user_id: number;
  signed_at: Generated<string>;
}

/** One issued revision of a job's document: frozen once written (only `superseded_at` is set later). */
export interface JobIssueTable {
  id: Generated<number>;
  job_id: number;
  revision: number;
  file_id: number;
  sha256: string;
  issued_by: number;
  issued_at: Generated<string>;
  superseded_at: string | null;
}

export interface OutgoingMailTable {
  id: Generated<number>;
  job_id: number;
  issue_id: number | null;
  to_address: string;
  subject: string;
  body: string;
  state: Generated<'waiting' | 'sending' | 'sent' | 'failed'>;
  attempts: Generated<number>;
  last_error: string | null;
  message_id: string | null;
  created_by: number | null;
  created_at: Generated<string>;
  sent_at: string | null;
  /** JSON array of the photo file ids chosen when the e-mail was queued (migration 0370); null before. */
  photo_file_ids: string | null;
}

export interface AppSettingTable {
  key: string;
  value: string;
}

/** A saved mapping of an instrument file's columns (migration 2026-12-02T0240-import-mappings). */
export interface ImportMappingTable {
  id: Generated<number>;
  name: string;
  /** null: shared with the whole company. */
  owner_id: number | null;
  /** JSON list of { header, target }. */
  columns: string;
  created_by: number | null;
  updated_at: Generated<string>;
}

export interface Database {
  users: UserTable;
  sites: SiteTable;
  site_history: SiteHistoryTable;
  jobs: JobTable;
  job_sections: JobSectionTable;
  job_history: JobHistoryTable;
  boards: BoardTable;
  circuits: CircuitTable;
  cells: CellTable;
  history: HistoryTable;
  ring_sockets: RingSocketsTable;
  app_settings: AppSettingTable;
  files: FileTable;
  import_mappings: ImportMappingTable;
  finding_acceptances: FindingAcceptanceTable;
  signatures: SignatureTable;
  job_issues: JobIssueTable;
  outgoing_mail: OutgoingMailTable;
}

export type UserRow = Selectable<UserTable>;
export type NewUserRow = Insertable<UserTable>;
export type SiteRow = Selectable<SiteTable>;
export type SiteHistoryRow = Selectable<SiteHistoryTable>;
export type JobRow = Selectable<JobTable>;
export type JobSectionRow = Selectable<JobSectionTable>;
export type JobHistoryRow = Selectable<JobHistoryTable>;
export type BoardRow = Selectable<BoardTable>;
export type CircuitRow = Selectable<CircuitTable>;
export type NewCircuitRow = Insertable<CircuitTable>;
export type CircuitUpdate = Updateable<CircuitTable>;
export type CellRow = Selectable<CellTable>;
export type HistoryRow = Selectable<HistoryTable>;
export type FileRow = Selectable<FileTable>;
export type ImportMappingRow = Selectable<ImportMappingTable>;
export type FindingAcceptanceRow = Selectable<FindingAcceptanceTable>;
export type SignatureRow = Selectable<SignatureTable>;
export type JobIssueRow = Selectable<JobIssueTable>;
export type OutgoingMailRow = Selectable<OutgoingMailTable>;
