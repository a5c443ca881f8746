import type { Kysely } from 'kysely';

/**
 * The length of a circuit's cable (m), when the tester knows it: a radial's R1+R2 is checked against
 * length × R1+R2 per metre. Empty for circuits recorded without it.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('circuits').addColumn('cable_length_m', 'real').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('circuits').dropColumn('cable_length_m').execute();
}
