/**
 * Who has a board open, as the board routes see it. `Presence` keeps it in this process's memory
 * (one instance, SQLite); `SharedPresence` (shared-presence.ts) keeps it in PostgreSQL so several
 * instances see each other's people.
 */
export interface PresenceTracker {
  touch(boardId: number, user: { id: number; name: string }): void | Promise<void>;
  others(boardId: number, exceptUserId: number): { id: number; name: string }[] | Promise<{ id: number; name: string }[]>;
}

/** Who has a board open: refreshed by every board fetch and every poll of its changes feed. */
export class Presence implements PresenceTracker {
  private readonly seen = new Map<number, Map<number, { name: string; at: number }>>();

  constructor(
    private readonly windowMs = 10_000,
    private readonly now: () => number = Date.now,
  ) {}

  touch(boardId: number, user: { id: number; name: string }): void {
    let people = this.seen.get(boardId);
    if (!people) this.seen.set(boardId, (people = new Map()));
    people.set(user.id, { name: user.name, at: this.now() });
  }

  /** People other than `exceptUserId` seen on the board within the window, by name. */
  others(boardId: number, exceptUserId: number): { id: number; name: string }[] {
    const people = this.seen.get(boardId);
    if (!people) return [];
    const cutoff = this.now() - this.windowMs;
    const result: { id: number; name: string }[] = [];
    for (const [id, entry] of people) {
      if (entry.at < cutoff) people.delete(id);
      else if (id !== exceptUserId) result.push({ id, name: entry.name });
    }
    return result.sort((a, b) => a.name.localeCompare(b.name));
  }
}
