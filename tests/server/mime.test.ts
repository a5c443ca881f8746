import crypto from 'node:crypto';
import MailComposer from 'nodemailer/lib/mail-composer';
import { describe, expect, it } from 'vitest';
import { decodeEncodedWords, parseMessage } from '../../server/mail/mime.ts';

/** Builds a raw message with nodemailer's own composer: the oracle for what a real sender writes. */
function compose(options: ConstructorParameters<typeof MailComposer>[0]): Promise<Buffer> {
  return new Promise((resolve, reject) => new MailComposer(options).compile().build((error, message) => (error ? reject(error) : resolve(message))));
}

const sha256 = (bytes: Buffer) => crypto.createHash('sha256').update(bytes).digest('hex');

describe("the mailbox's MIME reading, against nodemailer's MailComposer", () => {
  it('when a message has non-ASCII headers, a text and HTML body and binary attachments, then every header and attachment comes back intact', async () => {
    const binary = crypto.randomBytes(70_000);
    const csv = Buffer.from('circuit,Zs Ω\n1,0.44\n2,≥ 1.2\n', 'utf8');
    const raw = await compose({
      from: { name: 'Åsheim & Söhne Elektrik', address: 'office@asheim.example' },
      to: 'Zoë Brennan <zoe@client.example>',
      subject: 'Condition report BW-2026-0042, revision 2: Flat 3 — Ω ≥ ✓',
      text: 'Hello Zoë,\nthe report is attached. Zs ≤ 1.37 Ω.\n',
      html: '<p>Hello Zoë</p>',
      attachments: [
        { filename: 'Prüfbericht Ω revision-2.pdf', content: binary, contentType: 'application/pdf' },
        { filename: 'readings.csv', content: csv, contentType: 'text/csv' },
      ],
    });
    const parsed = parseMessage(raw);
    expect(parsed.from).toBe('Åsheim & Söhne Elektrik <office@asheim.example>');
    expect(parsed.to).toBe('Zoë Brennan <zoe@client.example>');
    expect(parsed.subject).toBe('Condition report BW-2026-0042, revision 2: Flat 3 — Ω ≥ ✓');
    expect(parsed.text).toBe('Hello Zoë,\nthe report is attached. Zs ≤ 1.37 Ω.\n');
    expect(parsed.attachments.map((a) => [a.filename, a.contentType, a.content.length, sha256(a.content)])).toEqual([
      ['Prüfbericht Ω revision-2.pdf', 'application/pdf', binary.length, sha256(binary)],
      ['readings.csv', 'text/csv', csv.length, sha256(csv)],
    ]);
  });

  it('when encoded words use B and Q forms (RFC 2047 examples), then they decode', () => {
    // RFC 2047 section 8 examples.
    expect(decodeEncodedWords('=?ISO-8859-1?Q?Keld_J=F8rn_Simonsen?= <keld@dkuug.dk>')).toBe('Keld Jørn Simonsen <keld@dkuug.dk>');
    expect(decodeEncodedWords('=?ISO-8859-1?B?SWYgeW91IGNhbiByZWFkIHRoaXMgeW8=?= =?ISO-8859-2?B?dSB1bmRlcnN0YW5kIHRoZSBleGFtcGxlLg==?=')).toBe(
      'If you can read this you understand the example.',
    );
    expect(decodeEncodedWords('(=?ISO-8859-1?Q?a?= =?ISO-8859-1?Q?b?=)')).toBe('(ab)');
  });
});
