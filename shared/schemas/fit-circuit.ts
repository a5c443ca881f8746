import { z } from 'zod';
import { cellSchema, circuitFieldsSchema, circuitSchema, type Circuit, type CircuitFields } from './boards.ts';
import { columnByKey, isDetailKey, readingKeys } from './columns.ts';
import type { Finding } from './findings.ts';

/** A cell as it can be served and checked: the checker's input takes at most 40 characters. */
const servedCellSchema = cellSchema.extend({ text: z.string().max(40) });

/** A circuit as served: its response schema, and what `POST /api/check` takes of it. */
export const servedCircuitSchema = circuitSchema.extend({ cells: z.partialRecord(z.enum(readingKeys), servedCellSchema) });

/** The code of the finding that says a stored value does not fit its field. */
export const storedValueFindingCode = 'stored-value-does-not-fit';

/**
 * Makes a circuit as stored fit the schema it is served with, and says in a finding what was
 * wrong. Nothing the server makes today breaks the schema, but a value stored by an older version,
 * an import or a hand-edited database must never stop a board from opening (a person would be
 * locked out of their work): the field is shown emptied or shortened, with an error finding on it,
 * until someone corrects it. The stored value is left as it is.
 */
export function fitCircuit(circuit: Circuit): { circuit: Circuit; findings: Finding[] } {
  const parsed = servedCircuitSchema.safeParse(circuit);
  if (parsed.success) return { circuit, findings: [] };

  const fixed: Record<string, unknown> = { ...circuit, cells: { ...circuit.cells } };
  const findings: Finding[] = [];
  const seen = new Set<string>();
  for (const issue of parsed.error.issues) {
    const [first, second] = issue.path;
    if (first === 'cells' && typeof second === 'string') {
      if (seen.has(`cells.${second}`)) continue;
      seen.add(`cells.${second}`);
      const cells = fixed.cells as Record<string, unknown>;
      const cell = cells[second] as { text?: unknown } | undefined;
      const shown = fitCell(cell);
      if (shown) cells[second] = shown;
      else delete cells[second];
      findings.push(finding(circuit, second, `the stored reading ${quote(cell?.text)} does not fit (${issue.message})`, shown ? `shown as ${quote(shown.text)}` : 'not shown'));
      continue;
    }
    if (typeof first !== 'string' || seen.has(first)) continue;
    seen.add(first);
    const field = first as keyof CircuitFields;
    const fieldSchema = circuitFieldsSchema.shape[field] as z.ZodType | undefined;
    const stored = (circuit as Record<string, unknown>)[first];
    const shown = fieldSchema ? fitField(fieldSchema, stored) : stored;
    fixed[first] = shown;
    findings.push(finding(circuit, first, `the stored ${labelOf(first)} ${quote(stored)} does not fit (${issue.message})`, shown === null ? 'shown empty' : `shown as ${quote(shown)}`));
  }
  const result = servedCircuitSchema.safeParse(fixed);
  // Anything still wrong is a server-owned field (id, position, version): those come from SQLite integers.
  return { circuit: (result.success ? fixed : circuit) as Circuit, findings };
}

function finding(circuit: Circuit, key: string, what: string, shown: string): Finding {
  const number = typeof circuit.number === 'string' && circuit.number.length <= 12 ? circuit.number : `#${circuit.position}`;
  return {
    code: storedValueFindingCode,
    severity: 'error',
    circuitId: circuit.id,
    columns: isDetailKey(key) || key in columnByKey ? [key] : [],
    message: `Circuit ${number}: ${what}; ${shown} until it is corrected.`,
    limit: null,
    source: 'Boardwalk’s field rules (shared/schemas/boards.ts)',
  };
}

function labelOf(key: string): string {
  if (key === 'number') return 'circuit number';
  return key in columnByKey ? columnByKey[key as keyof typeof columnByKey].label : key;
}

function quote(value: unknown): string {
  const text = typeof value === 'string' ? value : JSON.stringify(value) ?? String(value);
  return `“${text.length > 40 ? `${text.slice(0, 40)}…` : text}”`;
}

/** A value the field's schema accepts, as close to the stored one as can be. */
function fitField(schema: z.ZodType, stored: unknown): unknown {
  if (schema.safeParse(null).success) return null;
  if (typeof stored === 'string') {
    const max = maxLengthOf(schema);
    const cut = max === undefined ? stored.trim() : stored.trim().slice(0, max).trim();
    if (schema.safeParse(cut).success) return cut;
    if (schema.safeParse('?').success) return '?';
  }
  if (schema instanceof z.ZodEnum) return schema.options[0];
  if (schema.safeParse('').success) return '';
  return stored;
}

function maxLengthOf(schema: z.ZodType): number | undefined {
  const inner = schema instanceof z.ZodString ? schema : undefined;
  return inner?.maxLength ?? undefined;
}

function fitCell(cell: { text?: unknown } | undefined): z.infer<typeof servedCellSchema> | undefined {
  if (!cell || typeof cell.text !== 'string') return undefined;
  const attempt = { ...cell, text: cell.text.slice(0, 40) };
  const parsed = servedCellSchema.safeParse(attempt);
  return parsed.success ? parsed.data : undefined;
}
