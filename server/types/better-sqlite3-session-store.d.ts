declare module 'better-sqlite3-session-store' {
  import type session from 'express-session';
  import type { Database } from 'better-sqlite3';

  interface SqliteStoreOptions {
    client: Database;
    expired?: { clear?: boolean; intervalMs?: number };
  }

  class SqliteStore extends session.Store {
    constructor(options: SqliteStoreOptions);
    get(sid: string, callback: (err: unknown, session?: session.SessionData | null) => void): void;
    set(sid: string, session: session.SessionData, callback?: (err?: unknown) => void): void;
    destroy(sid: string, callback?: (err?: unknown) => void): void;
    /** Renews a session's stored expiry from `session.cookie.expires`. */
    touch(sid: string, session: session.SessionData, callback?: (err?: unknown) => void): void;
    /** Starts the expiry sweep (a setInterval that is not unref'd). */
    startInterval(): void;
    clearExpiredSessions(): void;
  }

  export default function makeStore(s: typeof session): typeof SqliteStore;
}
