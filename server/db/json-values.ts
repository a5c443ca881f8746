/**
 * Values of the job record and of site and job details are kept in history as JSON text. Two values
 * are the same when their JSON with sorted keys is the same (key order carries no meaning).
 */
export function stableJson(value: unknown): string {
  return JSON.stringify(value === undefined ? null : value, (_key, v: unknown) =>
    v && typeof v === 'object' && !Array.isArray(v)
      ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)))
      : v,
  );
}

export function sameValue(a: unknown, b: unknown): boolean {
  return stableJson(a) === stableJson(b);
}

/** History text back to a value (null stays null; text that is not JSON is returned as is). */
export function parseHistoryText(text: string | null): unknown {
  if (text === null) return null;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return text;
  }
}
