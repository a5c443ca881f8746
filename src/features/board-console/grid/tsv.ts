/**
 * Tab-separated text, the format spreadsheets put on the clipboard for a range of cells, read and
 * written with papaparse (the same library the server's CSV export uses).
 *
 * Spreadsheets quote a cell that holds a tab, a line break or a double quote ("a""b" for a"b);
 * both directions follow that, so a range copied here pastes into a spreadsheet and back unchanged.
 */
import Papa from 'papaparse';

/** Reads tab-separated text into rows of cells. A trailing line break does not add an empty row. */
export function parseTsv(text: string): string[][] {
  if (text === '') return [];
  const parsed = Papa.parse<string[]>(text, { delimiter: '\t', quoteChar: '"', escapeChar: '"', skipEmptyLines: false });
  const rows = parsed.data.map((row) => row.map((cell) => String(cell)));
  // A copied range ends with a line break: papaparse reads it as one more, empty row.
  const last = rows[rows.length - 1];
  if (rows.length > 0 && last && last.length === 1 && last[0] === '' && /\r?\n$|\r$/.test(text)) rows.pop();
  return rows;
}

/** Writes rows of cells as tab-separated text, one line per row. */
export function formatTsv(rows: readonly (readonly string[])[]): string {
  if (rows.length === 0) return '';
  return Papa.unparse(
    rows.map((row) => [...row]),
    { delimiter: '\t', newline: '\n', quoteChar: '"', escapeChar: '"', header: false },
  );
}
