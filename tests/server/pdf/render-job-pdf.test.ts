import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import * as fontkit from 'fontkit';
import { PDFParse } from 'pdf-parse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { columns, readingKeys } from '../../../shared/schemas/columns.ts';
import { openDatabase } from '../../../server/db/database.ts';
import { migrateToLatest } from '../../../server/db/migrate.ts';
import { seedDemo } from '../../../server/db/seed/seed-demo.ts';
import { fontPath, type FontName } from '../../../server/pdf/fonts.ts';
import { loadJobDocument, type JobDocument } from '../../../server/pdf/load-job-document.ts';
import { renderJobPdf } from '../../../server/pdf/render-job-pdf.ts';
import { addBoard, addCompany, addEicrRecord, addSignatures, readingsFor, writeReadings } from '../../helpers/issue-fixture.ts';
import { createTestApp, type TestApp } from '../../helpers/test-app.ts';

/** Collapses runs of white space, so a sentence wrapped over lines can be found whole. */
const flat = (text: string) => text.replace(/\s+/g, ' ');

describe('the PDF fonts', () => {
  // Source: the fonts' own character maps, read with fontkit (the font library pdfkit uses).
  it.each(['regular', 'medium', 'bold'] as FontName[])('when the %s face is opened, then it has Ω ≥ ✓ ✗ Δ ² µ', (name) => {
    const font = fontkit.openSync(fontPath(name));
    for (const sign of ['Ω', '≥', '✓', '✗', 'Δ', '²', 'µ', '’']) {
      expect(font.hasGlyphForCodePoint(sign.codePointAt(0)!), `${sign} in ${name}`).toBe(true);
    }
  });
});

describe('the issued PDF of an EICR', () => {
  let t: TestApp;
  let document: JobDocument;
  let pdf: Buffer;
  let pages: { text: string; num: number }[];
  let text: string;
  let ringId = 0;
  // Invented socket readings of that ring (r1 0.52, rn 0.52, r2 0.86 Ω): L-N near (r1+rn)/4 = 0.26 Ω
  // and L-cpc near (r1+r2)/4 = 0.345 Ω, except the last socket, high.
  const ringSockets = [
    { label: 'Kitchen worktop left', position: null, lineNeutral: '0.26', lineCpc: '0.33' },
    { label: 'Kitchen worktop right', position: null, lineNeutral: '0.26', lineCpc: '0.34' },
    { label: 'Dining room', position: null, lineNeutral: '0.27', lineCpc: '0.35' },
    { label: 'Utility', position: null, lineNeutral: '0.26', lineCpc: '0.49' },
  ];
  const stamp = { revision: 2, issuedAt: new Date('2026-12-02T09:30:00.000Z'), issuedBy: 'Rhea Reviewer' };

  beforeAll(async () => {
    t = await createTestApp();
    await addCompany(t.db, t.dataDir, t.ids.admin);
    await addEicrRecord(t.db, t.ids.job, t.ids.tester);
    await addSignatures(t.db, t.dataDir, t.ids.job, t.ids.tester, t.ids.reviewer);
    // Readings on the fixture's single-phase board, one of them a LIM with its reason.
    const circuits = await t.db.selectFrom('circuits').select(['id', 'kind']).where('board_id', '=', t.ids.board).orderBy('position').execute();
    for (const [index, circuit] of circuits.entries()) {
      const readings = readingsFor(index + 1, circuit.kind === 'ring' ? 'ring' : 'radial');
      if (index === 2) readings.zs = 'LIM';
      if (circuit.kind === 'ring') {
        // Invented end-to-end readings of a ring, and its socket readings (below).
        Object.assign(readings, { ringR1: '0.52', ringRn: '0.52', ringR2: '0.86', r1PlusR2: '0.35' });
        ringId = circuit.id;
      }
      await writeReadings(t.db, circuit.id, readings, t.ids.tester, index === 2 ? { zs: 'Loft hatch sealed; no access to the far point' } : {});
    }
    await t.db
      .insertInto('ring_sockets')
      .values({ circuit_id: ringId, data: JSON.stringify(ringSockets), version: 1, updated_by: t.ids.tester, updated_at: '2026-11-30T15:10:00.000Z' })
      .execute();
    await addBoard(t.db, t.ids.job, t.ids.reviewer, { reference: 'TP-DB2', ways: 18, phases: 3, locked: true });
    document = (await loadJobDocument(t.db, t.ids.job, t.dataDir))!;
    pdf = await renderJobPdf(document, stamp);
    const parser = new PDFParse({ data: new Uint8Array(pdf) });
    const result = await parser.getText();
    await parser.destroy();
    pages = result.pages;
    text = result.text;
  });
  afterAll(() => t.close());

  it('when parsed, then it is a PDF of several pages', () => {
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pages.length).toBeGreaterThan(4);
  });

  it('when rendered again from the same job and issue, then the bytes are the same', async () => {
    const again = await renderJobPdf(document, stamp);
    expect(again.equals(pdf)).toBe(true);
  });

  it('when each page is read, then it says "page n of N" and carries the document reference and revision', () => {
    for (const page of pages) {
      expect(page.text).toContain(`page ${page.num} of ${pages.length}`);
      expect(page.text).toContain('T-1 · revision 2');
    }
  });

  it('when the schedules are read, then every circuit is there with every reading, in column order, on its own row', () => {
    for (const { board, circuits } of document.boards) {
      expect(text).toContain(`Schedule of test results: board ${board.reference}`);
      for (const circuit of circuits) {
        const readings = readingKeys.map((key) => circuit.cells[key]?.text ?? '').filter(Boolean);
        expect(readings.length).toBeGreaterThan(5);
        const row = text.split('\n').find((line) => line.startsWith(`${circuit.number} `) && line.endsWith(readings.join(' ')));
        expect(row, `results row of circuit ${circuit.number} on ${board.reference}: ${readings.join(' ')}`).toBeDefined();
      }
    }
  });

  it('when a ring has socket readings, then its board prints them socket by socket with the diagnosis in words', () => {
    const ring = document.boards[0]!.circuits.find((c) => c.id === ringId)!;
    const all = flat(text);
    expect(all).toContain(`Ring ${ring.number} (${ring.description}): readings at each socket`);
    const lines = text.split('\n');
    ringSockets.forEach((s, i) => {
      const row = lines.find((line) => line.startsWith(`${i + 1} ${s.label}`));
      expect(row, `socket ${i + 1}`).toBeDefined();
      expect(row).toContain(`${s.lineNeutral} ${s.lineCpc}`);
    });
    // A cross-connected ring reads the two halves in parallel: at most (r1+r2)/4 = (0.52+0.86)/4
    // = 0.345 Ω anywhere on a sound ring (common practice). 0.49 Ω is well above it: the diagnosis
    // must point at socket 4 alone.
    expect(0.49).toBeGreaterThan((0.52 + 0.86) / 4 + 0.05);
    expect(lines.find((line) => line.startsWith('4 Utility'))).toMatch(/yes$/);
    expect(lines.find((line) => line.startsWith('3 Dining room'))).not.toMatch(/yes$/);
    expect(all).toContain('Diagnosis: a reading high at a point (a spur or a loose termination).');
    // The sockets come after the board's results and before the next board's schedule.
    const at = all.indexOf(`Ring ${ring.number} (`);
    expect(at).toBeGreaterThan(all.indexOf(`Schedule of test results: board ${document.boards[0]!.board.reference}`));
    expect(at).toBeLessThan(all.indexOf('Schedule of test results: board TP-DB2'));
  });

  it('when a three-phase board is read, then its circuits keep their per-phase numbers as stored', () => {
    // Common practice: three-phase boards number ways per phase (1L1, 1L2, 1L3, 2L1 …).
    for (const number of ['1L1', '1L2', '1L3', '6L3']) expect(text).toMatch(new RegExp(`^${number} L\\d`, 'm'));
  });

  it('when a reading is LIM, then its reason is printed with it', () => {
    expect(flat(text)).toContain('circuit 3, Zs: Loft hatch sealed; no access to the far point');
  });

  it('when the board details are read, then Zdb, Ipf and the instruments are there', () => {
    expect(text).toContain('0.25 Ω'); // the fixture board's Zdb
    expect(text).toContain('1.5 kA'); // its Ipf
    expect(flat(text)).toContain('Multifunction tester serial KP-20417');
  });

  it('when the record is read, then every section, the inspections, the observations with their codes and the summary are there', () => {
    const all = flat(text);
    for (const heading of [
      'Who asked for the report, and why',
      'The installation as found',
      'Supply characteristics and earthing arrangements',
      'Particulars at the origin',
      'Extent of the inspection and its limitations',
      'Schedule of inspections',
      'Observations',
      'Summary',
      'Declaration',
    ]) {
      expect(all).toContain(heading);
    }
    expect(all).toContain('1 C2 Socket-outlet on the balcony has no RCD protection.');
    expect(all).toContain('Cables under the fitted kitchen floor');
    // Items with their outcome signs, as the schedule of inspections records them.
    expect(all).toMatch(/5\.8 Socket-outlets and outdoor equipment have additional protection by RCD C2/);
    expect(all).toMatch(/4\.8 Surge protection \(SPD\): present where required, status indicator healthy not verified/);
    expect(all).toMatch(/1\.1 Service cable, cut-out and meter tails: condition seen from outside ✓/);
    // BS 7671 Appendix 6 (condition report notes): any C1, C2 or FI makes the installation unsatisfactory.
    expect(all).toContain('Overall assessment unsatisfactory');
    // Next inspection: visit 2026-12-01 + 60 months (rented dwelling, IET Guidance Note 3 [memory]).
    expect(all).toContain('Next inspection recommended by 1 December 2031');
  });

  it('when the declaration is read, then the people, their positions and signing times are there', () => {
    const all = flat(text);
    expect(all).toContain('Priya Okonkwo');
    expect(all).toContain('Qualified supervisor');
    expect(all).toContain('Signed as Daniel Marsh on 1 December 2026, 10:15 UTC');
    expect(all).not.toContain('not signed');
  });

  it('when it is read, then the safety caution is there', () => {
    const all = flat(text);
    expect(all).toContain('competent people');
    expect(all).toContain('safe isolation');
    expect(all).toContain('The current edition of BS 7671 and local regulations take precedence');
  });

  it('when it is read, then the company details are on the cover', () => {
    expect(pages[0]!.text).toContain('Halden & Brook Electrical Ltd');
    expect(pages[0]!.text).toContain('Electrical Installation Condition Report');
  });

  it('when every schedule column is counted, then each one is printed under a heading', () => {
    // Every column of the registry appears in one of the two tables (details or results).
    expect(columns.filter((c) => c.storage === 'reading').length).toBe(readingKeys.length);
    for (const heading of ['r1', 'rn', 'r2', 'R1+R2', 'Zs', 'IΔn', 'L-E', 'Polarity']) expect(text).toContain(heading);
  });
});

describe('the issued PDF of the demo EICR', () => {
  it('when rendered, then every circuit of every board is there with all its readings in column order, and every page is numbered', async () => {
    const { db, sqlite } = openDatabase(':memory:');
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'boardwalk-pdf-demo-'));
    try {
      await migrateToLatest(db);
      await seedDemo(db, { dataDir });
      const eicr = await db.selectFrom('jobs').select('id').where('kind', '=', 'EICR').executeTakeFirstOrThrow();
      const document = (await loadJobDocument(db, eicr.id, dataDir))!;
      // The seeded inspector's signature (drawn in code) is read back from the data folder.
      expect(document.signatures.map((s) => [s.role, s.image?.mime])).toEqual([['inspector', 'image/png']]);
      const pdf = await renderJobPdf(document, { revision: 1, issuedAt: new Date('2026-12-02T10:00:00.000Z'), issuedBy: 'Demo Reviewer' });
      const parser = new PDFParse({ data: new Uint8Array(pdf) });
      const { pages, text } = await parser.getText();
      await parser.destroy();
      const lines = text.split('\n');
      let circuitsSeen = 0;
      for (const { board, circuits } of document.boards) {
        for (const circuit of circuits) {
          const readings = readingKeys.map((key) => circuit.cells[key]?.text ?? '').filter(Boolean);
          const row = lines.find((line) => line.startsWith(`${circuit.number} `) && line.includes(` ${readings.join(' ')}`));
          expect(row, `board ${board.reference} circuit ${circuit.number}: ${readings.join(' ')}`).toBeDefined();
          circuitsSeen++;
        }
      }
      expect(circuitsSeen).toBeGreaterThanOrEqual(64);
      for (const page of pages) expect(page.text).toContain(`page ${page.num} of ${pages.length}`);
      const all = flat(text);
      for (const observation of Object.values(document.record.observations.data)) {
        if (observation) expect(all).toContain(`${observation.number} ${observation.code}`);
      }
      expect(all).toContain('safe isolation');
    } finally {
      sqlite.close();
      fs.rmSync(dataDir, { recursive: true, force: true });
    }
  });
});
