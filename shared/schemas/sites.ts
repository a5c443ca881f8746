import { z } from 'zod';

export const earthingArrangements = ['TN-S', 'TN-C-S', 'TT'] as const;
export const jobKinds = ['EIC', 'EICR'] as const;

export const siteSchema = z.object({
  id: z.number().int(),
  client: z.string(),
  address: z.string(),
  description: z.string(),
  earthing: z.enum(earthingArrangements),
  /** Nominal voltage to earth U0 (V). */
  nominalVoltageV: z.number(),
  /** External earth fault loop impedance at the origin (Ω), as measured. */
  zeOhm: z.number().nullable(),
  /** Prospective fault current at the origin (kA). */
  pfcKa: z.number().nullable(),
});
export type Site = z.infer<typeof siteSchema>;

export const jobSchema = z.object({
  id: z.number().int(),
  siteId: z.number().int(),
  kind: z.enum(jobKinds),
  reference: z.string(),
  visitDate: z.string(),
  /** General limitations agreed with the client. */
  limitations: z.string(),
});
export type Job = z.infer<typeof jobSchema>;

export const siteListResponseSchema = z.object({ sites: z.array(siteSchema) });
export const jobListResponseSchema = z.object({ jobs: z.array(jobSchema) });
