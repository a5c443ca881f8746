/**
 * Text in the grid ⇄ what is stored. Every column shows as text; a reading column stores the text
 * as typed, a detail column stores a typed field of the circuit (number, choice or text), so its
 * text is converted and checked before it is written: bad text is refused at the cell and not saved.
 */
import { circuitFieldsSchema, type Circuit, type CircuitFields } from '../../../../shared/schemas/boards.ts';
import { columnByKey, isReadingKey, type ColumnDef, type ColumnKey, type DetailKey } from '../../../../shared/schemas/columns.ts';

/** The text a cell shows for a circuit. */
export function cellText(circuit: Circuit, column: ColumnKey): string {
  if (isReadingKey(column)) return circuit.cells[column]?.text ?? '';
  return fieldText(circuit[column]);
}

/** A detail value as text: numbers as written, empty for none. */
export function fieldText(value: CircuitFields[keyof CircuitFields]): string {
  if (value === null || value === undefined) return '';
  return String(value);
}

export { normaliseReading } from '../../../../shared/readings/normalise-reading.ts';

export type DetailParse<K extends DetailKey = DetailKey> =
  | { ok: true; field: K; value: CircuitFields[K] }
  | { ok: false; message: string };

function numberFrom(def: ColumnDef, text: string): { ok: true; value: number } | { ok: false; message: string } {
  let t = text.trim();
  if (def.unit && t.toLowerCase().endsWith(def.unit.toLowerCase())) t = t.slice(0, -def.unit.length).trim();
  if (def.unit === 'mm²' && t.toLowerCase().endsWith('mm')) t = t.slice(0, -2).trim();
  if (/^\d+,\d+$/.test(t)) return { ok: false, message: `${def.label}: use a point, not a comma (${t.replace(',', '.')}).` };
  if (!/^(\d+\.?\d*|\.\d+)$/.test(t)) {
    return { ok: false, message: `${def.label} takes a number${def.unit ? ` in ${def.unit}` : ''}, not "${text.trim()}".` };
  }
  const value = Number(t);
  if (def.valueKind === 'integer' && !Number.isInteger(value)) {
    return { ok: false, message: `${def.label} takes a whole number, not "${text.trim()}".` };
  }
  return { ok: true, value };
}

/** A choice typed in any case, or as the start of exactly one choice ("rad" → radial). */
export function matchChoice(choices: readonly string[], text: string): string | null {
  const t = text.trim().toLowerCase();
  const exact = choices.find((c) => c.toLowerCase() === t);
  if (exact) return exact;
  const starts = choices.filter((c) => c.toLowerCase().startsWith(t));
  return starts.length === 1 ? starts[0]! : null;
}

/**
 * Reads the text typed into a detail column as the field's value, or says in words why it cannot be
 * saved. The field's own schema has the last word (lengths, ranges), so the server will accept it.
 */
export function parseDetailText<K extends DetailKey>(field: K, text: string): DetailParse<K> {
  const def = columnByKey[field];
  const trimmed = text.trim();
  let value: unknown;
  if (def.valueKind === 'number' || def.valueKind === 'integer') {
    if (trimmed === '') value = null;
    else {
      const n = numberFrom(def, trimmed);
      if (!n.ok) return n;
      value = n.value;
    }
  } else if (def.valueKind === 'choice') {
    const choices = def.choices ?? [];
    if (trimmed === '') value = null;
    else {
      const match = matchChoice(choices, trimmed);
      if (match === null) return { ok: false, message: `${def.label} is one of ${choices.join(', ')}: not "${trimmed}".` };
      value = match;
    }
  } else {
    value = trimmed;
  }
  const schema = circuitFieldsSchema.shape[field];
  const result = schema.safeParse(value);
  if (!result.success) {
    if (value === null) return { ok: false, message: `${def.label} cannot be left empty${def.choices ? `: one of ${def.choices.join(', ')}` : ''}.` };
    const issue = result.error.issues[0];
    return { ok: false, message: `${def.label}: ${issue ? describeIssue(issue, def) : 'not a value it accepts'}.` };
  }
  return { ok: true, field, value: result.data as CircuitFields[K] };
}

function describeIssue(issue: { code: string; message: string; maximum?: unknown; minimum?: unknown }, def: ColumnDef): string {
  if (issue.code === 'too_big' && issue.maximum !== undefined) {
    return def.valueKind === 'text' ? `at most ${String(issue.maximum)} characters` : `at most ${String(issue.maximum)}${def.unit ? ` ${def.unit}` : ''}`;
  }
  if (issue.code === 'too_small') return def.valueKind === 'text' ? 'too short' : 'must be more than 0';
  return issue.message;
}
