import bcrypt from 'bcryptjs';
import type { Role } from '../../shared/schemas/common.ts';
import type { DB } from './database.ts';
import type { UserRow } from './types.ts';

/** bcrypt cost: 10 ≈ 80 ms a hash on this class of machine; sign-in is rate-limited as well. */
export const passwordCost = 10;

export function findUserById(db: DB, id: number): Promise<UserRow | undefined> {
  return db.selectFrom('users').selectAll().where('id', '=', id).executeTakeFirst();
}

export function findUserByEmail(db: DB, email: string): Promise<UserRow | undefined> {
  return db.selectFrom('users').selectAll().where('email', '=', email.toLowerCase()).executeTakeFirst();
}

export function listUsers(db: DB): Promise<UserRow[]> {
  return db.selectFrom('users').selectAll().orderBy('name').execute();
}

export async function createUser(
  db: DB,
  input: { email: string; name: string; role: Role; password: string },
): Promise<UserRow> {
  const password_hash = await bcrypt.hash(input.password, passwordCost);
  return db
    .insertInto('users')
    .values({ email: input.email.toLowerCase(), name: input.name, role: input.role, password_hash })
    .returningAll()
    .executeTakeFirstOrThrow();
}

/**
 * Changes a person. A new password or a deactivation raises their session generation, which ends
 * every session made before (the middleware compares it on each request); `byUserId` is who did it.
 */
export async function updateUser(
  db: DB,
  id: number,
  input: { name?: string; role?: Role; password?: string; active?: boolean },
  byUserId?: number,
): Promise<UserRow | undefined> {
  const existing = await findUserById(db, id);
  if (!existing) return undefined;
  const values: Partial<Pick<UserRow, 'name' | 'role' | 'password_hash' | 'deactivated_at' | 'deactivated_by' | 'session_generation'>> = {};
  let endSessions = false;
  if (input.name !== undefined) values.name = input.name;
  if (input.role !== undefined) values.role = input.role;
  if (input.password !== undefined) {
    values.password_hash = await bcrypt.hash(input.password, passwordCost);
    endSessions = true;
  }
  if (input.active === false && existing.deactivated_at === null) {
    values.deactivated_at = new Date().toISOString();
    values.deactivated_by = byUserId ?? null;
    endSessions = true;
  }
  if (input.active === true && existing.deactivated_at !== null) {
    values.deactivated_at = null;
    values.deactivated_by = null;
  }
  if (endSessions) values.session_generation = existing.session_generation + 1;
  if (Object.keys(values).length === 0) return existing;
  return db.updateTable('users').set(values).where('id', '=', id).returningAll().executeTakeFirst();
}

/** Admins who can still sign in (a deactivated admin cannot run anything). */
export async function countAdmins(db: DB): Promise<number> {
  const row = await db
    .selectFrom('users')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('role', '=', 'admin')
    .where('deactivated_at', 'is', null)
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

let dummyHash: string | undefined;

/**
 * Checks a password against the stored hash. An unknown e-mail is compared against a dummy hash
 * so that both cases take the same time and the answer does not reveal which e-mails exist.
 */
export async function verifyPassword(user: UserRow | undefined, password: string): Promise<boolean> {
  dummyHash ??= await bcrypt.hash('no such user', passwordCost);
  const hash = user?.password_hash ?? dummyHash;
  const ok = await bcrypt.compare(password, hash);
  return ok && user !== undefined;
}

export async function userNames(db: DB): Promise<Map<number, string>> {
  const rows = await db.selectFrom('users').select(['id', 'name']).execute();
  return new Map(rows.map((r) => [r.id, r.name]));
}
