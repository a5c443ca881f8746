import { ApiError } from '../../lib/api-client.ts';

/** A server error split into messages for named fields and one for the form as a whole. */
export interface FieldErrors<Field extends string> {
  fields: Partial<Record<Field, string>>;
  form?: string;
}

/**
 * Places a failed request's messages where the person will fix them: each zod issue at its field
 * (the first issue per field wins), an issue for no known field and any other message at the form.
 * `conflictField` names the field a 409 is about (e.g. an e-mail already taken).
 */
export function fieldErrorsFrom<Field extends string>(
  error: unknown,
  knownFields: readonly Field[],
  conflictField?: Field,
): FieldErrors<Field> {
  const result: FieldErrors<Field> = { fields: {} };
  if (!(error instanceof ApiError)) {
    result.form = error instanceof Error ? error.message : 'That did not work. Try again.';
    return result;
  }
  if (error.issues.length === 0) {
    if (error.status === 409 && conflictField) result.fields[conflictField] = error.message;
    else result.form = error.message;
    return result;
  }
  const unplaced: string[] = [];
  for (const issue of error.issues) {
    const field = knownFields.find((f) => f === issue.path);
    if (field) result.fields[field] ??= issue.message;
    else unplaced.push(issue.message);
  }
  if (unplaced.length > 0) result.form = unplaced.join(' ');
  return result;
}
