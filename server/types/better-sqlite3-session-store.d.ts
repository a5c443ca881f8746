declare module 'better-sqlite3-session-store' {
  import type session from 'express-session';
  import type { Database } from 'better-sqlite3';

  interface SqliteStoreOptions {
    client: Database;
    expired?: { clear?: boolean; intervalMs?: number };
  }

  type SqliteStoreClass = new (options: SqliteStoreOptions) => session.Store & {
    startInterval(): void;
    clearExpiredSessions(): void;
  };

  export default function makeStore(s: typeof session): SqliteStoreClass;
}
