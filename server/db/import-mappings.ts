import { importMappingColumnSchema, type SaveMappingBody, type SavedMapping } from '../../shared/schemas/import.ts';
import { z } from 'zod';
import type { DB } from './database.ts';
import type { ImportMappingRow } from './types.ts';

const columnsSchema = z.array(importMappingColumnSchema);

function toSavedMapping(row: ImportMappingRow, names: ReadonlyMap<number, string>): SavedMapping {
  return {
    id: row.id,
    name: row.name,
    scope: row.owner_id === null ? 'company' : 'mine',
    columns: columnsSchema.parse(JSON.parse(row.columns)),
    createdBy: row.created_by ? { id: row.created_by, name: names.get(row.created_by) ?? 'former user' } : null,
    updatedAt: row.updated_at,
  };
}

/** The person's own mappings and the company's, by name. */
export async function listMappings(db: DB, userId: number, names: ReadonlyMap<number, string>): Promise<SavedMapping[]> {
  const rows = await db
    .selectFrom('import_mappings')
    .selectAll()
    .where((eb) => eb.or([eb('owner_id', '=', userId), eb('owner_id', 'is', null)]))
    .orderBy('name')
    .execute();
  return rows.map((r) => toSavedMapping(r, names));
}

/** Saves a mapping; one of the same name and scope is replaced (saving again under a name updates it). */
export async function saveMapping(db: DB, userId: number, body: SaveMappingBody): Promise<number> {
  const owner = body.scope === 'company' ? null : userId;
  const existing = await db
    .selectFrom('import_mappings')
    .select('id')
    .where('name', '=', body.name)
    .where((eb) => (owner === null ? eb('owner_id', 'is', null) : eb('owner_id', '=', owner)))
    .executeTakeFirst();
  const columns = JSON.stringify(body.columns);
  const now = new Date().toISOString();
  if (existing) {
    await db.updateTable('import_mappings').set({ columns, updated_at: now, created_by: userId }).where('id', '=', existing.id).execute();
    return existing.id;
  }
  const row = await db
    .insertInto('import_mappings')
    .values({ name: body.name, owner_id: owner, columns, created_by: userId, updated_at: now })
    .returning('id')
    .executeTakeFirstOrThrow();
  return row.id;
}

export function findMapping(db: DB, id: number) {
  return db.selectFrom('import_mappings').selectAll().where('id', '=', id).executeTakeFirst();
}

export async function deleteMapping(db: DB, id: number): Promise<void> {
  await db.deleteFrom('import_mappings').where('id', '=', id).execute();
}
