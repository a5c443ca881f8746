import Papa from 'papaparse';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { columns } from '../../shared/schemas/columns.ts';
import { jobExportSchema } from '../../shared/schemas/issues.ts';
import { addBoard, addEicrRecord, readingsFor, writeReadings } from '../helpers/issue-fixture.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

/** The answer's raw bytes as text, keeping a byte-order mark if there is one. */
function raw(res: { text?: string; body: unknown }): string {
  return res.text ?? '';
}

describe('GET /api/boards/:boardId/export.csv', () => {
  it('when a three-phase board is exported, then the file starts with a UTF-8 byte-order mark and papaparse reads back every circuit with every reading', async () => {
    const boardId = await addBoard(t.db, t.ids.job, t.ids.tester, { reference: 'TP-DB2', ways: 15, phases: 3 });
    const tester = await t.signIn('tester');
    const res = await tester.get(`/api/boards/${boardId}/export.csv`).buffer(true).parse((response, callback) => {
      const chunks: Buffer[] = [];
      response.on('data', (chunk: Buffer) => chunks.push(chunk));
      response.on('end', () => callback(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toContain('T-1-TP-DB2.csv');
    const bytes = res.body as Buffer;
    // The UTF-8 encoding of U+FEFF is EF BB BF (Unicode Standard, chapter 23.8).
    expect([...bytes.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);

    const text = bytes.toString('utf8').slice(1);
    const parsed = Papa.parse<string[]>(text, { skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const headerIndex = parsed.data.findIndex((row) => row[0] === 'Circuit');
    expect(parsed.data.slice(0, headerIndex).map((row) => row[0])).toEqual(expect.arrayContaining(['Client', 'Job', 'Board', 'Zdb (Ω)', 'Ipf (kA)']));
    const header = parsed.data[headerIndex]!;
    expect(header).toEqual(expect.arrayContaining(['Zs (Ω)', 'Live (mm²)', 'IΔn (mA)', 'L-E (MΩ)', 'R1+R2 (Ω)']));
    expect(header).toHaveLength(columns.length + 3);
    const rows = parsed.data.slice(headerIndex + 1);
    expect(rows.map((row) => row[0])).toEqual(['1L1', '1L2', '1L3', '2L1', '2L2', '2L3', '3L1', '3L2', '3L3', '4L1', '4L2', '4L3', '5L1', '5L2', '5L3']);
    const zs = header.indexOf('Zs (Ω)');
    const polarity = header.indexOf('Polarity');
    const live = header.indexOf('Live (mm²)');
    rows.forEach((row, index) => {
      const expected = readingsFor(index + 1, index % 4 === 0 ? 'ring' : 'radial');
      expect(row[zs]).toBe(expected.zs);
      for (const column of columns.filter((c) => c.storage === 'reading')) {
        const at = header.indexOf(column.unit ? `${column.label} (${column.unit})` : column.label);
        expect(row[at], `${row[0]} ${column.label}`).toBe(expected[column.key as keyof typeof expected] ?? '');
      }
      expect(row[polarity]).toBe('✓');
      expect(row[live]).toBe(index % 4 === 0 ? '2.5' : '1.5');
      expect(row[1]).toBe(['L1', 'L2', 'L3'][index % 3]);
    });
  });

  it('when a cell begins like a spreadsheet formula, then it is escaped so opening the file cannot run it', async () => {
    // OWASP, "CSV Injection": prefix cells starting with = + - @ so they are read as text.
    await t.db.updateTable('circuits').set({ description: '=HYPERLINK("http://example.invalid")' }).where('board_id', '=', t.ids.board).where('number', '=', '1').execute();
    const circuit = await t.db.selectFrom('circuits').select('id').where('board_id', '=', t.ids.board).where('number', '=', '2').executeTakeFirstOrThrow();
    await writeReadings(t.db, circuit.id, { zs: 'LIM' }, t.ids.tester, { zs: 'Cooker isolator seized' });
    const tester = await t.signIn('tester');
    const res = await tester.get(`/api/boards/${t.ids.board}/export.csv`);
    const parsed = Papa.parse<string[]>(raw(res).replace(/^\uFEFF/, ''), { skipEmptyLines: true });
    const headerIndex = parsed.data.findIndex((row) => row[0] === 'Circuit');
    const header = parsed.data[headerIndex]!;
    const rows = parsed.data.slice(headerIndex + 1);
    expect(rows[0]![header.indexOf('Description')]).toBe('\'=HYPERLINK("http://example.invalid")');
    expect(rows[1]![header.indexOf('LIM reasons')]).toBe('Zs: Cooker isolator seized');
  });

  it('when the board does not exist, then 404; when signed out, then 401', async () => {
    const tester = await t.signIn('tester');
    expect((await tester.get('/api/boards/999/export.csv')).status).toBe(404);
    const { default: request } = await import('supertest');
    expect((await request(t.app).get(`/api/boards/${t.ids.board}/export.csv`)).status).toBe(401);
  });
});

describe('GET /api/jobs/:jobId/export.json', () => {
  it('when a job is exported, then the file has the schemas’ shape: job, site, every record section, and boards with their circuits and cells', async () => {
    await addEicrRecord(t.db, t.ids.job, t.ids.tester);
    await addBoard(t.db, t.ids.job, t.ids.tester, { reference: 'DB2', ways: 4, phases: 1 });
    const reviewer = await t.signIn('reviewer');
    const res = await reviewer.get(`/api/jobs/${t.ids.job}/export.json`);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toContain('T-1.json');
    const exported = jobExportSchema.parse(JSON.parse(raw(res)));
    expect(exported.job).toMatchObject({ id: t.ids.job, reference: 'T-1', kind: 'EICR' });
    expect(exported.site.client).toBe('Test client');
    expect(exported.boards.map((b) => b.board.reference)).toEqual(['DB1', 'DB2']);
    expect(exported.boards[1]!.circuits).toHaveLength(4);
    expect(exported.boards[1]!.circuits[0]!.cells.zs?.text).toBe(readingsFor(1, 'ring').zs);
    expect(exported.record.supply.data).toMatchObject({ earthing: 'TN-C-S', zeOhm: 0.21 });
    expect(exported.record.work.version).toBe(0); // never written: blank
    expect(Object.keys(exported.record.observations.data as object)).toHaveLength(3);
  });

  it('when the job does not exist, then 404', async () => {
    const tester = await t.signIn('tester');
    expect((await tester.get('/api/jobs/4242/export.json')).status).toBe(404);
  });
});
