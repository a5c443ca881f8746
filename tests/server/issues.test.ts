import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { PDFParse } from 'pdf-parse';
import type { Response } from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { jobIssueListResponseSchema } from '../../shared/schemas/issues.ts';
import { jobSignaturesResponseSchema } from '../../shared/schemas/signatures.ts';
import { addCompany, addEicrRecord, addSignatures } from '../helpers/issue-fixture.ts';
import { pngBytes } from '../helpers/images.ts';
import { createTestApp, type TestApp } from '../helpers/test-app.ts';

/** Collects a binary answer (the PDF) as a Buffer. */
function binary(res: Response, callback: (error: Error | null, body: Buffer) => void) {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (chunk: Buffer) => chunks.push(chunk));
  stream.on('end', () => callback(null, Buffer.concat(chunks)));
}
// Independent of the server's own hashing: Node's crypto over the bytes as served.
const sha256 = (bytes: Buffer) => crypto.createHash('sha256').update(bytes).digest('hex');

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
  await addCompany(t.db, t.dataDir, t.ids.admin);
  await addEicrRecord(t.db, t.ids.job, t.ids.tester);
});
afterEach(() => t.close());

const setState = (state: 'entering' | 'ready' | 'approved' | 'issued') => t.db.updateTable('jobs').set({ state }).where('id', '=', t.ids.job).execute();
const jobState = async () => (await t.db.selectFrom('jobs').select(['state', 'version']).where('id', '=', t.ids.job).executeTakeFirstOrThrow());

async function approvedAndSigned() {
  await addSignatures(t.db, t.dataDir, t.ids.job, t.ids.tester, t.ids.reviewer);
  await setState('approved');
}

async function download(agent: Awaited<ReturnType<TestApp['signIn']>>, revision: number): Promise<Response & { body: Buffer }> {
  return (await agent.get(`/api/jobs/${t.ids.job}/issues/${revision}/pdf`).buffer(true).parse(binary)) as Response & { body: Buffer };
}

describe('POST /api/jobs/:jobId/issue', () => {
  it('when a tester asks, then it is refused with 403 and nothing changes', async () => {
    await approvedAndSigned();
    const tester = await t.signIn('tester');
    const res = await tester.post(`/api/jobs/${t.ids.job}/issue`);
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/reviewer/);
    expect((await jobState()).state).toBe('approved');
    expect(await t.db.selectFrom('job_issues').selectAll().execute()).toHaveLength(0);
  });

  it.each(['entering', 'ready'] as const)('when the job is %s, then it is refused with 409 in words', async (state) => {
    await addSignatures(t.db, t.dataDir, t.ids.job, t.ids.tester, t.ids.reviewer);
    await setState(state);
    const reviewer = await t.signIn('reviewer');
    const res = await reviewer.post(`/api/jobs/${t.ids.job}/issue`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/only an approved job can be issued/);
    expect(await t.db.selectFrom('files').selectAll().where('kind', '=', 'issued-pdf').execute()).toHaveLength(0);
  });

  it('when the EICR is not signed, then it is refused with 409 naming who must sign', async () => {
    await setState('approved');
    const reviewer = await t.signIn('reviewer');
    const res = await reviewer.post(`/api/jobs/${t.ids.job}/issue`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toContain('the inspector has not signed');
    expect(res.body.error.message).toContain('the reviewer has not signed');
    expect(fs.existsSync(path.join(t.dataDir, 'issued'))).toBe(false);
  });

  it('when an approved, signed job is issued, then the PDF is stored with its SHA-256, revision 1, the job is issued and the history says so', async () => {
    await approvedAndSigned();
    const before = await jobState();
    const reviewer = await t.signIn('reviewer');
    const res = await reviewer.post(`/api/jobs/${t.ids.job}/issue`);
    expect(res.status).toBe(201);
    expect(res.body.issue).toMatchObject({ revision: 1, supersededAt: null, issuedBy: { name: 'Rhea Reviewer' } });
    expect(res.body.job.state).toBe('issued');
    expect((await jobState()).version).toBe(before.version + 1);

    const file = await t.db.selectFrom('files').selectAll().where('kind', '=', 'issued-pdf').executeTakeFirstOrThrow();
    const onDisk = fs.readFileSync(path.join(t.dataDir, file.path));
    expect(onDisk.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(sha256(onDisk)).toBe(file.sha256);
    expect(res.body.issue.sha256).toBe(file.sha256);
    expect(file.size_bytes).toBe(onDisk.length);

    const history = await t.db.selectFrom('job_history').selectAll().where('job_id', '=', t.ids.job).where('action', '=', 'issued').execute();
    expect(history).toHaveLength(1);
    expect(history[0]).toMatchObject({ old_text: '"approved"', new_text: '"issued"', user_id: t.ids.reviewer });

    const pdf = await download(reviewer, 1);
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    expect(sha256(pdf.body)).toBe(file.sha256);
  });

  it('when an issued job is issued again, then it is refused with 409 saying to reopen it', async () => {
    await approvedAndSigned();
    const reviewer = await t.signIn('reviewer');
    expect((await reviewer.post(`/api/jobs/${t.ids.job}/issue`)).status).toBe(201);
    const again = await reviewer.post(`/api/jobs/${t.ids.job}/issue`);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already issued.*Reopen/);
    expect(await t.db.selectFrom('job_issues').selectAll().execute()).toHaveLength(1);
  });

  it('when the same job is issued twice at once, then one revision is made and the other request gets 409', async () => {
    await approvedAndSigned();
    const reviewer = await t.signIn('reviewer');
    const answers = await Promise.all([reviewer.post(`/api/jobs/${t.ids.job}/issue`), reviewer.post(`/api/jobs/${t.ids.job}/issue`)]);
    expect(answers.map((a) => a.status).sort()).toEqual([201, 409]);
    expect(await t.db.selectFrom('job_issues').selectAll().execute()).toHaveLength(1);
    const files = await t.db.selectFrom('files').selectAll().where('kind', '=', 'issued-pdf').execute();
    expect(files).toHaveLength(1);
    // Only the issued file is left on disk, and it is the one recorded.
    const dir = path.join(t.dataDir, path.dirname(files[0]!.path));
    expect(fs.readdirSync(dir)).toEqual([path.basename(files[0]!.path)]);
  });

  it('when the job does not exist, then 404; when the id is not a number, then 400', async () => {
    const admin = await t.signIn('admin');
    expect((await admin.post('/api/jobs/9999/issue')).status).toBe(404);
    expect((await admin.post('/api/jobs/abc/issue')).status).toBe(400);
  });
});

describe('POST /api/jobs/:jobId/reopen and the next revision', () => {
  it('when a tester reopens, then 403; without a reason, then 400; when not issued, then 409', async () => {
    await approvedAndSigned();
    const reviewer = await t.signIn('reviewer');
    expect((await reviewer.post(`/api/jobs/${t.ids.job}/reopen`).send({ reason: 'Wrong Ze recorded' })).status).toBe(409);
    await reviewer.post(`/api/jobs/${t.ids.job}/issue`);
    const tester = await t.signIn('tester');
    expect((await tester.post(`/api/jobs/${t.ids.job}/reopen`).send({ reason: 'Wrong Ze recorded' })).status).toBe(403);
    const blank = await reviewer.post(`/api/jobs/${t.ids.job}/reopen`).send({ reason: '  ' });
    expect(blank.status).toBe(400);
    expect(blank.body.error.message).toMatch(/Say why/);
    expect((await jobState()).state).toBe('issued');
  });

  it('when reopened and issued again, then revision 2 is made, revision 1 is superseded and its PDF is unchanged and still served', async () => {
    await approvedAndSigned();
    const reviewer = await t.signIn('reviewer');
    const first = await reviewer.post(`/api/jobs/${t.ids.job}/issue`);
    const firstPdf = await download(reviewer, 1);

    const reopen = await reviewer.post(`/api/jobs/${t.ids.job}/reopen`).send({ reason: 'Client sent the right address for the installation' });
    expect(reopen.status).toBe(200);
    expect(reopen.body.job.state).toBe('entering');
    const history = await t.db.selectFrom('job_history').selectAll().where('job_id', '=', t.ids.job).where('action', '=', 'reopened').executeTakeFirstOrThrow();
    expect(history).toMatchObject({ reason: 'Client sent the right address for the installation', old_text: '"issued"', new_text: '"entering"', user_id: t.ids.reviewer });

    // The change, then the review helper's approval (set directly here).
    await t.db.updateTable('sites').set({ address: '3 Quince Row, Eastbridge EB2 7LA' }).where('id', '=', t.ids.site).execute();
    await setState('approved');
    const admin = await t.signIn('admin');
    // Signatures given for revision 1 do not count for revision 2 (see "signatures after a reopening").
    for (const [role, name] of [['inspector', 'Priya Okonkwo'], ['reviewer', 'Daniel Marsh']]) {
      expect((await admin.post(`/api/jobs/${t.ids.job}/signatures`).field('role', role!).field('name', name!).attach('image', pngBytes(), 'signature.png')).status).toBe(201);
    }
    const second = await admin.post(`/api/jobs/${t.ids.job}/issue`);
    expect(second.status).toBe(201);
    expect(second.body.issue.revision).toBe(2);
    expect(second.body.issue.sha256).not.toBe(first.body.issue.sha256);

    const list = jobIssueListResponseSchema.parse((await reviewer.get(`/api/jobs/${t.ids.job}/issues`)).body);
    expect(list.issues.map((i) => i.revision)).toEqual([2, 1]);
    expect(list.issues[0]!.supersededAt).toBeNull();
    expect(list.issues[1]!.supersededAt).toBe(list.issues[0]!.issuedAt);
    expect(list.issues[1]!.sha256).toBe(first.body.issue.sha256);

    const firstAgain = await download(reviewer, 1);
    expect(firstAgain.status).toBe(200);
    expect(firstAgain.body.equals(firstPdf.body)).toBe(true);
    expect(sha256(firstAgain.body)).toBe(first.body.issue.sha256);
    const secondPdf = await download(reviewer, 2);
    expect(sha256(secondPdf.body)).toBe(second.body.issue.sha256);
    // Both files are kept.
    expect(await t.db.selectFrom('files').selectAll().where('kind', '=', 'issued-pdf').execute()).toHaveLength(2);
  });
});

/** The text of a PDF as pdf-parse (a general-purpose PDF library from npm, not ours) reads it. */
async function pdfText(bytes: Buffer): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(bytes) });
  try {
    return (await parser.getText()).text;
  } finally {
    await parser.destroy();
  }
}

describe('signatures after a reopening', () => {
  it('when an issued job is reopened, then issuing is refused until both sign again, and revision 2 carries the new signatures while revision 1 stays as issued', async () => {
    await approvedAndSigned();
    const reviewer = await t.signIn('reviewer');
    const tester = await t.signIn('tester');
    const first = await reviewer.post(`/api/jobs/${t.ids.job}/issue`);
    expect(first.status).toBe(201);
    const firstPdf = await download(reviewer, 1);
    // Common practice: a signature vouches for the document as it stood when it was given.
    expect(await pdfText(firstPdf.body)).toContain('Signed as Priya Okonkwo');

    const reason = 'Client reported the wrong meter position';
    expect((await reviewer.post(`/api/jobs/${t.ids.job}/reopen`).send({ reason })).status).toBe(200);
    await setState('approved'); // the change and the review's approval, set directly here

    const refused = await reviewer.post(`/api/jobs/${t.ids.job}/issue`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.details.reasons).toEqual([
      'the inspector has not signed again since the job was reopened',
      'the reviewer has not signed again since the job was reopened',
    ]);
    expect(refused.body.error.message).toContain(reason);
    expect(refused.body.error.message).toContain('do not count for revision 2');

    // The earlier signatures are still listed, as revision 1's; none is in use.
    const listed = jobSignaturesResponseSchema.parse((await tester.get(`/api/jobs/${t.ids.job}/signatures`)).body);
    expect(listed.revision).toBe(2);
    expect(listed.reopened).toMatchObject({ reason, revision: 1, by: { name: 'Rhea Reviewer' } });
    expect(listed.signatures.map((s) => [s.name, s.revision, s.current])).toEqual([
      ['Daniel Marsh', 1, false],
      ['Priya Okonkwo', 1, false],
    ]);

    const signAs = (agent: typeof reviewer, role: string, name: string) =>
      agent.post(`/api/jobs/${t.ids.job}/signatures`).field('role', role).field('name', name).attach('image', pngBytes(), 'signature.png');
    expect((await signAs(tester, 'inspector', 'Ines Marlowe')).status).toBe(201);
    const stillOne = await reviewer.post(`/api/jobs/${t.ids.job}/issue`);
    expect(stillOne.status).toBe(409);
    expect(stillOne.body.error.details.reasons).toEqual(['the reviewer has not signed again since the job was reopened']);
    expect(await t.db.selectFrom('job_issues').selectAll().execute()).toHaveLength(1);

    expect((await signAs(reviewer, 'reviewer', 'Rafe Castellan')).status).toBe(201);
    const second = await reviewer.post(`/api/jobs/${t.ids.job}/issue`);
    expect(second.status).toBe(201);
    expect(second.body.issue.revision).toBe(2);

    const secondText = await pdfText((await download(reviewer, 2)).body);
    expect(secondText).toContain('Signed as Ines Marlowe');
    expect(secondText).toContain('Signed as Rafe Castellan');
    expect(secondText).not.toContain('Signed as Priya Okonkwo');
    expect(secondText).not.toContain('Signed as Daniel Marsh');

    // Revision 1 is byte for byte what was issued (SHA-256 by Node's crypto, not the server's).
    const firstAgain = await download(reviewer, 1);
    expect(sha256(firstAgain.body)).toBe(sha256(firstPdf.body));
    expect(sha256(firstAgain.body)).toBe(first.body.issue.sha256);
    expect(await pdfText(firstAgain.body)).toContain('Signed as Daniel Marsh');
  });

  it('when a job was never reopened, then signatures given before review still count (the demo EICR is signed by its inspector before review)', async () => {
    await approvedAndSigned();
    const listed = jobSignaturesResponseSchema.parse((await (await t.signIn('reviewer')).get(`/api/jobs/${t.ids.job}/signatures`)).body);
    expect(listed.reopened).toBeNull();
    expect(listed.signatures.every((s) => s.current && s.revision === 1)).toBe(true);
    expect((await (await t.signIn('reviewer')).post(`/api/jobs/${t.ids.job}/issue`)).status).toBe(201);
  });
});

describe('GET /api/jobs/:jobId/issues/:revision/pdf', () => {
  it('when the stored file was altered on disk, then it is not served (500, logged)', async () => {
    await approvedAndSigned();
    const reviewer = await t.signIn('reviewer');
    await reviewer.post(`/api/jobs/${t.ids.job}/issue`);
    const file = await t.db.selectFrom('files').selectAll().where('kind', '=', 'issued-pdf').executeTakeFirstOrThrow();
    fs.appendFileSync(path.join(t.dataDir, file.path), '% altered\n');
    const errors: unknown[] = [];
    const original = console.error;
    console.error = (...args: unknown[]) => errors.push(args);
    try {
      const res = await reviewer.get(`/api/jobs/${t.ids.job}/issues/1/pdf`);
      expect(res.status).toBe(500);
      expect(res.body.error.message).toMatch(/no longer matches the SHA-256/);
    } finally {
      console.error = original;
    }
    expect(errors).toHaveLength(1);
  });

  it('when the revision does not exist, then 404', async () => {
    const tester = await t.signIn('tester');
    const res = await tester.get(`/api/jobs/${t.ids.job}/issues/3/pdf`);
    expect(res.status).toBe(404);
    expect(res.body.error.message).toContain('Revision 3 of T-1');
  });
});
