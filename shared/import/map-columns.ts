/**
 * Proposing where each column of an instrument's file goes, from three clues in order: the words
 * of its header, the unit written in the header or beside the values, and the shape of the values
 * themselves (`>299`, `0.43`, `28 ms`, `500`). Generic on purpose: instruments and their firmware
 * name columns differently, so nothing here knows any maker's layout. The typist corrects the
 * proposal; a corrected mapping can be saved under a name and picked again.
 */
import { columnByKey, type ReadingKey } from '../schemas/columns.ts';
import type { ImportMappingColumn, ImportTable, ImportTarget } from '../schemas/import.ts';

export interface ProposedColumn {
  target: ImportTarget;
  why: string;
}

/** Header text lowered, with look-alike symbols made one (Ω/Ω, × / x, Δ/delta). */
function fold(header: string): string {
  return header
    .toLowerCase()
    .replace(/\u2126/g, 'ω')
    .replace(/×/g, 'x')
    .replace(/[_]+/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();
}

const has = (h: string, re: RegExp) => re.test(h);

/** What the header's words say, if anything. Order matters: the most specific first. */
function fromHeader(raw: string): ProposedColumn | null {
  const h = fold(raw);
  if (h === '') return null;
  // Values of the board or the supply, not of a circuit: never a circuit's reading.
  if (has(h, /\b(ze|zdb|ipf|pfc|psc|pscc|ik|date|time of test|serial|instrument|operator|job|site|user)\b/) && !has(h, /\b(zs|rcd|trip)\b/)) {
    return { target: 'ignore', why: `"${raw}" is not a circuit's reading (a board, supply or record detail)` };
  }
  if (has(h, /\b(circuit|cct|ckt|circ|way)\b/) && !has(h, /\b(desc|description|name|type|rating|zs|ir|rcd)\b/)) {
    return { target: 'circuit', why: `"${raw}" names the circuit` };
  }
  if (has(h, /^(no\.?|nr\.?|#|id|ref)$/)) return { target: 'circuit', why: `"${raw}" looks like the circuit's number` };
  if (has(h, /r1\s*\+\s*r2|\br1r2\b|\br1 r2\b|continuity|\bcont\b/)) return { target: 'r1PlusR2', why: `"${raw}" is R1+R2` };
  if (has(h, /\b(afdd|arc)\b/)) return { target: 'afddButton', why: `"${raw}" is the AFDD test button` };
  if (has(h, /\brcd\b|\brcbo\b|trip|i\s*δ\s*n|idn|\bδ\b|delta/)) {
    if (has(h, /button|btn|test button|manual/)) return { target: 'rcdButton', why: `"${raw}" is the RCD test button` };
    if (has(h, /(^|\D)5\s*x|x\s*5(\D|$)|5\s*i\s*δ|5idn|five/)) return { target: 'rcdTime5Ms', why: `"${raw}" is the RCD time at 5 × IΔn` };
    if (has(h, /(^|\D)(0\.5|½|1\/2)\s*x|x\s*(0\.5|½)|half/)) return { target: 'ignore', why: `"${raw}" is a test at ½ × IΔn, which the schedule does not record` };
    return { target: 'rcdTimeMs', why: `"${raw}" is the RCD operating time at IΔn` };
  }
  if (has(h, /polarity|\bpol\b/)) return { target: 'polarity', why: `"${raw}" is polarity` };
  if (has(h, /\bzs\b|z\s*s\b|loop|z\s*\(?l-?pe\)?|\bzlpe\b|z l-e|zle\b/)) return { target: 'zs', why: `"${raw}" is the earth fault loop impedance` };
  if (has(h, /insul|\bir\b|\briso\b|\bmω|megohm|\bmohm\b|\bmeg\b/)) {
    if (has(h, /volt|\bv\b|\(v\)|\[v\]|test v|\bu\b|utest/) && !has(h, /mω|megohm|mohm/)) {
      return { target: 'irTestVoltage', why: `"${raw}" is the insulation test voltage` };
    }
    if (has(h, /l\s*-?\s*n\b|l\s*-?\s*l\b|live\s*-?\s*live|live\s*-?\s*neutral|\bln\b|\bll\b|between live/)) {
      return { target: 'irLiveLive', why: `"${raw}" is insulation resistance between live conductors` };
    }
    return { target: 'irLiveEarth', why: `"${raw}" is insulation resistance to earth${has(h, /l\s*-?\s*(e|pe)\b|earth|\ble\b|\blpe\b/) ? '' : ' (no pair named: taken as live to earth)'}` };
  }
  if (has(h, /test volt|\butest\b|\bu test\b/)) return { target: 'irTestVoltage', why: `"${raw}" is the insulation test voltage` };
  if (has(h, /\bring\b/)) {
    if (has(h, /\brn\b|neutral/)) return { target: 'ringRn', why: `"${raw}" is the ring's neutral end to end (rn)` };
    if (has(h, /\br2\b|cpc|earth/)) return { target: 'ringR2', why: `"${raw}" is the ring's cpc end to end (r2)` };
    if (has(h, /\br1\b|line|live/)) return { target: 'ringR1', why: `"${raw}" is the ring's line end to end (r1)` };
  }
  // Trade convention: lower-case r1, rn, r2 are a ring's ends; upper-case R2 is the cpc alone
  // measured with a long lead (common practice).
  const bare = raw.trim().replace(/\s*[([].*$/, '');
  if (/^r1$/.test(bare)) return { target: 'ringR1', why: `"${raw}" is the ring's line end to end (r1)` };
  if (/^r[nN]$/.test(bare) || /^RN$/.test(bare)) return { target: 'ringRn', why: `"${raw}" is the ring's neutral end to end (rn)` };
  if (/^r2$/.test(bare)) return { target: 'ringR2', why: `"${raw}" is the ring's cpc end to end (r2, lower case)` };
  if (/^R1$/.test(bare)) return { target: 'ringR1', why: `"${raw}" is taken as the ring's line end to end (r1)` };
  if (/^R2$/.test(bare) || has(h, /wander|long lead/)) return { target: 'r2', why: `"${raw}" is R2, the cpc alone (upper case, as the trade writes it)` };
  return null;
}

/** A value's shape: number (with its unit word), over-range, tick/cross, or a circuit number. */
function shapeOf(value: string): { kind: 'number' | 'over' | 'mark' | 'circuit' | 'other'; unit: string; n: number } {
  const v = value.trim();
  const m = /^([<>≥]=?)?\s*(\d+(?:[.,]\d+)?|[.,]\d+)\s*([a-zA-ZΩΩµ]+)?$/.exec(v);
  if (m) {
    const n = Number(m[2]!.replace(',', '.'));
    return { kind: m[1] ? 'over' : 'number', unit: (m[3] ?? '').toLowerCase().replace(/\u2126/g, 'ω'), n };
  }
  if (/^(✓|✔|✗|✘|pass|fail|ok|yes|no|y|n)$/i.test(v)) return { kind: 'mark', unit: '', n: 0 };
  if (/^\d{1,3}\s*l[123]$|^l[123]\s*[-/.:]?\s*\d{1,3}$/i.test(v)) return { kind: 'circuit', unit: '', n: 0 };
  return { kind: 'other', unit: '', n: 0 };
}

/** What the values of a column suggest, when the header said nothing. */
function fromValues(values: readonly string[], header: string): ProposedColumn | null {
  const filled = values.filter((v) => v.trim() !== '' && !/^-+$/.test(v.trim()));
  if (filled.length === 0) return null;
  const shapes = filled.map(shapeOf);
  const share = (pred: (s: ReturnType<typeof shapeOf>) => boolean) => shapes.filter(pred).length / shapes.length;
  const label = header.trim() === '' ? 'an unnamed column' : `"${header}"`;
  if (share((s) => s.kind === 'circuit') >= 0.8) return { target: 'circuit', why: `${label} holds three-phase circuit numbers (e.g. ${filled[0]})` };
  if (share((s) => s.unit === 'ms') >= 0.6) return { target: 'rcdTimeMs', why: `${label} holds times in ms (e.g. ${filled[0]}): taken as the RCD time` };
  if (share((s) => s.unit === 'mω' || s.unit === 'gω' || s.unit === 'megohm') >= 0.6 || share((s) => s.kind === 'over' && s.n >= 100) >= 0.5) {
    return { target: 'irLiveEarth', why: `${label} holds megohms or over-range values (e.g. ${filled[0]}): taken as insulation to earth` };
  }
  if (share((s) => s.kind === 'number' && [250, 500, 1000].includes(s.n) && (s.unit === '' || s.unit === 'v')) === 1 && shapes.some((s) => s.unit === 'v' || s.n === 500)) {
    return { target: 'irTestVoltage', why: `${label} holds 250, 500 or 1000 (e.g. ${filled[0]}): taken as the insulation test voltage` };
  }
  if (share((s) => s.kind === 'mark') === 1) return { target: 'polarity', why: `${label} holds ticks or pass/fail: taken as polarity (check it)` };
  const ints = filled.every((v) => /^\d{1,3}[a-z]?$/i.test(v.trim()));
  if (ints && /^\s*$/.test(header)) return { target: 'circuit', why: `${label} holds whole numbers: taken as circuit numbers` };
  return null;
}

/** Proposes a target per column of the table; each reading column is given to one file column at most. */
export function proposeMapping(table: Pick<ImportTable, 'headers' | 'rows'>): ProposedColumn[] {
  const taken = new Set<ImportTarget>();
  const out: ProposedColumn[] = table.headers.map(() => ({ target: 'ignore', why: '' }));
  const sample = table.rows.slice(0, 200);
  const pass = (guess: (i: number) => ProposedColumn | null) => {
    table.headers.forEach((header, i) => {
      if (out[i]!.why !== '') return;
      const g = guess(i);
      if (!g) return;
      if (g.target !== 'ignore' && taken.has(g.target)) {
        out[i] = { target: 'ignore', why: `"${header}" could be ${targetLabel(g.target)}, but an earlier column already is` };
        return;
      }
      if (g.target !== 'ignore') taken.add(g.target);
      out[i] = g;
    });
  };
  pass((i) => fromHeader(table.headers[i]!));
  pass((i) => fromValues(sample.map((r) => r[i] ?? ''), table.headers[i]!));
  return out.map((p, i) => (p.why === '' ? { target: 'ignore', why: `Nothing in "${table.headers[i]}" or its values says which reading it is` } : p));
}

/** The target's name as the console labels it. */
export function targetLabel(target: ImportTarget): string {
  if (target === 'circuit') return 'the circuit number';
  if (target === 'ignore') return 'not imported';
  const col = columnByKey[target as ReadingKey];
  return `${col.label}${col.unit ? ` (${col.unit})` : ''}`;
}

/**
 * A saved mapping applied to a file: columns are matched by header (case and spacing aside);
 * a header the saved mapping does not know keeps the proposal.
 */
export function applySavedMapping(headers: readonly string[], saved: readonly ImportMappingColumn[], proposal: readonly ProposedColumn[]): ProposedColumn[] {
  const byHeader = new Map(saved.map((c) => [fold(c.header), c.target]));
  return headers.map((h, i) => {
    const target = byHeader.get(fold(h));
    return target ? { target, why: `from the saved mapping` } : proposal[i]!;
  });
}
