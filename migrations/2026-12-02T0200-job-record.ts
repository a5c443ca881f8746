import { sql, type Kysely } from 'kysely';
import { idKey, nowText, appendOnly } from './lib/dialect.ts';

/**
 * The certificate or report around the schedules: contact details on the site, the job's own
 * dates, state and version, the record's sections as versioned JSON documents, an append-only
 * history of the job record, and a link from a circuit to the same circuit on an earlier job
 * (for comparing readings with last time). Frozen: later changes get migrations of their own.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('sites').addColumn('contact_name', 'text', (c) => c.notNull().defaultTo('')).execute();
  await db.schema.alterTable('sites').addColumn('contact_email', 'text', (c) => c.notNull().defaultTo('')).execute();
  await db.schema.alterTable('sites').addColumn('version', 'integer', (c) => c.notNull().defaultTo(1)).execute();

  await db.schema.alterTable('jobs').addColumn('visit_end_date', 'text').execute();
  await db.schema
    .alterTable('jobs')
    .addColumn('state', 'text', (c) =>
      c.notNull().defaultTo('entering').check(sql`state in ('entering', 'ready', 'approved', 'issued')`),
    )
    .execute();
  await db.schema.alterTable('jobs').addColumn('version', 'integer', (c) => c.notNull().defaultTo(1)).execute();
  // The earlier job this one started from (an EICR following an earlier EIC or EICR).
  await db.schema.alterTable('jobs').addColumn('started_from_job_id', 'integer').execute();
  await db.schema
    .alterTable('jobs')
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(nowText(db)))
    .execute();

  // The same circuit on the earlier job's board, when this board was started from it.
  await db.schema.alterTable('circuits').addColumn('previous_circuit_id', 'integer').execute();

  // One row per section of a job's record; `data` is the section as JSON (see
  // shared/schemas/job-record.ts), `version` goes up on every change of the section.
  await db.schema
    .createTable('job_sections')
    .addColumn('job_id', 'integer', (c) => c.notNull().references('jobs.id').onDelete('cascade'))
    .addColumn('section', 'text', (c) => c.notNull())
    .addColumn('data', 'text', (c) => c.notNull())
    .addColumn('version', 'integer', (c) => c.notNull().defaultTo(1))
    .addColumn('updated_by', 'integer', (c) => c.references('users.id'))
    .addColumn('updated_at', 'text', (c) => c.notNull())
    .addPrimaryKeyConstraint('job_sections_pk', ['job_id', 'section'])
    .execute();

  // Append-only, like `history` for boards: every change of a job's record, details or state.
  await db.schema
    .createTable('job_history')
    .addColumn('id', 'integer', idKey(db))
    .addColumn('job_id', 'integer', (c) => c.notNull())
    // `section` and `field` name what changed (null for the job's own details or state).
    .addColumn('section', 'text')
    .addColumn('field', 'text')
    // e.g. `created`, `details`, `record`, `state`, `board-created`, `reopened`, `issued`.
    .addColumn('action', 'text', (c) => c.notNull())
    // Old and new values as JSON text.
    .addColumn('old_text', 'text')
    .addColumn('new_text', 'text')
    .addColumn('reason', 'text')
    .addColumn('user_id', 'integer')
    .addColumn('at', 'text', (c) => c.notNull())
    // Version of the section (or the job) after this change.
    .addColumn('version', 'integer')
    .execute();
  await db.schema.createIndex('job_history_job_id').on('job_history').columns(['job_id', 'id']).execute();
  await appendOnly(db, 'job_history', 'job history is append-only');
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('job_history').ifExists().execute();
  await db.schema.dropTable('job_sections').ifExists().execute();
  await db.schema.alterTable('circuits').dropColumn('previous_circuit_id').execute();
  for (const column of ['created_at', 'started_from_job_id', 'version', 'state', 'visit_end_date']) {
    await db.schema.alterTable('jobs').dropColumn(column).execute();
  }
  for (const column of ['version', 'contact_email', 'contact_name']) {
    await db.schema.alterTable('sites').dropColumn(column).execute();
  }
}
