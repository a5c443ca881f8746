import { z } from 'zod';
import { readingKeys } from './columns.ts';

/**
 * Shapes of the instrument-file import and of the photos of the paper notes (see
 * shared/import/ for the reading and mapping itself).
 */

/** What a file column is mapped to: a reading column, the circuit number, or nothing. */
export const importTargets = ['circuit', 'ignore', ...readingKeys] as const;
export const importTargetSchema = z.enum(importTargets);
export type ImportTarget = z.infer<typeof importTargetSchema>;

/** The encodings the import reads. */
export const importEncodings = ['utf-8', 'windows-1252'] as const;
export type ImportEncoding = (typeof importEncodings)[number];

/** A file read into a table, with a proposed mapping (POST /api/boards/:boardId/import/read). */
export const importTableSchema = z.object({
  fileName: z.string(),
  encoding: z.enum(importEncodings),
  /** Why that encoding, in words. */
  encodingNote: z.string(),
  delimiter: z.enum([',', ';', '\t']),
  /** The file's header cells (the row that names the columns), one per column. */
  headers: z.array(z.string()),
  /** The data rows below the header, each as text cells (padded to the header's length). */
  rows: z.array(z.array(z.string())),
  /** 1-based line of the file where the first data row is (for messages). */
  firstDataLine: z.number().int(),
  /** Whether numbers use a decimal comma (a semicolon file with "0,43"). */
  decimalComma: z.boolean(),
});
export type ImportTable = z.infer<typeof importTableSchema>;

/** One file column's mapping: its position, its header, and where it goes. */
export const importMappingColumnSchema = z.object({
  header: z.string().max(200),
  target: importTargetSchema,
});
export type ImportMappingColumn = z.infer<typeof importMappingColumnSchema>;

export const importReadResponseSchema = z.object({
  table: importTableSchema,
  /** The proposed target per file column, with why (in words). */
  proposal: z.array(z.object({ target: importTargetSchema, why: z.string() })),
});
export type ImportReadResponse = z.infer<typeof importReadResponseSchema>;

/** A mapping saved under a name (per person, or for the whole company). */
export const savedMappingSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  scope: z.enum(['mine', 'company']),
  columns: z.array(importMappingColumnSchema),
  createdBy: z.object({ id: z.number().int(), name: z.string() }).nullable(),
  updatedAt: z.string(),
});
export type SavedMapping = z.infer<typeof savedMappingSchema>;

export const savedMappingsResponseSchema = z.object({ mappings: z.array(savedMappingSchema) });

export const saveMappingBodySchema = z.object({
  name: z.string().trim().min(1, 'Give the mapping a name.').max(80, 'A mapping name may be at most 80 characters.'),
  scope: z.enum(['mine', 'company']),
  columns: z
    .array(importMappingColumnSchema)
    .min(1, 'A mapping needs at least one column.')
    .max(200)
    .refine((cols) => cols.some((c) => c.target !== 'circuit' && c.target !== 'ignore'), 'A mapping must send at least one column to a reading.'),
});
export type SaveMappingBody = z.infer<typeof saveMappingBodySchema>;

/** One reading to write in a batch, on the version the typist's preview saw (0 = never written). */
export const batchWriteSchema = z.object({
  circuitId: z.number().int().positive(),
  column: z.enum(readingKeys),
  text: z.string().max(200),
  reason: z.string().max(500).nullable().optional(),
  version: z.number().int().min(0),
});
export type BatchWrite = z.infer<typeof batchWriteSchema>;

/** POST /api/boards/:boardId/import: the confirmed import (or its undoing), in one transaction. */
export const importBatchBodySchema = z.object({
  /** The file's name, for the board's history. */
  fileName: z.string().trim().min(1).max(200),
  /** `import` writes the file's values; `undo` puts back what an import replaced. */
  action: z.enum(['import', 'undo']).default('import'),
  writes: z.array(batchWriteSchema).min(1, 'There is nothing to write: every value is already on the board or was kept.').max(20_000),
});
export type ImportBatchBody = z.input<typeof importBatchBodySchema>;

/** A photo of the paper notes attached to a board. */
export const boardPhotoSchema = z.object({
  /** The stored file's id (its bytes: GET /api/files/:id). */
  id: z.number().int(),
  mime: z.string(),
  sizeBytes: z.number().int(),
  sha256: z.string(),
  originalName: z.string().nullable(),
  uploadedBy: z.object({ id: z.number().int(), name: z.string() }).nullable(),
  uploadedAt: z.string(),
  /** What was done about location data (GPS) before the photo was stored, in words. */
  locationNote: z.string().nullable(),
});
export type BoardPhoto = z.infer<typeof boardPhotoSchema>;

export const boardPhotosResponseSchema = z.object({ photos: z.array(boardPhotoSchema) });
export const boardPhotoResponseSchema = z.object({ photo: boardPhotoSchema });
