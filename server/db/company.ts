import { companySchema, defaultCompany, type Company, type CompanyFields } from '../../shared/schemas/company.ts';
import type { DB } from './database.ts';

const companyKey = 'company';

/** The company's details (app_settings `company`), or the defaults when none were saved. */
export async function loadCompany(db: DB): Promise<Company> {
  const row = await db.selectFrom('app_settings').select('value').where('key', '=', companyKey).executeTakeFirst();
  if (!row) return { ...defaultCompany };
  let stored: unknown;
  try {
    stored = JSON.parse(row.value);
  } catch {
    return { ...defaultCompany };
  }
  // Fields saved by an older version fall back to their defaults one by one.
  const parsed = companySchema.partial().safeParse(stored);
  return parsed.success ? { ...defaultCompany, ...stripUndefined(parsed.data) } : { ...defaultCompany };
}

/** Saves the company's details; the logo (a file of its own) is kept as it is. */
export async function saveCompany(db: DB, fields: CompanyFields): Promise<Company> {
  const current = await loadCompany(db);
  const company: Company = { ...fields, logoFileId: current.logoFileId };
  await db
    .insertInto('app_settings')
    .values({ key: companyKey, value: JSON.stringify(company) })
    .onConflict((oc) => oc.column('key').doUpdateSet({ value: JSON.stringify(company) }))
    .execute();
  return company;
}

function stripUndefined<T extends object>(value: T): Partial<T> {
  return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as Partial<T>;
}

/** Sets (or clears, with null) the logo's file id; the text details are kept as they are. */
export async function saveCompanyLogo(db: DB, logoFileId: number | null): Promise<Company> {
  const company: Company = { ...(await loadCompany(db)), logoFileId };
  await db
    .insertInto('app_settings')
    .values({ key: companyKey, value: JSON.stringify(company) })
    .onConflict((oc) => oc.column('key').doUpdateSet({ value: JSON.stringify(company) }))
    .execute();
  return company;
}
