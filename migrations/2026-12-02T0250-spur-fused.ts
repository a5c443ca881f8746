import type { Kysely } from 'kysely';

/**
 * Whether a spur is fused (through a fused connection unit, which may feed any number of points) or
 * unfused (one single or twin socket or one fixed appliance): `fused`, `unfused`, or empty when not
 * recorded. Part of the spur's link to its ring.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('circuits').addColumn('spur_protection', 'text').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('circuits').dropColumn('spur_protection').execute();
}
