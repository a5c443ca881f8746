import { z } from 'zod';

/**
 * The company's own details, printed on every issued document (admin → company page). Kept in
 * `app_settings` under the key `company` as JSON; the logo is a file (`files` row, kind `logo`).
 */
export const companyFieldsSchema = z.object({
  name: z.string().trim().min(1, 'Give the company name.').max(200, 'At most 200 characters.'),
  address: z.string().trim().max(400, 'At most 400 characters.'),
  phone: z.string().trim().max(40, 'At most 40 characters.'),
  email: z.union([z.literal(''), z.email({ error: 'That is not an e-mail address.' })]),
  /** Registration with a scheme or trade body, in words, if any. */
  registration: z.string().trim().max(200, 'At most 200 characters.'),
  /**
   * How new job references are made: `{kind}` (EIC/EICR), `{yyyy}`, `{yy}`, `{mm}`, and `{seq}`
   * or `{seq:4}` (the next number of the year, zero-padded to 4). E.g. `{kind}-{yyyy}-{seq:4}`.
   */
  referencePattern: z
    .string()
    .trim()
    .min(1, 'Give a pattern for job references.')
    .max(60, 'At most 60 characters.')
    .refine((p) => /\{seq(:\d)?\}/.test(p), 'The pattern needs {seq} (or {seq:4}) so every reference differs.'),
});
export type CompanyFields = z.infer<typeof companyFieldsSchema>;

export const companySchema = companyFieldsSchema.extend({
  /** The logo file's id, or null when none was uploaded. */
  logoFileId: z.number().int().nullable(),
});
export type Company = z.infer<typeof companySchema>;
/** `GET /api/company` and `PUT /api/company` answer the company's details. */
export const companyResponseSchema = z.object({ company: companySchema });

export const defaultCompany: Company = {
  name: 'Your company name',
  address: '',
  phone: '',
  email: '',
  registration: '',
  referencePattern: '{kind}-{yyyy}-{seq:4}',
  logoFileId: null,
};

/**
 * Makes a job reference from the pattern. `seq` is the number to use (the caller finds the next
 * free one for the year and kind).
 */
export function formatJobReference(pattern: string, kind: 'EIC' | 'EICR', date: string, seq: number): string {
  const [yyyy = '', mm = ''] = date.split('-');
  return pattern
    .replaceAll('{kind}', kind)
    .replaceAll('{yyyy}', yyyy)
    .replaceAll('{yy}', yyyy.slice(2))
    .replaceAll('{mm}', mm)
    .replace(/\{seq(?::(\d))?\}/g, (_m, width: string | undefined) => String(seq).padStart(Number(width ?? 1), '0'));
}
