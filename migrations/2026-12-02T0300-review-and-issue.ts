import { sql, type Kysely } from 'kysely';
import { idKey, nowText } from './lib/dialect.ts';

/**
 * Review and issue: files people upload (kept on disk under data/, one row each), findings a
 * reviewer accepted with a reason, signatures, the issued documents (frozen PDFs, one per
 * revision) and the e-mails that carry them. Frozen: later changes get migrations of their own.
 */
export async function up(db: Kysely<any>): Promise<void> {
  const now = nowText(db);
  // Every uploaded or produced file: the bytes live on disk at `path` (relative to the data folder).
  await db.schema
    .createTable('files')
    .addColumn('id', 'integer', idKey(db))
    // e.g. `signature`, `logo`, `photo`, `issued-pdf`.
    .addColumn('kind', 'text', (c) => c.notNull())
    .addColumn('path', 'text', (c) => c.notNull().unique())
    .addColumn('sha256', 'text', (c) => c.notNull())
    .addColumn('mime', 'text', (c) => c.notNull())
    .addColumn('size_bytes', 'integer', (c) => c.notNull())
    .addColumn('original_name', 'text')
    .addColumn('job_id', 'integer', (c) => c.references('jobs.id').onDelete('set null'))
    .addColumn('board_id', 'integer', (c) => c.references('boards.id').onDelete('set null'))
    .addColumn('uploaded_by', 'integer', (c) => c.references('users.id'))
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .execute();

  // An error finding a reviewer accepted with a written reason. A finding is identified by its
  // board, circuit, code and columns (see shared/schemas/review.ts, `findingKey`).
  await db.schema
    .createTable('finding_acceptances')
    .addColumn('id', 'integer', idKey(db))
    .addColumn('job_id', 'integer', (c) => c.notNull().references('jobs.id').onDelete('cascade'))
    .addColumn('board_id', 'integer', (c) => c.references('boards.id').onDelete('cascade'))
    .addColumn('finding_key', 'text', (c) => c.notNull())
    .addColumn('code', 'text', (c) => c.notNull())
    .addColumn('message', 'text', (c) => c.notNull())
    .addColumn('reason', 'text', (c) => c.notNull())
    .addColumn('accepted_by', 'integer', (c) => c.notNull().references('users.id'))
    .addColumn('accepted_at', 'text', (c) => c.notNull().defaultTo(now))
    .execute();
  await db.schema
    .createIndex('finding_acceptances_job_key')
    .on('finding_acceptances')
    .columns(['job_id', 'finding_key'])
    .unique()
    .execute();

  // Who signed what: a typed name and an image (drawn in the browser or uploaded).
  await db.schema
    .createTable('signatures')
    .addColumn('id', 'integer', idKey(db))
    .addColumn('job_id', 'integer', (c) => c.notNull().references('jobs.id').onDelete('cascade'))
    // `designer`, `constructor`, `inspector` or `reviewer` (the declaration's people).
    .addColumn('role', 'text', (c) => c.notNull())
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('file_id', 'integer', (c) => c.notNull().references('files.id'))
    .addColumn('user_id', 'integer', (c) => c.notNull().references('users.id'))
    .addColumn('signed_at', 'text', (c) => c.notNull().defaultTo(now))
    .execute();
  await db.schema.createIndex('signatures_job_role').on('signatures').columns(['job_id', 'role']).execute();

  // Issued documents: one row per revision, never changed once written except to mark it superseded.
  await db.schema
    .createTable('job_issues')
    .addColumn('id', 'integer', idKey(db))
    .addColumn('job_id', 'integer', (c) => c.notNull().references('jobs.id'))
    .addColumn('revision', 'integer', (c) => c.notNull())
    .addColumn('file_id', 'integer', (c) => c.notNull().references('files.id'))
    .addColumn('sha256', 'text', (c) => c.notNull())
    .addColumn('issued_by', 'integer', (c) => c.notNull().references('users.id'))
    .addColumn('issued_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('superseded_at', 'text')
    .execute();
  await db.schema.createIndex('job_issues_job_revision').on('job_issues').columns(['job_id', 'revision']).unique().execute();

  // E-mails sent (or waiting to be sent) to clients.
  await db.schema
    .createTable('outgoing_mail')
    .addColumn('id', 'integer', idKey(db))
    .addColumn('job_id', 'integer', (c) => c.notNull().references('jobs.id'))
    .addColumn('issue_id', 'integer', (c) => c.references('job_issues.id'))
    .addColumn('to_address', 'text', (c) => c.notNull())
    .addColumn('subject', 'text', (c) => c.notNull())
    .addColumn('body', 'text', (c) => c.notNull())
    .addColumn('state', 'text', (c) => c.notNull().defaultTo('waiting').check(sql`state in ('waiting', 'sending', 'sent', 'failed')`))
    .addColumn('attempts', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('last_error', 'text')
    .addColumn('message_id', 'text')
    .addColumn('created_by', 'integer', (c) => c.references('users.id'))
    .addColumn('created_at', 'text', (c) => c.notNull().defaultTo(now))
    .addColumn('sent_at', 'text')
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of ['outgoing_mail', 'job_issues', 'signatures', 'finding_acceptances', 'files']) {
    await db.schema.dropTable(table).ifExists().execute();
  }
}
