import { companySchema, defaultCompany, type Company } from '../../shared/schemas/company.ts';
import type { DB } from './database.ts';

/** The company's details (app_settings key `company`), or the defaults when none were saved. */
export async function readCompany(db: DB): Promise<Company> {
  const row = await db.selectFrom('app_settings').select('value').where('key', '=', 'company').executeTakeFirst();
  if (!row) return { ...defaultCompany };
  const parsed = companySchema.safeParse({ ...defaultCompany, ...(JSON.parse(row.value) as object) });
  return parsed.success ? parsed.data : { ...defaultCompany };
}

/** Replaces the saved company details. */
export async function saveCompany(db: DB, company: Company): Promise<void> {
  const value = JSON.stringify(company);
  await db
    .insertInto('app_settings')
    .values({ key: 'company', value })
    .onConflict((oc) => oc.column('key').doUpdateSet({ value }))
    .execute();
}
