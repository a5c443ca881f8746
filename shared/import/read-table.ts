/**
 * Reading an instrument's exported file into a table: decoding (UTF-8 or Windows-1252, detected),
 * splitting with papaparse (comma, semicolon or tab, detected), and finding the header row.
 * Pure: bytes in, a table or a refusal in words out. No maker's format is assumed: the header is
 * the first row that names columns in words, whatever the words are.
 */
import Papa from 'papaparse';
import type { ImportEncoding, ImportTable } from '../schemas/import.ts';
import { proposeMapping } from './map-columns.ts';

/** Why a file cannot be imported; `message` is for the person, in words. */
export interface ImportRefusal {
  code: 'empty' | 'not-text' | 'unknown-encoding' | 'no-table' | 'no-readings';
  message: string;
}

export type ReadTableResult = { ok: true; table: ImportTable } | { ok: false; refusal: ImportRefusal };

/** Bytes that never occur in a text file written in UTF-8 or Windows-1252 (C0 controls but tab, CR, LF, FF). */
function isBinaryByte(b: number): boolean {
  return b === 0 || (b < 32 && b !== 9 && b !== 10 && b !== 13 && b !== 12);
}

/** Decodes the bytes, saying which encoding was read and why. */
export function decodeText(bytes: Uint8Array): { ok: true; text: string; encoding: ImportEncoding; note: string } | { ok: false; refusal: ImportRefusal } {
  if (bytes.length === 0) return { ok: false, refusal: { code: 'empty', message: 'The file is empty: there is nothing to import.' } };
  // UTF-16 (with its byte-order mark): instruments rarely write it; we say so rather than guess.
  if ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff)) {
    return {
      ok: false,
      refusal: { code: 'unknown-encoding', message: 'The file is written in UTF-16, which the import does not read. Save it again as CSV in UTF-8 (or Windows-1252) and import that.' },
    };
  }
  const sample = bytes.subarray(0, Math.min(bytes.length, 65_536));
  let binary = 0;
  for (const b of sample) if (isBinaryByte(b)) binary += 1;
  if (binary > 0) {
    return {
      ok: false,
      refusal: { code: 'not-text', message: 'This is not a readings file: it holds binary data, not lines of text. Export the readings as CSV (comma, semicolon or tab separated) and import that.' },
    };
  }
  const bom = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf;
  try {
    const text = new TextDecoder('utf-8', { fatal: true }).decode(bom ? bytes.subarray(3) : bytes);
    const note = bom ? 'UTF-8 (the file starts with a UTF-8 mark)' : /[^\x00-\x7f]/.test(text) ? 'UTF-8 (its accented letters and symbols are valid UTF-8)' : 'UTF-8 (plain ASCII, the same in either encoding)';
    return { ok: true, text, encoding: 'utf-8', note };
  } catch {
    // Not valid UTF-8: Windows-1252 maps every byte but five (0x81 0x8D 0x8F 0x90 0x9D) to a character.
    for (const b of bytes) {
      if (b === 0x81 || b === 0x8d || b === 0x8f || b === 0x90 || b === 0x9d) {
        return {
          ok: false,
          refusal: { code: 'unknown-encoding', message: 'The file is neither UTF-8 nor Windows-1252 text, so its characters cannot be read safely. Save it again as CSV in UTF-8 and import that.' },
        };
      }
    }
    const text = new TextDecoder('windows-1252').decode(bytes);
    return { ok: true, text, encoding: 'windows-1252', note: 'Windows-1252 (it is not valid UTF-8; read as Windows-1252, so Ω, µ and ° keep their meaning only if the instrument wrote them that way)' };
  }
}

const delimiters = [',', ';', '\t'] as const;
type Delimiter = (typeof delimiters)[number];

/** A cell that is a word (names a column) rather than a reading. */
function isWordy(cell: string): boolean {
  return /[a-zA-Zµ]{2,}/.test(cell) && !/^\s*(n\/?a|lim|ok|pass|fail|yes|no)\s*$/i.test(cell);
}

/** Picks the separator giving the most rows of the same, largest width. */
function pickDelimiter(text: string): { delimiter: Delimiter; rows: string[][] } {
  let best: { delimiter: Delimiter; rows: string[][]; score: number } | null = null;
  const head = text.split(/\r\n|\n|\r/).slice(0, 50).join('\n');
  for (const delimiter of delimiters) {
    const parsed = Papa.parse<string[]>(head, { delimiter, skipEmptyLines: 'greedy' });
    const widths = new Map<number, number>();
    for (const row of parsed.data) if (row.length > 1) widths.set(row.length, (widths.get(row.length) ?? 0) + 1);
    let score = 0;
    for (const [width, count] of widths) score = Math.max(score, count * Math.min(width, 40));
    if (!best || score > best.score) best = { delimiter, rows: [], score };
  }
  const delimiter = best!.delimiter;
  const rows = Papa.parse<string[]>(text, { delimiter, skipEmptyLines: 'greedy' }).data;
  return { delimiter, rows };
}

/** Reads the file's bytes into a table. Never throws. */
export function readTable(bytes: Uint8Array, fileName: string): ReadTableResult {
  const decoded = decodeText(bytes);
  if (!decoded.ok) return decoded;
  const text = decoded.text;
  if (text.trim() === '') return { ok: false, refusal: { code: 'empty', message: 'The file holds only blank lines: there is nothing to import.' } };
  const { delimiter, rows } = pickDelimiter(text);
  const width = Math.max(0, ...rows.map((r) => r.length));
  if (width < 2) {
    return {
      ok: false,
      refusal: { code: 'no-table', message: 'This is not a readings file: no line has two or more values separated by commas, semicolons or tabs.' },
    };
  }
  // The header is the first row (of the first 30) with at least two cells that are words and as
  // many cells as the widest rows: lines above it are the instrument's preamble (serial, date).
  const wide = rows.findIndex((r, i) => i < 30 && r.length >= Math.max(2, width - 1) && r.filter(isWordy).length >= 2);
  if (wide === -1) {
    return {
      ok: false,
      refusal: { code: 'no-table', message: 'No header row naming the columns was found in the first 30 lines, so the readings cannot be told apart. Export the file with its column names.' },
    };
  }
  const headers = rows[wide]!.map((h) => h.trim());
  const data = rows
    .slice(wide + 1)
    .filter((r) => r.some((c) => c.trim() !== ''))
    .map((r) => headers.map((_, i) => (r[i] ?? '').trim()));
  if (data.length === 0) {
    // One line of words: a header without rows if any of its words names a reading, else prose.
    const namesReadings = proposeMapping({ headers, rows: [] }).some((p) => p.target !== 'ignore' && p.target !== 'circuit');
    return namesReadings
      ? { ok: false, refusal: { code: 'empty', message: 'The file names its columns but has no rows of readings below them.' } }
      : { ok: false, refusal: { code: 'no-table', message: 'This is not a readings file: it is a line of text, not a table of readings with a header naming its columns.' } };
  }
  // Line of the first data row (rows are counted without blank lines; close enough for messages).
  const firstDataLine = wide + 2;
  const decimalComma = delimiter !== ',' && data.some((r) => r.some((c) => /^[<>≥]?\d+,\d+\s*[a-zA-ZΩµ]*$/.test(c)));
  return {
    ok: true,
    table: { fileName, encoding: decoded.encoding, encodingNote: decoded.note, delimiter, headers, rows: data, firstDataLine, decimalComma },
  };
}
