import PDFDocument from 'pdfkit';
import type { Board, Circuit } from '../../shared/schemas/boards.ts';
import { columnByKey, columns, readingKeys, type ColumnDef, type ColumnKey } from '../../shared/schemas/columns.ts';
import { defaultCompany } from '../../shared/schemas/company.ts';
import { inspectionAreas } from '../../shared/schemas/inspection-items.ts';
import { blankSection, jobSectionKeys, observationCodes, usualIntervalMonths, type Observation } from '../../shared/schemas/job-record.ts';
import type { RingReadings } from '../../shared/schemas/ring-sockets.ts';
import { parsedFonts } from './fonts.ts';
import type { DocumentImage, DocumentSignature, JobDocument } from './load-job-document.ts';
import {
  codeMeanings,
  documentTitles,
  longDate,
  longDateTime,
  outcomeMeanings,
  outcomeSigns,
  premisesLabels,
  reasonLabels,
  safetyCaution,
  signatureRoleLabels,
  withUnit,
  yesNo,
} from './words.ts';

/** What the issue adds to the document: its revision and when and by whom it was issued. */
export interface IssueStamp {
  revision: number;
  /** The issue time; also the PDF's creation date, so the same job and stamp give the same bytes. */
  issuedAt: Date;
  issuedBy: string;
}

type Doc = PDFKit.PDFDocument;
type Align = 'left' | 'center' | 'right';

const ink = '#1d2327';
const muted = '#5b6670';
const rule = '#b8c0c6';
const accent = '#14505c';
const band = '#eef2f4';
const stripe = '#f6f8f9';

const margin = 36;
const footerSpace = 30;

/**
 * Renders a job's whole document as a PDF: a cover with the company, the installation, the
 * outcome and the caution; every section of the record; the schedule of inspections; the
 * observations; the summary; the declaration with signatures; then every board's schedule of
 * test results on landscape pages. Every page carries the document reference, the revision and
 * "page n of N". The layout is Boardwalk's own.
 */
export function renderJobPdf(document: JobDocument, stamp: IssueStamp): Promise<Buffer> {
  const title = documentTitles[document.job.kind];
  const reference = document.job.reference;
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: margin, left: margin, right: margin, bottom: margin + footerSpace },
    bufferPages: true,
    autoFirstPage: false,
    pdfVersion: '1.7',
    lang: 'en-GB',
    info: {
      Title: `${title} ${reference} revision ${stamp.revision}`,
      Author: document.company.name,
      Subject: `${document.site.client}, ${document.site.address}`,
      Creator: 'Boardwalk',
      Producer: 'Boardwalk',
      CreationDate: stamp.issuedAt,
      ModDate: stamp.issuedAt,
    },
  });
  const fonts = parsedFonts();
  // pdfkit accepts a parsed fontkit font as a source (its typings only list files and bytes).
  doc.registerFont('regular', fonts.regular as never);
  doc.registerFont('medium', fonts.medium as never);
  doc.registerFont('bold', fonts.bold as never);

  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const w = new Writer(doc);
  cover(w, document, stamp);
  w.newPage('portrait');
  recordSections(w, document);
  inspections(w, document);
  if (document.job.kind === 'EICR') observations(w, document);
  summary(w, document);
  acceptances(w, document);
  declaration(w, document);
  for (const { board, circuits, rings } of document.boards) boardSchedule(w, board, circuits, rings);
  footers(doc, `${reference} · revision ${stamp.revision} · ${title}`);
  doc.end();
  return done;
}

// ---------------------------------------------------------------------------------------------
// Layout helpers

class Writer {
  layout: 'portrait' | 'landscape' = 'portrait';
  /** Called after a page break inside a table, to repeat the table's header. */
  onPageBreak: (() => void) | null = null;

  constructor(readonly doc: Doc) {}

  get left() {
    return this.doc.page.margins.left;
  }
  get width() {
    return this.doc.page.width - this.doc.page.margins.left - this.doc.page.margins.right;
  }
  get bottom() {
    return this.doc.page.height - this.doc.page.margins.bottom;
  }

  newPage(layout: 'portrait' | 'landscape') {
    this.layout = layout;
    this.doc.addPage({
      size: 'A4',
      layout,
      margins: { top: margin, left: margin, right: margin, bottom: margin + footerSpace },
    });
    this.doc.x = this.left;
    this.doc.y = this.doc.page.margins.top;
  }

  /** Starts a new page (same layout) unless `height` still fits on this one. */
  ensure(height: number) {
    if (this.doc.y + height <= this.bottom) return;
    this.newPage(this.layout);
    this.onPageBreak?.();
  }

  font(name: 'regular' | 'medium' | 'bold', size: number, color = ink) {
    this.doc.font(name).fontSize(size).fillColor(color);
    return this.doc;
  }

  heading(text: string) {
    this.ensure(60);
    this.doc.y += 6;
    this.font('bold', 12.5, accent).text(text, this.left, this.doc.y, { width: this.width });
    const y = this.doc.y + 2;
    this.doc.moveTo(this.left, y).lineTo(this.left + this.width, y).lineWidth(0.8).strokeColor(accent).stroke();
    this.doc.y = y + 6;
  }

  subheading(text: string) {
    // Room for the heading and the start of what follows it, so a heading never ends a page.
    this.ensure(64);
    this.doc.y += 3;
    this.font('bold', 9.5).text(text, this.left, this.doc.y, { width: this.width });
    this.doc.y += 2;
  }

  paragraph(text: string, size = 9, color = ink) {
    this.font('regular', size, color);
    this.ensure(Math.min(this.doc.heightOfString(text, { width: this.width }), 120));
    this.doc.text(text, this.left, this.doc.y, { width: this.width });
    this.doc.y += 3;
  }

  /**
   * Labelled values in a grid (`perRow` per row): the label small above, the value below; an
   * empty value prints as a dash so a blank can be told from a field left off.
   */
  fields(pairs: readonly (readonly [string, string])[], perRow = 3) {
    const gap = 10;
    const cellWidth = (this.width - gap * (perRow - 1)) / perRow;
    for (let i = 0; i < pairs.length; i += perRow) {
      const row = pairs.slice(i, i + perRow);
      this.font('regular', 9.5);
      const valueHeight = Math.max(...row.map(([, value]) => this.doc.heightOfString(value || '—', { width: cellWidth })));
      const height = 10 + valueHeight + 5;
      this.ensure(height);
      const y = this.doc.y;
      row.forEach(([label, value], index) => {
        const x = this.left + index * (cellWidth + gap);
        this.font('regular', 7, muted).text(label, x, y, { width: cellWidth, lineBreak: false, height: 9, ellipsis: true });
        this.font('regular', 9.5, value ? ink : muted).text(value || '—', x, y + 9.5, { width: cellWidth });
      });
      this.doc.y = y + height;
    }
  }

  /** A shaded box of text (the caution). */
  notice(text: string, size = 8.5) {
    this.font('medium', size);
    const inner = this.width - 16;
    const height = this.doc.heightOfString(text, { width: inner }) + 12;
    this.ensure(height + 4);
    const y = this.doc.y;
    this.doc.rect(this.left, y, this.width, height).fillColor(band).fill();
    this.doc.rect(this.left, y, 3, height).fillColor(accent).fill();
    this.font('medium', size).text(text, this.left + 10, y + 6, { width: inner });
    this.doc.y = y + height + 6;
  }
}

/**
 * One line of text in a table cell, never wrapping: shrunk a little if it does not fit, then cut
 * with an ellipsis. Drawn without a width so pdfkit's line wrapper (and its page breaks) stay out.
 */
function cellText(doc: Doc, text: string, x: number, y: number, width: number, align: Align, size: number, font: 'regular' | 'medium' | 'bold' = 'regular') {
  if (!text) return;
  const pad = 1.8;
  const room = width - pad * 2;
  doc.font(font).fontSize(size);
  let textWidth = doc.widthOfString(text);
  let fontSize = size;
  if (textWidth > room) {
    fontSize = Math.max(size * 0.78, (size * room) / textWidth);
    doc.fontSize(fontSize);
    textWidth = doc.widthOfString(text);
    if (textWidth > room) {
      let cut = text;
      while (cut.length > 1 && doc.widthOfString(`${cut}…`) > room) cut = cut.slice(0, -1);
      text = `${cut}…`;
      textWidth = doc.widthOfString(text);
    }
  }
  const left = align === 'left' ? x + pad : align === 'right' ? x + width - pad - textWidth : x + (width - textWidth) / 2;
  doc.text(text, left, y + (size - fontSize) / 2, { lineBreak: false });
}

interface TableColumn {
  label: string;
  unit?: string;
  width: number;
  align: Align;
  /** Wraps onto more lines (up to `maxLines`) instead of shrinking. */
  wrap?: boolean;
  group?: string;
}

interface TableOptions {
  size: number;
  /** Lines a wrapping cell may take. */
  maxLines?: number;
  /** Printed above the repeated header on a continuation page. */
  continued?: string;
  /** Group labels over the column headers. */
  groups?: boolean;
}

/**
 * A table with a header row (repeated after a page break) and striped rows. Row heights grow
 * for wrapping columns only; every other cell is one line.
 */
function table(w: Writer, cols: readonly TableColumn[], rows: readonly (readonly string[])[], options: TableOptions) {
  const { doc } = w;
  const size = options.size;
  const line = size * 1.22;
  const maxLines = options.maxLines ?? 3;
  const hasUnits = cols.some((c) => c.unit);
  const headerHeight = line + (hasUnits ? line * 0.9 : 0) + 5 + (options.groups ? line + 3 : 0);

  const drawHeader = (continued: boolean) => {
    if (continued && options.continued) {
      w.font('medium', 8, muted).text(options.continued, w.left, doc.y, { width: w.width });
      doc.y += 2;
    }
    const top = doc.y;
    let y = top;
    if (options.groups) {
      let x = w.left;
      let i = 0;
      while (i < cols.length) {
        const group = cols[i]!.group ?? '';
        let span = 0;
        let j = i;
        while (j < cols.length && (cols[j]!.group ?? '') === group) span += cols[j++]!.width;
        if (group) {
          doc.rect(x + 0.5, y, span - 1, line + 1).fillColor(band).fill();
          doc.fillColor(accent);
          cellText(doc, group, x, y + 1.5, span, 'center', size - 0.5, 'medium');
        }
        x += span;
        i = j;
      }
      y += line + 3;
    }
    let x = w.left;
    doc.fillColor(ink);
    for (const col of cols) {
      cellText(doc, col.label, x, y + 1, col.width, col.align, size, 'bold');
      if (col.unit) {
        doc.fillColor(muted);
        cellText(doc, col.unit, x, y + 1 + line * 0.9, col.width, col.align, size - 1);
        doc.fillColor(ink);
      }
      x += col.width;
    }
    const end = top + headerHeight - 2;
    doc.moveTo(w.left, end).lineTo(w.left + w.width, end).lineWidth(0.7).strokeColor(ink).stroke();
    doc.y = end + 2;
  };

  w.ensure(headerHeight + line * 3);
  drawHeader(false);
  const previous = w.onPageBreak;
  w.onPageBreak = () => drawHeader(true);

  rows.forEach((row, rowIndex) => {
    // Height: one line, or as many as the longest wrapping cell needs (capped).
    let lines = 1;
    cols.forEach((col, i) => {
      const text = row[i] ?? '';
      if (!col.wrap || !text) return;
      doc.font('regular').fontSize(size);
      if (doc.widthOfString(text) <= col.width - 4) return;
      const needed = Math.ceil(doc.heightOfString(text, { width: col.width - 4 }) / line);
      lines = Math.max(lines, Math.min(maxLines, needed));
    });
    const height = lines * line + 3;
    w.ensure(height);
    const y = doc.y;
    if (rowIndex % 2 === 1) doc.rect(w.left, y, w.width, height).fillColor(stripe).fill();
    doc.fillColor(ink);
    // One-line cells first, wrapped ones after: text extraction (copying, screen readers, the
    // tests) then reads a row's number and readings as one line, whatever wraps.
    const lefts = cols.map((_, i) => w.left + cols.slice(0, i).reduce((sum, c) => sum + c.width, 0));
    const wrapped = cols.map((col, i) => col.wrap === true && lines > 1 && (row[i] ?? '') !== '');
    cols.forEach((col, i) => {
      if (!wrapped[i]) cellText(doc, row[i] ?? '', lefts[i]!, y + 1.5, col.width, col.align, size);
    });
    cols.forEach((col, i) => {
      if (!wrapped[i]) return;
      doc.font('regular').fontSize(size).fillColor(ink);
      // `line` is a little more than the font's own line height, so `lines` lines always fit.
      doc.text(row[i] ?? '', lefts[i]! + 2, y + 1.5, { width: col.width - 4, height: lines * line + 1, ellipsis: true });
    });
    doc.y = y + height;
    doc.moveTo(w.left, doc.y).lineTo(w.left + w.width, doc.y).lineWidth(0.25).strokeColor(rule).stroke();
  });
  w.onPageBreak = previous;
  doc.x = w.left;
  doc.y += 6;
}

/** Sizes columns: fixed widths as given, the rest shared among the flexible ones by weight. */
function fitColumns<T extends { width: number; flex?: number }>(cols: T[], total: number): T[] {
  const fixed = cols.filter((c) => !c.flex).reduce((sum, c) => sum + c.width, 0);
  const weights = cols.reduce((sum, c) => sum + (c.flex ?? 0), 0);
  const spare = Math.max(0, total - fixed);
  return cols.map((c) => (c.flex ? { ...c, width: (spare * c.flex) / weights } : c));
}

function image(doc: Doc, picture: DocumentImage, x: number, y: number, fit: [number, number]): boolean {
  try {
    doc.image(picture.bytes, x, y, { fit, valign: 'center' });
    return true;
  } catch {
    // A damaged image must not stop the document: the page says it is missing instead.
    return false;
  }
}

// ---------------------------------------------------------------------------------------------
// The document's parts

function cover(w: Writer, d: JobDocument, stamp: IssueStamp) {
  const { doc } = w;
  w.newPage('portrait');
  const top = doc.y;
  let textLeft = w.left;
  if (d.logo && image(doc, d.logo, w.left, top, [130, 56])) textLeft = w.left + 142;
  const companyWidth = w.left + w.width - textLeft;
  w.font('bold', 13).text(d.company.name, textLeft, top, { width: companyWidth });
  const contact = [d.company.address, [d.company.phone, d.company.email].filter(Boolean).join(' · '), d.company.registration]
    .filter(Boolean)
    .join('\n');
  if (contact) w.font('regular', 8.5, muted).text(contact, textLeft, doc.y + 1, { width: companyWidth });
  doc.y = Math.max(doc.y, top + 60) + 18;

  w.font('bold', 22, accent).text(documentTitles[d.job.kind], w.left, doc.y, { width: w.width });
  doc.y += 4;
  w.font('medium', 11).text(`Document ${d.job.reference} · revision ${stamp.revision}`, w.left, doc.y, { width: w.width });
  w.font('regular', 9, muted).text(
    `Issued ${longDateTime(stamp.issuedAt.toISOString())} by ${stamp.issuedBy}. This revision replaces any earlier revision of the same document.`,
    w.left,
    doc.y + 2,
    { width: w.width },
  );
  doc.y += 14;

  w.heading('The installation');
  w.fields(
    [
      ['Client', d.site.client],
      ['Address of the installation', d.site.address],
      ['Description', d.site.description],
      ['Contact', [d.site.contactName, d.site.contactEmail].filter(Boolean).join(', ')],
      ['Visit', d.job.visitEndDate && d.job.visitEndDate !== d.job.visitDate ? `${longDate(d.job.visitDate)} to ${longDate(d.job.visitEndDate)}` : longDate(d.job.visitDate)],
      ['Boards and circuits', `${d.boards.length} board(s), ${d.boards.reduce((n, b) => n + b.circuits.length, 0)} circuit(s)`],
    ],
    3,
  );

  w.heading('Outcome');
  const outcome: [string, string][] = [];
  if (d.job.kind === 'EICR') {
    outcome.push(['Overall assessment of the installation', d.assessment.assessment]);
    const observations = Object.values(d.record.observations.data).filter((o): o is Observation => o !== null);
    const counts = observationCodes.map((code) => `${code}: ${observations.filter((o) => o.code === code).length}`).join('   ');
    outcome.push(['Observations by code', counts]);
  }
  outcome.push(['Next inspection recommended by', d.nextInspection ? longDate(d.nextInspection) : '']);
  w.fields(outcome, 3);
  if (d.job.kind === 'EICR') w.paragraph(d.assessment.reason, 9);
  doc.y += 8;
  w.notice(safetyCaution, 9);
}

function recordSections(w: Writer, d: JobDocument) {
  const r = d.record;
  const client = r.client.data;
  w.heading(d.job.kind === 'EICR' ? 'Who asked for the report, and why' : 'Who the work is for');
  const clientFields: [string, string][] = [
    ['Ordered by', client.orderedBy],
    ['Their address', client.orderedByAddress],
  ];
  if (d.job.kind === 'EICR') {
    clientFields.push(['Reason for the report', client.reason ? (reasonLabels[client.reason] ?? client.reason) : '']);
    clientFields.push(['Reason in more detail', client.reasonDetail]);
  }
  w.fields(clientFields, 2);

  const inst = r.installation.data;
  w.heading('The installation as found');
  w.fields([
    ['Premises', inst.premises ? (premisesLabels[inst.premises] ?? inst.premises) : ''],
    ['Estimated age of the wiring', withUnit(inst.wiringAgeYears, 'years')],
    ['Evidence of alterations', yesNo(inst.alterationsEvident)],
    ['Estimated age of the alterations', withUnit(inst.alterationsAgeYears, 'years')],
    ['Installation records available', yesNo(inst.recordsAvailable)],
    ['Records held by', inst.recordsHeldBy],
    ['Date of the last inspection', longDate(inst.lastInspectionDate)],
  ]);

  if (d.job.kind === 'EIC') {
    const work = r.work.data;
    w.heading('The work this certificate covers');
    w.fields(
      [
        ['Description of the work', work.description],
        ['Extent of the work', work.extent],
        ['Departures from BS 7671, with reasons', work.departures || 'none'],
        ['Comments on the existing installation', work.existingInstallationComments],
      ],
      1,
    );
  }

  const s = r.supply.data;
  w.heading('Supply characteristics and earthing arrangements');
  w.fields([
    ['Earthing system', s.earthing ?? ''],
    ['Live conductors', s.liveConductors ?? ''],
    ['Nominal voltage U0 to earth', withUnit(s.u0V, 'V')],
    ['Nominal voltage U between lines', withUnit(s.uV, 'V')],
    ['Frequency', withUnit(s.frequencyHz, 'Hz')],
    ['External loop impedance Ze', withUnit(s.zeOhm, 'Ω')],
    ['Prospective fault current Ipf', withUnit(s.ipfKa, 'kA')],
    ['Supply device: standard and type', [s.supplyDeviceStandard, s.supplyDeviceType].filter(Boolean).join(' ')],
    ['Supply device: rating', withUnit(s.supplyDeviceRatingA, 'A')],
    ['Supply neutral csa', withUnit(s.supplyNeutralCsaMm2, 'mm²')],
  ]);

  const o = r.origin.data;
  w.heading('Particulars at the origin');
  w.subheading('Means of earthing');
  const earthing: [string, string][] = [['Means of earthing', o.meansOfEarthing === 'supplier' ? 'the supplier’s facility' : o.meansOfEarthing === 'electrode' ? 'installation earth electrode' : '']];
  if (o.meansOfEarthing === 'electrode') {
    earthing.push(['Electrode type', o.electrodeType], ['Electrode location', o.electrodeLocation], ['Electrode resistance RA', withUnit(o.electrodeRaOhm, 'Ω')]);
  }
  w.fields(earthing);
  w.subheading('Main switch or circuit-breaker');
  w.fields([
    ['Standard', o.mainSwitchStandard],
    ['Poles', o.mainSwitchPoles === null ? '' : String(o.mainSwitchPoles)],
    ['Rating', withUnit(o.mainSwitchRatingA, 'A')],
    ['RCD rated residual current IΔn', withUnit(o.mainSwitchRcdMa, 'mA')],
    ['RCD operating time measured', withUnit(o.mainSwitchRcdTimeMs, 'ms')],
  ]);
  w.subheading('Earthing and main protective bonding conductors');
  w.fields([
    ['Earthing conductor', [o.earthingConductorMaterial, withUnit(o.earthingConductorCsaMm2, 'mm²')].filter(Boolean).join(', ')],
    ['Earthing conductor continuity verified', yesNo(o.earthingConductorVerified)],
    ['Main bonding conductors', [o.bondingConductorMaterial, withUnit(o.bondingConductorCsaMm2, 'mm²')].filter(Boolean).join(', ')],
    ['Main bonding continuity verified', yesNo(o.bondingVerified)],
    ['Bonded to water', yesNo(o.bondedWater)],
    ['Bonded to gas', yesNo(o.bondedGas)],
    ['Bonded to oil', yesNo(o.bondedOil)],
    ['Bonded to structural steel', yesNo(o.bondedStructuralSteel)],
    ['Bonded to lightning protection', yesNo(o.bondedLightningProtection)],
    ['Other parts bonded', o.bondedOther],
  ]);

  const e = r.extent.data;
  w.heading('Extent of the inspection and its limitations');
  w.fields(
    [
      ['What the inspection and testing covered', e.extentCovered],
      ['Limitations agreed with', e.agreedWith],
    ],
    1,
  );
  if (e.limitations.length > 0) {
    const cols = fitColumns(
      [
        { label: 'Kind', width: 70, align: 'left' as Align },
        { label: 'What was not inspected or tested', width: 0, flex: 1, align: 'left' as Align, wrap: true },
        { label: 'Why', width: 0, flex: 1, align: 'left' as Align, wrap: true },
      ],
      w.width,
    );
    table(
      w,
      cols,
      e.limitations.map((l) => [l.kind === 'agreed' ? 'agreed' : 'operational', l.what, l.reason]),
      { size: 8.5, maxLines: 8, continued: 'Limitations (continued)' },
    );
  } else {
    w.paragraph('No limitations were recorded.', 9, muted);
  }
  if (d.job.limitations.trim()) w.fields([['General limitations noted on the job', d.job.limitations]], 1);
}

function inspections(w: Writer, d: JobDocument) {
  const outcomes = d.record.inspections.data;
  w.heading('Schedule of inspections');
  const used = new Set<string>();
  for (const area of inspectionAreas) {
    w.subheading(`${area.id}. ${area.title}`);
    const cols = fitColumns(
      [
        { label: 'Item', width: 32, align: 'left' as Align },
        { label: 'What was inspected', width: 0, flex: 1, align: 'left' as Align, wrap: true },
        { label: 'Outcome', width: 70, align: 'center' as Align },
      ],
      w.width,
    );
    const rows = area.items.map((item) => {
      const outcome = outcomes[item.id] ?? null;
      if (outcome) used.add(outcome);
      return [item.id, item.text, outcome ? outcomeSigns[outcome] : '—'];
    });
    table(w, cols, rows, { size: 8.5, maxLines: 3, continued: `${area.title} (continued)` });
  }
  const legend = (Object.keys(outcomeSigns) as (keyof typeof outcomeSigns)[])
    .filter((key) => d.job.kind === 'EICR' ? key !== 'fail' : !['C1', 'C2', 'C3'].includes(key))
    .map((key) => `${outcomeSigns[key]} ${outcomeMeanings[key]}`)
    .join(' · ');
  w.paragraph(`Outcomes: ${legend}; — not recorded.`, 7.5, muted);
}

function observations(w: Writer, d: JobDocument) {
  const list = Object.values(d.record.observations.data)
    .filter((o): o is Observation => o !== null)
    .sort((a, b) => a.number - b.number);
  const boardRef = new Map(d.boards.map((b) => [b.board.id, b.board]));
  const circuitNumber = new Map(d.boards.flatMap((b) => b.circuits.map((c) => [c.id, c.number] as const)));
  w.heading('Observations');
  if (list.length === 0) {
    w.paragraph('No observations were recorded.', 9);
  } else {
    const cols = fitColumns(
      [
        { label: 'No.', width: 28, align: 'left' as Align },
        { label: 'Code', width: 34, align: 'center' as Align },
        { label: 'What was observed', width: 0, flex: 3, align: 'left' as Align, wrap: true },
        { label: 'Where', width: 0, flex: 1.3, align: 'left' as Align, wrap: true },
      ],
      w.width,
    );
    const rows = list.map((o) => {
      const where = [
        o.location,
        o.boardId !== null ? `board ${boardRef.get(o.boardId)?.reference ?? o.boardId}` : '',
        o.circuitId !== null && circuitNumber.has(o.circuitId) ? `circuit ${circuitNumber.get(o.circuitId)}` : '',
        o.inspectionItem ? `item ${o.inspectionItem}` : '',
      ]
        .filter(Boolean)
        .join(', ');
      return [String(o.number), o.code ?? 'not coded', o.text, where];
    });
    table(w, cols, rows, { size: 8.5, maxLines: 12, continued: 'Observations (continued)' });
  }
  w.subheading('What the codes mean');
  w.fields(
    observationCodes.map((code) => [code, codeMeanings[code]] as [string, string]),
    2,
  );
}

function summary(w: Writer, d: JobDocument) {
  const s = d.record.summary.data;
  w.heading('Summary');
  const pairs: [string, string][] = [];
  if (d.job.kind === 'EICR') {
    pairs.push(['Overall assessment', d.assessment.assessment], ['Why', d.assessment.reason]);
  }
  pairs.push(['General condition of the installation', s.generalCondition]);
  const premises = d.record.installation.data.premises;
  const usual = premises ? usualIntervalMonths[premises] : null;
  const interval = s.nextInspectionMonths === null ? '' : `${s.nextInspectionMonths} months`;
  pairs.push(['Interval to the next inspection', usual && s.nextInspectionMonths !== null && s.nextInspectionMonths < usual ? `${interval} (shorter than the usual ${usual} months)` : interval]);
  pairs.push(['Next inspection recommended by', d.nextInspection ? longDate(d.nextInspection) : '']);
  if (s.nextInspectionReason) pairs.push(['Why this interval', s.nextInspectionReason]);
  w.fields(pairs, 1);
}

function acceptances(w: Writer, d: JobDocument) {
  if (d.acceptances.length === 0) return;
  w.heading('Checker findings accepted at review');
  w.paragraph('The reviewer looked at each of these findings of the automatic checks and accepted it for the reason given.', 8.5, muted);
  const cols = fitColumns(
    [
      { label: 'Board', width: 50, align: 'left' as Align },
      { label: 'Finding', width: 0, flex: 1.2, align: 'left' as Align, wrap: true },
      { label: 'Reason for accepting', width: 0, flex: 1, align: 'left' as Align, wrap: true },
      { label: 'Accepted by', width: 110, align: 'left' as Align, wrap: true },
    ],
    w.width,
  );
  table(
    w,
    cols,
    d.acceptances.map((a) => [a.boardReference ?? 'job', `${a.message} (${a.code})`, a.reason, `${a.acceptedBy}, ${longDate(a.acceptedAt)}`]),
    { size: 8, maxLines: 6, continued: 'Accepted findings (continued)' },
  );
}

function declaration(w: Writer, d: JobDocument) {
  const { doc } = w;
  const decl = d.record.declaration.data;
  w.heading('Declaration');
  w.paragraph(
    d.job.kind === 'EIC'
      ? 'Each person named below confirms that the part of the work beside their name was done, and is recorded in this certificate, in accordance with the current edition of BS 7671 as far as they know, apart from any departures listed above.'
      : 'The inspector named below carried out the inspection and testing recorded in this report, within the extent and limitations stated, and gives the condition of the installation as set out in the summary. The reviewer checked the records before the report was issued.',
    9,
  );
  const people: { role: DocumentSignature['role']; label: string }[] =
    d.job.kind === 'EIC'
      ? decl.samePersonForAll
        ? [{ role: 'inspector', label: 'Design, construction, and inspection and testing' }]
        : [
            { role: 'designer', label: signatureRoleLabels.designer },
            { role: 'constructor', label: signatureRoleLabels.constructor },
            { role: 'inspector', label: signatureRoleLabels.inspector },
          ]
      : [{ role: 'inspector', label: signatureRoleLabels.inspector }];
  if (d.job.kind === 'EICR' || decl.reviewer.name || d.signatures.some((s) => s.role === 'reviewer')) {
    people.push({ role: 'reviewer', label: signatureRoleLabels.reviewer });
  }
  for (const person of people) {
    const named = decl[person.role];
    const signature = d.signatures.find((s) => s.role === person.role);
    w.ensure(96);
    const y = doc.y + 4;
    doc.rect(w.left, y, w.width, 84).lineWidth(0.5).strokeColor(rule).stroke();
    w.font('bold', 9.5).text(person.label, w.left + 8, y + 6, { width: 240 });
    const details: [string, string][] = [
      ['Name', named.name || signature?.name || ''],
      ['Position', named.position],
      ['Date', longDate(named.date)],
    ];
    let ty = y + 22;
    for (const [label, value] of details) {
      w.font('regular', 7, muted).text(label, w.left + 8, ty, { lineBreak: false });
      w.font('regular', 9.5, value ? ink : muted).text(value || '—', w.left + 60, ty - 2, { width: 200, lineBreak: false, height: 12, ellipsis: true });
      ty += 16;
    }
    const sx = w.left + 280;
    w.font('regular', 7, muted).text('Signature', sx, y + 6, { lineBreak: false });
    if (signature) {
      const drawn = signature.image ? image(doc, signature.image, sx, y + 16, [w.width - 290, 44]) : false;
      if (!drawn) w.font('regular', 9, muted).text('(signature image not available)', sx, y + 32, { lineBreak: false });
      w.font('regular', 7.5, muted).text(`Signed as ${signature.name} on ${longDateTime(signature.signedAt)}`, sx, y + 66, {
        width: w.width - 290,
        lineBreak: false,
        height: 10,
        ellipsis: true,
      });
    } else {
      w.font('regular', 9, muted).text('not signed', sx, y + 32, { lineBreak: false });
    }
    doc.y = y + 90;
  }
  doc.y += 4;
  w.notice(safetyCaution);
}

// ---------------------------------------------------------------------------------------------
// Schedules of test results (landscape)

/** Widths (pt) of the schedule's columns on an A4 landscape page; description and remarks flex. */
const scheduleWidths: Partial<Record<ColumnKey, number>> = {
  kind: 44,
  wiringType: 30,
  referenceMethod: 30,
  points: 30,
  liveCsaMm2: 30,
  cpcCsaMm2: 30,
  maxDisconnectionS: 38,
  deviceStandard: 40,
  deviceType: 28,
  ratingA: 28,
  breakingKa: 26,
  maxZsByHandOhm: 38,
  rcdType: 34,
  rcdRatedResidualMa: 30,
  afdd: 30,
};

/** Shorter headings where the console's label does not fit a printed column. */
const printedHeadings: Partial<Record<ColumnKey, { label: string; unit?: string }>> = {
  referenceMethod: { label: 'Method' },
  maxZsByHandOhm: { label: 'Max Zs', unit: 'given, Ω' },
};

const numericKinds = new Set(['number', 'integer', 'reading', 'pass-fail']);

function detailText(circuit: Circuit, key: ColumnKey): string {
  const value = (circuit as unknown as Record<string, unknown>)[key];
  return value === null || value === undefined ? '' : String(value);
}

function boardSchedule(w: Writer, board: Board, circuits: Circuit[], rings: readonly RingReadings[]) {
  const { doc } = w;
  w.newPage('landscape');
  w.font('bold', 14, accent).text(`Schedule of test results: board ${board.reference}`, w.left, doc.y, { width: w.width });
  doc.y += 3;
  w.fields(
    [
      ['Location', board.location],
      ['Supplied from', board.suppliedFrom],
      ['Phases', board.phases === 3 ? 'three-phase' : 'single-phase'],
      ['Loop impedance at the board Zdb', withUnit(board.zdbOhm, 'Ω')],
      ['Prospective fault current at the board Ipf', withUnit(board.ipfKa, 'kA')],
      ['Polarity confirmed', yesNo(board.polarityConfirmed)],
      ...(board.phases === 3 ? [['Phase sequence confirmed', yesNo(board.phaseSequenceConfirmed)] as [string, string]] : []),
      ['Locked for review', board.lockedBy ? `by ${board.lockedBy.name}, ${longDate(board.lockedAt)}` : 'not locked'],
      ['Instruments used', board.instruments],
    ],
    5,
  );

  const continued = `Board ${board.reference} (continued)`;
  const threePhase = board.phases === 3 || circuits.some((c) => c.phase !== null);
  const numberColumns: (TableColumn & { flex?: number; key: string })[] = [
    { key: 'number', label: 'Circuit', width: 34, align: 'left' },
    ...(threePhase ? [{ key: 'phase', label: 'Phase', width: 28, align: 'center' as Align }] : []),
  ];
  const byColumn = (def: ColumnDef, width: number, flex?: number): TableColumn & { flex?: number; key: string } => ({
    key: def.key,
    label: printedHeadings[def.key]?.label ?? def.label,
    unit: printedHeadings[def.key]?.unit ?? def.unit,
    width,
    flex,
    align: numericKinds.has(def.valueKind) ? 'center' : 'left',
    wrap: def.valueKind === 'text' && (def.key === 'description' || def.key === 'remarks'),
    group: columnGroupLabel(def),
  });

  // Circuit details: what each circuit is.
  const detailColumns = fitColumns(
    [
      ...numberColumns,
      byColumn(columnByKey.description, 0, 1.1),
      ...columns.filter((c) => c.storage === 'detail' && c.key !== 'description' && c.key !== 'remarks').map((c) => byColumn(c, scheduleWidths[c.key] ?? 30)),
      byColumn(columnByKey.remarks, 0, 1),
    ],
    w.width,
  );
  w.subheading('Circuit details');
  table(
    w,
    detailColumns,
    circuits.map((c) => detailColumns.map((col) => (col.key === 'number' ? c.number : col.key === 'phase' ? (c.phase ?? '') : detailText(c, col.key as ColumnKey)))),
    { size: 7.5, maxLines: 3, continued, groups: true },
  );

  // Test results: every reading as typed.
  const readingColumns = fitColumns(
    [
      ...numberColumns,
      byColumn(columnByKey.description, 0, 1),
      ...columns.filter((c) => c.storage === 'reading').map((c) => byColumn(c, 40)),
    ],
    w.width,
  );
  w.ensure(80);
  w.subheading('Test results');
  table(
    w,
    readingColumns,
    circuits.map((c) =>
      readingColumns.map((col) =>
        col.key === 'number' ? c.number : col.key === 'phase' ? (c.phase ?? '') : col.key === 'description' ? c.description : (c.cells[col.key as keyof Circuit['cells']]?.text ?? ''),
      ),
    ),
    { size: 8, maxLines: 2, continued, groups: true },
  );

  // Why each LIM: a limitation without its reason would not be issued.
  const limits = circuits.flatMap((c) =>
    Object.entries(c.cells)
      .filter(([, cell]) => cell && cell.text.trim().toUpperCase() === 'LIM')
      .map(([key, cell]) => `circuit ${c.number}, ${columnByKey[key as ColumnKey]?.label ?? key}: ${cell?.reason || 'no reason recorded'}`),
  );
  if (limits.length > 0) {
    w.subheading('Readings not taken (LIM) and why');
    w.paragraph(limits.join('; ') + '.', 8);
  }
  ringSockets(w, rings, continued);
  w.paragraph(
    'Readings are printed exactly as recorded: ">200" is beyond the instrument’s range, N/A not applicable, LIM not taken because of a limitation, ✓ confirmed, ✗ not confirmed. Units are under each heading.',
    7.5,
    muted,
  );
  w.paragraph(safetyCaution, 7.5, muted);
}

/**
 * Each ring's socket-by-socket readings (steps 2 and 3 of the ring test: L-N and L-cpc at each
 * socket with the ends cross-connected) and the checker's diagnosis in words.
 */
function ringSockets(w: Writer, rings: readonly RingReadings[], continued: string) {
  if (rings.length === 0) return;
  const cols = fitColumns<TableColumn & { flex?: number }>(
    [
      { label: 'Socket', width: 44, align: 'center' },
      { label: 'Label', width: 0, flex: 1, align: 'left' },
      { label: 'Position along the ring', unit: '0 to 1', width: 100, align: 'center' },
      { label: 'L-N', unit: 'Ω', width: 70, align: 'center' },
      { label: 'L-cpc', unit: 'Ω', width: 70, align: 'center' },
      { label: 'The diagnosis points here', width: 0, flex: 1, align: 'left' },
    ],
    w.width,
  );
  for (const ring of rings) {
    w.ensure(90);
    w.subheading(`Ring ${ring.circuitNumber}${ring.description ? ` (${ring.description})` : ''}: readings at each socket`);
    const suspects = new Set(ring.diagnosis?.suspects ?? []);
    table(
      w,
      cols,
      ring.sockets.map((s, i) => [String(i + 1), s.label, s.position === null ? '' : String(s.position), s.lineNeutral, s.lineCpc, suspects.has(i) ? 'yes' : '']),
      { size: 8, continued },
    );
    w.paragraph(
      ring.diagnosis
        ? `Diagnosis: ${ring.diagnosis.verdictText}. ${ring.diagnosis.message}`
        : 'No diagnosis: the ring’s end-to-end readings r1 and r2 are not both recorded.',
      8,
    );
  }
  w.paragraph('The diagnosis compares the L-cpc readings with what a sound ring reads (common practice); it shows where to look, not a certainty.', 7.5, muted);
}

function columnGroupLabel(def: ColumnDef): string {
  const labels: Record<string, string> = {
    circuit: 'Circuit',
    device: 'Protective device',
    continuity: 'Continuity',
    insulation: 'Insulation resistance',
    loop: 'Loop',
    rcd: 'RCD / AFDD',
    remarks: '',
  };
  return labels[def.group] ?? '';
}

/** The document reference and "page n of N" at the foot of every page. */
function footers(doc: Doc, left: string) {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const page = doc.page;
    const y = page.height - margin - 8;
    // Writing inside the bottom margin must not start a new page.
    page.margins.bottom = 0;
    doc.moveTo(page.margins.left, y - 4).lineTo(page.width - page.margins.right, y - 4).lineWidth(0.4).strokeColor(rule).stroke();
    doc.font('regular').fontSize(7.5).fillColor(muted);
    doc.text(left, page.margins.left, y, { lineBreak: false });
    const pageText = `page ${i - range.start + 1} of ${range.count}`;
    doc.text(pageText, page.width - page.margins.right - doc.widthOfString(pageText), y, { lineBreak: false });
  }
}

/**
 * Renders a small made-up document and throws it away, so the first issue after a start does not
 * pay for compiling the layout code and reading the fonts' tables. Called once after the server
 * starts listening; nothing is stored.
 */
export async function warmUpPdfRenderer(): Promise<void> {
  const record = Object.fromEntries(jobSectionKeys.map((key) => [key, { data: blankSection(key), version: 0 }])) as JobDocument['record'];
  const cells = Object.fromEntries(
    readingKeys.map((key, i) => [key, { text: ['0.44', '>200', 'N/A', 'LIM', '✓', '500'][i % 6]!, reason: null, version: 1, updatedBy: null, updatedAt: null }]),
  );
  const circuit = (n: number): Circuit => ({
    id: n, boardId: 1, position: n, version: 1, number: `${n}L${(n % 3) + 1}`, phase: null, description: 'Warm-up circuit', kind: 'radial',
    wiringType: 'A', referenceMethod: 'C', points: 3, liveCsaMm2: 2.5, cpcCsaMm2: 1.5, maxDisconnectionS: 0.4, deviceStandard: '60898',
    deviceType: 'B', ratingA: 16, breakingKa: 6, rcdType: 'A', rcdRatedResidualMa: 30, afdd: 'no', remarks: '', spurRingId: null,
    spurOriginPoint: null, spurLengthM: null, maxZsByHandOhm: null, cells,
  });
  const document: JobDocument = {
    job: { id: 1, siteId: 1, kind: 'EICR', reference: 'WARM-UP', visitDate: '2026-01-01', visitEndDate: null, limitations: '', state: 'approved', startedFromJobId: null, createdAt: '2026-01-01T00:00:00.000Z', version: 1 },
    site: { id: 1, client: 'Warm-up', address: 'Nowhere', description: '', contactName: '', contactEmail: '', earthing: 'TN-C-S', nominalVoltageV: 230, zeOhm: 0.2, pfcKa: 1.5, version: 1 },
    record,
    boards: [{
      board: { id: 1, jobId: 1, reference: 'W1', location: '', suppliedFrom: '', phases: 3, zdbOhm: 0.2, ipfKa: 1.5, polarityConfirmed: true, phaseSequenceConfirmed: true, instruments: '', state: 'open', lockedBy: null, lockedAt: null, version: 1 },
      circuits: Array.from({ length: 12 }, (_, i) => circuit(i + 1)),
      rings: [],
    }],
    assessment: { assessment: 'not yet known', reason: '' },
    nextInspection: null,
    signatures: [],
    company: defaultCompany,
    logo: null,
    acceptances: [],
  };
  await renderJobPdf(document, { revision: 1, issuedAt: new Date(0), issuedBy: 'warm-up' });
}
