/**
 * Tab-separated text, the format spreadsheets put on the clipboard for a range of cells.
 *
 * Spreadsheets quote a cell that holds a tab, a line break or a double quote ("a""b" for a"b);
 * both directions follow that, so a range copied here pastes into a spreadsheet and back unchanged.
 */

/** Reads tab-separated text into rows of cells. A trailing line break does not add an empty row. */
export function parseTsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let cell = '';
  let i = 0;
  const n = text.length;
  let atCellStart = true;
  while (i < n) {
    const ch = text[i]!;
    if (atCellStart && ch === '"') {
      // A quoted cell: read to the closing quote, "" standing for one quote.
      const closing = readQuoted(text, i + 1);
      if (closing) {
        cell = closing.value;
        i = closing.end;
        atCellStart = false;
        continue;
      }
    }
    atCellStart = false;
    if (ch === '\t') {
      row.push(cell);
      cell = '';
      atCellStart = true;
      i++;
    } else if (ch === '\r' || ch === '\n') {
      row.push(cell);
      rows.push(row);
      row = [];
      cell = '';
      atCellStart = true;
      i += ch === '\r' && text[i + 1] === '\n' ? 2 : 1;
    } else {
      cell += ch;
      i++;
    }
  }
  if (!atCellStart || cell !== '' || row.length > 0) {
    row.push(cell);
    rows.push(row);
  }
  return rows;
}

/** A quoted cell from just after its opening quote; null when the quote is never closed properly. */
function readQuoted(text: string, from: number): { value: string; end: number } | null {
  let value = '';
  let i = from;
  while (i < text.length) {
    const ch = text[i]!;
    if (ch === '"') {
      if (text[i + 1] === '"') {
        value += '"';
        i += 2;
        continue;
      }
      const next = text[i + 1];
      // A closing quote must end the cell; otherwise the quote was part of plain text.
      if (next === undefined || next === '\t' || next === '\n' || next === '\r') return { value, end: i + 1 };
      return null;
    }
    value += ch;
    i++;
  }
  return null;
}

function quoteCell(cell: string): string {
  return /[\t\n\r"]/.test(cell) ? `"${cell.replace(/"/g, '""')}"` : cell;
}

/** Writes rows of cells as tab-separated text, one line per row. */
export function formatTsv(rows: readonly (readonly string[])[]): string {
  return rows.map((row) => row.map(quoteCell).join('\t')).join('\n');
}
