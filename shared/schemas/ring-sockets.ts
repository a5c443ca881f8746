import { z } from 'zod';

/**
 * One socket of a ring, in ring order: its label (optional), its position along the ring as a
 * fraction 0..1 when known, and the step-2 (L-N) and step-3 (L-cpc) readings as typed (Ω).
 */
export const ringSocketSchema = z.object({
  label: z.string().max(40),
  position: z.number().min(0).max(1).nullable(),
  lineNeutral: z.string().max(12),
  lineCpc: z.string().max(12),
});
export type RingSocket = z.infer<typeof ringSocketSchema>;

export const ringSocketsSchema = z.array(ringSocketSchema).max(60, 'At most 60 sockets on one ring.');

/** `GET /api/boards/:boardId/circuits/:circuitId/ring-sockets`. Version 0: never written. */
export const ringSocketsResponseSchema = z.object({ sockets: ringSocketsSchema, version: z.number().int() });

/** `PUT` the same path: every socket at once, with the version the typist saw. */
export const writeRingSocketsBodySchema = z.object({ version: z.number().int().min(0), sockets: ringSocketsSchema });

/**
 * A ring's socket readings as shown to the reviewer and printed or exported: the circuit, its
 * sockets as typed, and the checker's diagnosis in words (null when r1 or r2 is not known, so no
 * judgement can be made). `suspects` are the zero-based sockets the diagnosis points at.
 */
export const ringReadingsSchema = z.object({
  circuitId: z.number().int(),
  circuitNumber: z.string(),
  description: z.string(),
  sockets: ringSocketsSchema,
  diagnosis: z
    .object({
      verdict: z.string(),
      /** The verdict in a few plain words, e.g. "an interconnection (bridge) across the ring". */
      verdictText: z.string(),
      message: z.string(),
      suspects: z.array(z.number().int()),
    })
    .nullable(),
});
export type RingReadings = z.infer<typeof ringReadingsSchema>;
