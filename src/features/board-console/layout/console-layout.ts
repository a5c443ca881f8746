/**
 * How a person has laid out the console on their screen: which column groups are folded to a
 * one-column summary and how the findings panel shows. Kept per person in localStorage, so it
 * follows them from board to board on the same machine (a laptop at 1366×768, a desk at 1920).
 * Pure apart from the two storage helpers.
 */
import { columnGroups, columns as allColumns, type ColumnDef, type ColumnGroupId, type ColumnKey } from '../../../../shared/schemas/columns.ts';

/** A column as the grid shows it: a column of the schedule, or a folded group's summary. */
export type GridColumn = ColumnDef & {
  /**
   * Set on a folded group's summary: the columns it stands for (their values shown side by side,
   * read only). The summary keeps the key of its group's first column (after the description).
   */
  summaryOf?: readonly ColumnKey[];
};

export type FindingsPanelSize = 'wide' | 'narrow' | 'hidden';

export interface ConsoleLayout {
  folded: readonly ColumnGroupId[];
  findings: FindingsPanelSize;
  /**
   * Every circuit detail (cable, device, RCD, AFDD, a hand-given maximum Zs, remarks) folded into
   * one summary beside the description, and the reading columns drawn narrow: the layout for
   * typing readings on a laptop screen.
   */
  detailsFolded: boolean;
}

export const defaultLayout: ConsoleLayout = { folded: [], findings: 'wide', detailsFolded: false };

/** Widths with the details folded: readings such as ">999", "0.44", "N/A" and a mark still fit. */
const narrowReadingWidth = 54;
const narrowDescriptionWidth = 140;
const detailsSummaryWidth = 150;

/** The description never folds: it stays beside the circuit number, frozen, as the row's name. */
export const frozenColumn: ColumnKey = 'description';

const summaryWidth = 112;

/**
 * The grid's columns with the folded groups each replaced by one summary column; with the details
 * folded, every detail column but the description in one summary after it, and narrower readings.
 */
export function layoutColumns(folded: readonly ColumnGroupId[], source: readonly ColumnDef[] = allColumns, detailsFolded = false): GridColumn[] {
  if (detailsFolded) {
    const details = source.filter((c) => c.storage === 'detail' && c.key !== frozenColumn);
    const first = details[0];
    const readings = layoutColumns(folded.filter((g) => source.some((c) => c.group === g && c.storage === 'reading')), source.filter((c) => c.storage === 'reading'));
    const frozen = source.find((c) => c.key === frozenColumn);
    const out: GridColumn[] = [];
    if (frozen) out.push({ ...frozen, width: narrowDescriptionWidth });
    if (first) {
      out.push({
        ...first,
        label: 'Details ▸',
        unit: undefined,
        meaning: `Circuit details folded: ${details.map((d) => d.label).join(', ')} (unfold the details to type here)`,
        valueKind: 'text',
        width: detailsSummaryWidth,
        summaryOf: details.map((d) => d.key),
      });
    }
    for (const column of readings) out.push(column.summaryOf ? column : { ...column, width: Math.min(column.width, narrowReadingWidth) });
    return out;
  }
  const out: GridColumn[] = [];
  const done = new Set<ColumnGroupId>();
  for (const column of source) {
    if (column.key === frozenColumn || !folded.includes(column.group)) {
      out.push(column);
      continue;
    }
    if (done.has(column.group)) continue;
    done.add(column.group);
    const members = source.filter((c) => c.group === column.group && c.key !== frozenColumn);
    const group = columnGroups.find((g) => g.id === column.group)!;
    out.push({
      ...column,
      label: `${group.label} ▸`,
      unit: undefined,
      meaning: `${group.label} folded: ${members.map((m) => m.label).join(', ')} (unfold the group to type here)`,
      valueKind: 'text',
      width: summaryWidth,
      summaryOf: members.map((m) => m.key),
    });
  }
  return out;
}

/** The key that folds or unfolds a group: Alt+Shift and the group's place (1 circuit details … 7 remarks). */
export function foldShortcut(group: ColumnGroupId): string {
  return `Alt+Shift+Digit${columnGroups.findIndex((g) => g.id === group) + 1}`;
}

function storageKey(personId: number | null): string {
  return `boardwalk.console.layout.${personId ?? 'anyone'}`;
}

export function loadLayout(personId: number | null): ConsoleLayout {
  try {
    const raw = globalThis.localStorage?.getItem(storageKey(personId));
    if (!raw) return defaultLayout;
    const parsed = JSON.parse(raw) as Partial<ConsoleLayout>;
    const folded = Array.isArray(parsed.folded) ? parsed.folded.filter((g): g is ColumnGroupId => columnGroups.some((c) => c.id === g)) : [];
    const findings = parsed.findings === 'narrow' || parsed.findings === 'hidden' ? parsed.findings : 'wide';
    return { folded, findings, detailsFolded: parsed.detailsFolded === true };
  } catch {
    return defaultLayout;
  }
}

export function saveLayout(personId: number | null, layout: ConsoleLayout): void {
  try {
    globalThis.localStorage?.setItem(storageKey(personId), JSON.stringify(layout));
  } catch {
    // A full or blocked storage only loses the remembered layout, never a reading.
  }
}
