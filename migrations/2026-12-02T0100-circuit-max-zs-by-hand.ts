import type { Kysely } from 'kysely';
import { realType } from './lib/dialect.ts';

/**
 * A maximum Zs entered by hand, for a device the published tables do not cover (the value
 * from the maker's data): recorded with the circuit so a reviewer sees where the limit came from.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('circuits').addColumn('max_zs_by_hand_ohm', realType(db)).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('circuits').dropColumn('max_zs_by_hand_ohm').execute();
}
