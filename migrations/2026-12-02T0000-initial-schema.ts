import { sql, type Kysely } from 'kysely';
import { idKey, realType, nowText, appendOnly } from './lib/dialect.ts';

/**
 * The first schema: people, sites, jobs, boards, circuits, one row per reading cell, and an
 * append-only history of every change. Frozen: later changes get migrations of their own.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('users')
    .addColumn('id', 'integer', idKey(db))
    .addColumn('email', 'text', (c) => c.notNull().unique())
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('role', 'text', (c) => c.notNull().check(sql`role in ('admin', 'tester', 'reviewer')`))
    .addColumn('password_hash', 'text', (c) => c.notNull())
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(nowText(db)))
    .execute();

  await db.schema
    .createTable('sites')
    .addColumn('id', 'integer', idKey(db))
    .addColumn('client', 'text', (c) => c.notNull())
    .addColumn('address', 'text', (c) => c.notNull())
    .addColumn('description', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('earthing', 'text', (c) => c.notNull().check(sql`earthing in ('TN-S', 'TN-C-S', 'TT')`))
    .addColumn('nominal_voltage_v', realType(db), (c) => c.notNull().defaultTo(230))
    .addColumn('ze_ohm', realType(db))
    .addColumn('pfc_ka', realType(db))
    .execute();

  await db.schema
    .createTable('jobs')
    .addColumn('id', 'integer', idKey(db))
    .addColumn('site_id', 'integer', (c) => c.notNull().references('sites.id').onDelete('cascade'))
    .addColumn('kind', 'text', (c) => c.notNull().check(sql`kind in ('EIC', 'EICR')`))
    .addColumn('reference', 'text', (c) => c.notNull())
    .addColumn('visit_date', 'text', (c) => c.notNull())
    .addColumn('limitations', 'text', (c) => c.notNull().defaultTo(''))
    .execute();
  await db.schema.createIndex('jobs_site_id').on('jobs').column('site_id').execute();

  await db.schema
    .createTable('boards')
    .addColumn('id', 'integer', idKey(db))
    .addColumn('job_id', 'integer', (c) => c.notNull().references('jobs.id').onDelete('cascade'))
    .addColumn('reference', 'text', (c) => c.notNull())
    .addColumn('location', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('supplied_from', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('phases', 'integer', (c) => c.notNull().check(sql`phases in (1, 3)`))
    .addColumn('zdb_ohm', realType(db))
    .addColumn('ipf_ka', realType(db))
    .addColumn('polarity_confirmed', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('phase_sequence_confirmed', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('instruments', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('state', 'text', (c) => c.notNull().defaultTo('open').check(sql`state in ('open', 'locked')`))
    .addColumn('locked_by', 'integer', (c) => c.references('users.id'))
    .addColumn('locked_at', 'text')
    .addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
    .execute();
  await db.schema.createIndex('boards_job_id').on('boards').column('job_id').execute();

  await db.schema
    .createTable('circuits')
    .addColumn('id', 'integer', idKey(db))
    .addColumn('board_id', 'integer', (c) => c.notNull().references('boards.id').onDelete('cascade'))
    .addColumn('position', 'integer', (c) => c.notNull())
    .addColumn('number', 'text', (c) => c.notNull())
    .addColumn('phase', 'text', (c) => c.check(sql`phase in ('L1', 'L2', 'L3', 'TP')`))
    .addColumn('description', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('kind', 'text', (c) =>
      c.notNull().defaultTo('radial').check(sql`kind in ('ring', 'radial', 'spur', 'distribution')`),
    )
    .addColumn('wiring_type', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('reference_method', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('points', 'integer')
    .addColumn('live_csa_mm2', realType(db))
    .addColumn('cpc_csa_mm2', realType(db))
    .addColumn('max_disconnection_s', realType(db))
    .addColumn('device_standard', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('device_type', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('rating_a', realType(db))
    .addColumn('breaking_ka', realType(db))
    .addColumn('rcd_type', 'text')
    .addColumn('rcd_rated_residual_ma', realType(db))
    .addColumn('afdd', 'text', (c) => c.check(sql`afdd in ('yes', 'no')`))
    .addColumn('remarks', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('spur_ring_id', 'integer', (c) => c.references('circuits.id').onDelete('set null'))
    .addColumn('spur_origin_point', 'text')
    .addColumn('spur_length_m', realType(db))
    .addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
    .execute();
  await db.schema.createIndex('circuits_board_position').on('circuits').columns(['board_id', 'position']).execute();

  await db.schema
    .createTable('cells')
    .addColumn('circuit_id', 'integer', (c) => c.notNull().references('circuits.id').onDelete('cascade'))
    .addColumn('column_key', 'text', (c) => c.notNull())
    .addColumn('text', 'text', (c) => c.notNull())
    .addColumn('reason', 'text')
    .addColumn('version', 'integer', (c) => c.notNull())
    .addColumn('updated_by', 'integer', (c) => c.references('users.id'))
    .addColumn('updated_at', 'text', (c) => c.notNull())
    .addPrimaryKeyConstraint('cells_pk', ['circuit_id', 'column_key'])
    .execute();

  // Append-only: rows are inserted, never updated or deleted (the triggers refuse it).
  await db.schema
    .createTable('history')
    .addColumn('id', 'integer', idKey(db))
    .addColumn('board_id', 'integer', (c) => c.notNull())
    .addColumn('circuit_id', 'integer')
    .addColumn('column_key', 'text')
    .addColumn('action', 'text', (c) => c.notNull())
    .addColumn('old_text', 'text')
    .addColumn('new_text', 'text')
    .addColumn('user_id', 'integer')
    .addColumn('at', 'text', (c) => c.notNull())
    .addColumn('how', 'text', (c) => c.notNull())
    // Version of the cell, circuit or board after this change: lets a stale edit of one field
    // go through when only other fields changed meanwhile.
    .addColumn('version', 'integer')
    .execute();
  await db.schema.createIndex('history_board_id').on('history').columns(['board_id', 'id']).execute();
  await appendOnly(db, 'history', 'history is append-only');

  await db.schema
    .createTable('app_settings')
    .addColumn('key', 'text', (c) => c.primaryKey())
    .addColumn('value', 'text', (c) => c.notNull())
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of ['app_settings', 'history', 'cells', 'circuits', 'boards', 'jobs', 'sites', 'users']) {
    await db.schema.dropTable(table).ifExists().execute();
  }
}
