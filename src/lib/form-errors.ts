import type { z } from 'zod';
import { ApiError } from './api-client.ts';

/** Messages for named fields, and one for the form as a whole. */
export interface FormErrors<Field extends string> {
  fields: Partial<Record<Field, string>>;
  form?: string;
}

/** The field an issue's path names: its first segment after a `changes.` wrapper (PATCH bodies). */
function fieldOfPath(path: string): string {
  const segments = path.split('.').filter(Boolean);
  return (segments[0] === 'changes' ? segments[1] : segments[0]) ?? '';
}

/** Spreads issues (zod's, or the server's 400 `issues`) over the fields they name; the rest go to the form. */
export function placeIssues<Field extends string>(
  issues: readonly { path: string; message: string }[],
  knownFields: readonly Field[],
): FormErrors<Field> {
  const result: FormErrors<Field> = { fields: {} };
  const unplaced: string[] = [];
  for (const issue of issues) {
    const field = knownFields.find((f) => f === fieldOfPath(issue.path));
    if (field) result.fields[field] ??= issue.message;
    else unplaced.push(issue.message);
  }
  if (unplaced.length > 0) result.form = [...new Set(unplaced)].join(' ');
  return result;
}

/** A client-side zod failure, placed at the fields. */
export function zodFormErrors<Field extends string>(error: z.ZodError, knownFields: readonly Field[]): FormErrors<Field> {
  return placeIssues(
    error.issues.map((issue) => ({ path: issue.path.map(String).join('.'), message: issue.message })),
    knownFields,
  );
}

/**
 * A failed request, placed at the fields its issues name; any other message at the form.
 * `conflictField` names the field a 409 without issues is about (a reference already taken).
 */
export function requestFormErrors<Field extends string>(error: unknown, knownFields: readonly Field[], conflictField?: Field): FormErrors<Field> {
  if (error instanceof ApiError) {
    if (error.issues.length > 0) return placeIssues(error.issues, knownFields);
    if (error.status === 409 && conflictField) return { fields: { [conflictField]: error.message } as Partial<Record<Field, string>> };
    return { fields: {}, form: error.message };
  }
  return { fields: {}, form: error instanceof Error ? error.message : 'That did not work. Try again.' };
}

/** The first field (in form order) that has an error, to put the cursor on. */
export function firstFieldWithError<Field extends string>(errors: FormErrors<Field>, order: readonly Field[]): Field | undefined {
  return order.find((field) => errors.fields[field] !== undefined);
}

/**
 * Reads a number typed as text: blank is null, a plain decimal is a number; anything else is kept
 * as text so the zod schema answers with its own words ("Ze must be a number.").
 */
export function numberOrText(text: string): number | null | string {
  const trimmed = text.trim();
  if (trimmed === '') return null;
  return /^[-+]?(\d+\.?\d*|\.\d+)$/.test(trimmed) ? Number(trimmed) : trimmed;
}
