import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type SQLite from 'better-sqlite3';
import compression from 'compression';
import express, { type Express } from 'express';
import session from 'express-session';
import makeSqliteStore from 'better-sqlite3-session-store';
import makePgStore from 'connect-pg-simple';
import helmet from 'helmet';
import type pg from 'pg';
import type { DB } from './db/database.ts';
import { findUserById } from './db/users.ts';
import { apiNotFound, errorHandler } from './middleware/error-handler.ts';
import { requireUser, type UserLoader } from './middleware/auth.ts';
import { parseAllowedOrigins, sameOriginOnly } from './middleware/same-origin.ts';
import { FileStore } from './files.ts';
import { MailSender } from './mail/mail-sender.ts';
import { Presence, type PresenceTracker } from './presence.ts';
import { SharedPresence } from './shared-presence.ts';
import { authRoutes } from './routes/auth.ts';
import { boardRoutes } from './routes/boards.ts';
import { checkRoutes } from './routes/check.ts';
import { companyRoutes } from './routes/company.ts';
import { exportRoutes } from './routes/exports.ts';
import { fileRoutes } from './routes/files.ts';
import { issueRoutes } from './routes/issues.ts';
import { jobRoutes } from './routes/jobs.ts';
import { mailboxRoutes, mailRoutes } from './routes/mail.ts';
import { reviewRoutes } from './routes/review.ts';
import { signatureRoutes } from './routes/signatures.ts';
import { importRoutes } from './routes/imports.ts';
import { photoRoutes } from './routes/photos.ts';
import { ringSocketRoutes } from './routes/ring-sockets.ts';
import { siteRoutes } from './routes/sites.ts';
import { userRoutes } from './routes/users.ts';

const SqliteStore = makeSqliteStore(session);
const PgStore = makePgStore(session);

/** How often a session's stored expiry is renewed at most (every request renews the cookie). */
export const sessionRenewalMs = 60_000;

/** Remembers when each session's expiry was last written, so it is renewed at most once a minute. */
class RenewalNotes {
  private readonly renewedAt = new Map<string, number>();

  written(sid: string): void {
    this.renewedAt.set(sid, Date.now());
  }

  /** True when the session's expiry should be written now (and notes that it is). */
  due(sid: string): boolean {
    const now = Date.now();
    const last = this.renewedAt.get(sid);
    if (last !== undefined && now - last < sessionRenewalMs) return false;
    if (this.renewedAt.size > 10_000) {
      for (const [id, at] of this.renewedAt) if (now - at >= sessionRenewalMs) this.renewedAt.delete(id);
    }
    this.renewedAt.set(sid, now);
    return true;
  }

  forget(sid: string): void {
    this.renewedAt.delete(sid);
  }
}

/**
 * The SQLite session store, with two changes: its expiry sweep does not keep a process (a script,
 * a test) alive, and a session's expiry is written at most once a minute rather than on every
 * request (the live feed polls every second). A session may thus end up to a minute before its
 * cookie says, out of 12 hours.
 */
class QuietSqliteStore extends SqliteStore {
  private readonly renewals = new RenewalNotes();

  override startInterval(): void {
    setInterval(() => this.clearExpiredSessions(), 15 * 60_000).unref();
  }

  override set(sid: string, sess: session.SessionData, cb?: (err?: unknown) => void): void {
    this.renewals.written(sid);
    super.set(sid, sess, cb);
  }

  override touch(sid: string, sess: session.SessionData, cb?: (err?: unknown) => void): void {
    if (this.renewals.due(sid)) super.touch(sid, sess, cb);
    else cb?.();
  }

  override destroy(sid: string, cb?: (err?: unknown) => void): void {
    this.renewals.forget(sid);
    super.destroy(sid, cb);
  }
}

/**
 * The PostgreSQL session store (several instances share it), with the same renewal at most once a
 * minute as the SQLite one (each instance keeps its own note of when it last renewed a session).
 * Its expiry sweep timer is already unref()ed.
 */
class QuietPgStore extends PgStore {
  private readonly renewals = new RenewalNotes();

  override set(sid: string, sess: session.SessionData, cb?: (err?: unknown) => void): void {
    this.renewals.written(sid);
    super.set(sid, sess, cb);
  }

  override touch(sid: string, sess: session.SessionData, cb?: () => void): void {
    if (this.renewals.due(sid)) super.touch(sid, sess, cb);
    else cb?.();
  }

  override destroy(sid: string, cb?: (err?: unknown) => void): void {
    this.renewals.forget(sid);
    super.destroy(sid, cb);
  }
}

export interface AppOptions {
  db: DB;
  /** The same SQLite handle: sessions are kept in the same file. */
  sqlite?: SQLite.Database;
  /**
   * On PostgreSQL (DATABASE_URL) instead of `sqlite`: the pool `db` runs on. Sessions and presence
   * are then kept in the database, so several instances can share it.
   */
  postgres?: pg.Pool;
  sessionSecret: string;
  /** Built client (vite build output) to serve; omitted in API-only tests. */
  clientDir?: string;
  signInAttemptsPerMinute?: number;
  /** Presence window; tests shorten it. */
  presence?: PresenceTracker;
  /** Folder for stored files (`files/…`) and the local mailbox (`mailbox/`); default `data/`. */
  dataDir?: string;
  /**
   * Where e-mail goes: `smtp://host:port` (SMTP_URL in production, or the local mail server's URL).
   * Without it nothing can be sent, and each send fails saying so.
   */
  smtpUrl?: string;
  /** The From address of e-mail (MAIL_FROM); defaults to the company's e-mail. */
  mailFrom?: string;
  /** The local mail server's port when it is the one receiving mail (shown on the mailbox page). */
  localMailPort?: number | null;
  /**
   * Origins allowed to send changes besides the app's own (a reverse proxy's public address).
   * Defaults to BOARDWALK_ALLOWED_ORIGINS (comma-separated).
   */
  allowedOrigins?: readonly string[];
}

/** What createApp made that the process around it may need (index.ts resumes the mail sender). */
export interface AppServices {
  files: FileStore;
  mailSender: MailSender;
}

/** Builds the Express app. It never listens: server/index.ts does, and tests use port 0. */
export function createApp(options: AppOptions): Express {
  const { db } = options;
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  // gzip or brotli for every answer over 1 kB (a cold 300-way console is ≈ 1.4 MB uncompressed).
  app.use(compression());
  app.use(
    helmet({
      // Boardwalk is often run on a site laptop or a LAN over plain HTTP: upgrading every request
      // to HTTPS would leave the page without its scripts there. Behind HTTPS nothing changes.
      contentSecurityPolicy: { directives: { upgradeInsecureRequests: null } },
    }),
  );
  // Before any body is read: a change sent by another site's page is refused unread.
  app.use('/api', sameOriginOnly({ allowedOrigins: options.allowedOrigins ?? parseAllowedOrigins(process.env.BOARDWALK_ALLOWED_ORIGINS) }));
  app.use(express.json({ limit: '2mb' }));
  app.use(
    session({
      name: 'boardwalk.sid',
      secret: options.sessionSecret,
      store: sessionStore(options),
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure: 'auto', maxAge: 12 * 60 * 60 * 1000 },
    }),
  );

  const loadUser: UserLoader = async (id) => {
    const row = await findUserById(db, id);
    return (
      row && {
        user: { id: row.id, email: row.email, name: row.name, role: row.role },
        sessionGeneration: row.session_generation,
        deactivated: row.deactivated_at !== null,
      }
    );
  };
  const presence = options.presence ?? (options.postgres ? new SharedPresence(db) : new Presence());
  const dataDir = path.resolve(options.dataDir ?? 'data');
  const files = new FileStore(dataDir);
  const mailSender = new MailSender(db, files, { smtpUrl: options.smtpUrl, from: options.mailFrom });
  const services: AppServices = { files, mailSender };
  app.locals.services = services;

  const api = express.Router();
  api.use('/auth', authRoutes(db, loadUser, { signInAttemptsPerMinute: options.signInAttemptsPerMinute ?? 20 }));
  api.use(requireUser(loadUser));
  api.use('/users', userRoutes(db));
  api.use('/check', checkRoutes());
  api.use('/boards', boardRoutes(db, presence));
  api.use('/jobs', jobRoutes(db));
  api.use('/company', companyRoutes(db, files));
  api.use('/', siteRoutes(db));
  api.use('/', reviewRoutes(db));
  api.use('/files', fileRoutes(db, files));
  api.use('/', signatureRoutes(db, files));
  api.use('/', mailRoutes(db, mailSender));
  api.use('/admin/mailbox', mailboxRoutes(path.join(dataDir, 'mailbox'), options.localMailPort ?? null));
  api.use('/', issueRoutes(db, { dataDir }));
  api.use('/', exportRoutes(db));
  api.use('/', importRoutes(db));
  api.use('/', photoRoutes(db, files));
  api.use('/', ringSocketRoutes(db));
  api.use(apiNotFound);
  app.use('/api', api);

  if (options.clientDir) {
    const indexHtml = path.join(options.clientDir, 'index.html');
    if (!fs.existsSync(indexHtml)) throw new Error(`No built client at ${options.clientDir}: run "npm run build" first.`);
    // Built files under assets/ carry a hash of their content in their name: a new build makes new
    // names, so they may be kept for a year. A missing one is a 404, never the page in its place.
    app.use(
      '/assets',
      express.static(path.join(options.clientDir, 'assets'), { index: false, immutable: true, maxAge: '1y', fallthrough: false }),
    );
    app.use(express.static(options.clientDir, { index: false, maxAge: '1h' }));
    // Client-side routes (/boards/7, /jobs …) all load the single page, asked for again each time
    // (it names the current build's assets).
    app.get('/{*splat}', (_req, res) => {
      res.set('Cache-Control', 'no-cache');
      res.sendFile(indexHtml);
    });
  }

  app.use(errorHandler);
  return app;
}

/** Sessions live in the app's own database: the SQLite file, or PostgreSQL's `sessions` table. */
function sessionStore(options: AppOptions): session.Store {
  if (options.postgres) return new QuietPgStore({ pool: options.postgres, tableName: 'sessions', createTableIfMissing: false });
  if (options.sqlite) return new QuietSqliteStore({ client: options.sqlite });
  throw new Error('createApp needs the database handle for sessions: sqlite or postgres.');
}

/** The services createApp made (file store, mail sender). */
export function appServices(app: Express): AppServices {
  return app.locals.services as AppServices;
}

/** A session secret kept in the database, made once, so sign-ins survive a restart. */
export async function sessionSecretFrom(db: DB): Promise<string> {
  const row = await db.selectFrom('app_settings').select('value').where('key', '=', 'session_secret').executeTakeFirst();
  if (row) return row.value;
  const value = crypto.randomBytes(32).toString('hex');
  // Two instances starting at once on one database: the first secret written wins for both.
  await db.insertInto('app_settings').values({ key: 'session_secret', value }).onConflict((oc) => oc.column('key').doNothing()).execute();
  return (await db.selectFrom('app_settings').select('value').where('key', '=', 'session_secret').executeTakeFirstOrThrow()).value;
}
