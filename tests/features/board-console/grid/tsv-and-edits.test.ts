import { describe, expect, it } from 'vitest';
import type { ColumnKey, ReadingKey } from '../../../../shared/schemas/columns.ts';
import { matchChoice, normaliseReading, parseDetailText } from '../../../../src/features/board-console/grid/cell-value.ts';
import { clearChanges, fillDownChanges, fillFromAboveChange, pasteChanges, rangeTexts } from '../../../../src/features/board-console/grid/edits.ts';
import type { GridPosition, GridShape } from '../../../../src/features/board-console/grid/grid-state.ts';
import { formatTsv, parseTsv } from '../../../../src/features/board-console/grid/tsv.ts';
import { emptyUndoStack, popRedo, popUndo, pushUndo, redoWrites, undoWrites } from '../../../../src/features/board-console/grid/undo-stack.ts';

describe('tab-separated text', () => {
  it.each<[string, string, string[][]]>([
    ['a block with a trailing line break', '1\t2\t3\n4\t5\t6\n', [['1', '2', '3'], ['4', '5', '6']]],
    ['Windows line breaks', '1\t2\r\n3\t4', [['1', '2'], ['3', '4']]],
    ['empty cells', '\t2\n3\t', [['', '2'], ['3', '']]],
    ['a quoted cell holding a tab and a quote', '"a\tb ""c"""\t>200', [['a\tb "c"', '>200']]],
    ['a lone quote is plain text', '5" lead\t1', [['5" lead', '1']]],
    ['one value', '0.44', [['0.44']]],
  ])('%s', (_name, text, rows) => {
    expect(parseTsv(text)).toEqual(rows);
  });

  it('when rows are written and read back, then they are unchanged', () => {
    const rows = [['0.44', '>200', 'N/A'], ['a\tb', 'say "hi"', '']];
    expect(parseTsv(formatTsv(rows))).toEqual(rows);
  });
});

const shape: GridShape = { rows: [1, 2, 3], columns: ['ringR1', 'ringRn', 'zs'] as ColumnKey[] };
const values: Record<string, string> = { '1:ringR1': '0.3', '1:ringRn': '0.31', '1:zs': '0.5', '2:zs': '0.6' };
const read = (p: GridPosition) => values[`${p.circuitId}:${p.column}`] ?? '';

describe('edits worked out before writing', () => {
  it('when filling from above, then the cell takes the value above it', () => {
    expect(fillFromAboveChange({ row: 1, col: 0 }, shape, read)).toEqual({ circuitId: 2, column: 'ringR1', before: '', after: '0.3' });
    expect(fillFromAboveChange({ row: 0, col: 0 }, shape, read)).toBeNull();
  });

  it('when filling a range down, then each column takes its top value; one row fills from the row above', () => {
    expect(fillDownChanges({ top: 0, bottom: 2, left: 2, right: 2 }, shape, read)).toEqual([
      { circuitId: 2, column: 'zs', before: '0.6', after: '0.5' },
      { circuitId: 3, column: 'zs', before: '', after: '0.5' },
    ]);
    expect(fillDownChanges({ top: 1, bottom: 1, left: 0, right: 1 }, shape, read)).toEqual([
      { circuitId: 2, column: 'ringR1', before: '', after: '0.3' },
      { circuitId: 2, column: 'ringRn', before: '', after: '0.31' },
    ]);
  });

  it('when a block is pasted near the edge, then it is cut off at the grid', () => {
    const { changes, written } = pasteChanges([['a', 'b'], ['c', 'd'], ['e', 'f']], { top: 1, bottom: 1, left: 2, right: 2 }, shape, read);
    expect(changes.map((c) => `${c.circuitId}:${c.column}=${c.after}`)).toEqual(['2:zs=a', '3:zs=c']);
    expect(written).toEqual({ top: 1, bottom: 2, left: 2, right: 2 });
  });

  it('when one value is pasted over a range, then it fills the range', () => {
    const { changes } = pasteChanges([['✓']], { top: 0, bottom: 2, left: 0, right: 0 }, shape, read);
    expect(changes.map((c) => c.after)).toEqual(['✓', '✓', '✓']);
  });

  it('when a range is cleared or copied, then every cell of it is covered', () => {
    expect(clearChanges({ top: 0, bottom: 0, left: 0, right: 1 }, shape, read).map((c) => c.before)).toEqual(['0.3', '0.31']);
    expect(rangeTexts({ top: 0, bottom: 1, left: 1, right: 2 }, shape, read)).toEqual([['0.31', '0.5'], ['', '0.6']]);
  });
});

describe('undo and redo', () => {
  it('when an action is undone and redone, then its cells go back and forward, and a new action drops the redo', () => {
    const entry = { label: 'pasted', changes: [{ circuitId: 1, column: 'zs' as ColumnKey, before: '0.5', after: '0.7' }, { circuitId: 2, column: 'zs' as ColumnKey, before: '', after: '0.8' }] };
    const stack = pushUndo(emptyUndoStack, entry);
    const undone = popUndo(stack)!;
    expect(undoWrites(undone.entry).map((w) => `${w.position.circuitId}=${w.text}`)).toEqual(['2=', '1=0.5']);
    const redone = popRedo(undone.stack)!;
    expect(redoWrites(redone.entry).map((w) => `${w.position.circuitId}=${w.text}`)).toEqual(['1=0.7', '2=0.8']);
    const after = pushUndo(undone.stack, { label: 'typed', changes: [{ circuitId: 3, column: 'zs', before: '', after: '1' }] });
    expect(after.future).toEqual([]);
  });

  it('when an action changed nothing, then it is not recorded', () => {
    expect(pushUndo(emptyUndoStack, { label: 'typed', changes: [{ circuitId: 1, column: 'zs', before: '1', after: '1' }] })).toBe(emptyUndoStack);
  });
});

describe('text to stored values', () => {
  it.each<[ReadingKey, string, string]>([
    ['zs', '.44', '0.44'],
    ['irLiveEarth', '>.5', '>0.5'],
    ['zs', ' 0.44 ', '0.44'],
    ['irLiveEarth', '>200', '>200'],
    ['zs', 'lim', 'LIM'],
    ['rcdTimeMs', 'na', 'N/A'],
    ['polarity', 'v', '✓'],
    ['rcdButton', 'ok', '✓'],
    ['afddButton', 'x', '✗'],
    ['zs', 'v', 'v'],
    ['zs', '0,44', '0,44'],
  ])('a reading of %s typed as %j is stored as %j', (column, typed, stored) => {
    expect(normaliseReading(column, typed)).toBe(stored);
  });

  it('when a detail is typed, then numbers, choices and text are read, and bad text is refused in words', () => {
    expect(parseDetailText('ratingA', '32')).toEqual({ ok: true, field: 'ratingA', value: 32 });
    expect(parseDetailText('liveCsaMm2', '2.5mm²')).toEqual({ ok: true, field: 'liveCsaMm2', value: 2.5 });
    expect(parseDetailText('liveCsaMm2', '')).toEqual({ ok: true, field: 'liveCsaMm2', value: null });
    expect(parseDetailText('points', '2.5')).toEqual({ ok: false, message: 'Points takes a whole number, not "2.5".' });
    expect(parseDetailText('ratingA', '2,5')).toEqual({ ok: false, message: 'In: use a point, not a comma (2.5).' });
    expect(parseDetailText('kind', 'RAD')).toEqual({ ok: true, field: 'kind', value: 'radial' });
    expect(parseDetailText('kind', '')).toEqual({ ok: false, message: 'Kind cannot be left empty: one of ring, radial, spur, distribution.' });
    expect(parseDetailText('rcdType', 'a')).toEqual({ ok: true, field: 'rcdType', value: 'A' });
    expect(parseDetailText('rcdType', 'S')).toEqual({ ok: false, message: 'RCD type is one of AC, A, F, B, S-AC, S-A: not "S".' });
    expect(parseDetailText('wiringType', 'ABCDEFGHIJKLMNOP')).toEqual({ ok: false, message: 'Wiring: at most 12 characters.' });
    expect(parseDetailText('ratingA', '0')).toEqual({ ok: false, message: 'In: must be more than 0.' });
    expect(matchChoice(['yes', 'no'], 'Y')).toBe('yes');
  });
});
