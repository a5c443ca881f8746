import { sql } from 'kysely';
import type { DB } from './db/database.ts';
import type { PresenceTracker } from './presence.ts';

/** The `presence` table (PostgreSQL only; made by migration 2026-12-02T1300). */
interface PresenceTable {
  board_id: number;
  user_id: number;
  name: string;
  seen_at: Date;
}

/**
 * Presence kept in PostgreSQL, so people on different instances behind a load balancer see each
 * other on a board. One row per (board, person), stamped with the database's clock (the instances'
 * clocks may differ; the database has one); rows older than the window are ignored and swept.
 */
export class SharedPresence implements PresenceTracker {
  private readonly db;

  constructor(
    db: DB,
    private readonly windowMs = 10_000,
  ) {
    this.db = db.withTables<{ presence: PresenceTable }>();
  }

  async touch(boardId: number, user: { id: number; name: string }): Promise<void> {
    await this.db
      .insertInto('presence')
      .values({ board_id: boardId, user_id: user.id, name: user.name, seen_at: sql<Date>`clock_timestamp()` })
      .onConflict((oc) => oc.columns(['board_id', 'user_id']).doUpdateSet({ name: user.name, seen_at: sql<Date>`clock_timestamp()` }))
      .execute();
  }

  async others(boardId: number, exceptUserId: number): Promise<{ id: number; name: string }[]> {
    const cutoff = sql<Date>`clock_timestamp() - make_interval(secs => ${this.windowMs / 1000})`;
    await this.db.deleteFrom('presence').where('board_id', '=', boardId).where('seen_at', '<', cutoff).execute();
    const rows = await this.db
      .selectFrom('presence')
      .select(['user_id', 'name'])
      .where('board_id', '=', boardId)
      .where('user_id', '!=', exceptUserId)
      .where('seen_at', '>=', cutoff)
      .execute();
    // Sorted here as Presence sorts (localeCompare), not by the database's collation.
    return rows.map((r) => ({ id: r.user_id, name: r.name })).sort((a, b) => a.name.localeCompare(b.name));
  }
}
