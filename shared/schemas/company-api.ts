import { z } from 'zod';
import { companySchema } from './company.ts';

/** `GET /api/company`, `PUT /api/company`, `POST|DELETE /api/company/logo` all answer the details as they now stand. */
export const companyResponseSchema = z.object({ company: companySchema });

/** Largest logo accepted (bytes): 1 MB. */
export const maxLogoBytes = 1024 * 1024;
