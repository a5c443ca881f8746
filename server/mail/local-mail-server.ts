import crypto from 'node:crypto';
import fs from 'node:fs';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';
import { sha256Hex } from '../files.ts';
import { parseMessage } from './mime.ts';

/** What the mailbox keeps beside each received message (`<id>.json` next to `<id>.eml`). */
export interface MailboxEntry {
  id: string;
  receivedAt: string;
  /** The SMTP envelope: who the sending server said it was from and to. */
  envelopeFrom: string;
  envelopeTo: string[];
  /** The message's own headers, decoded. */
  from: string;
  to: string;
  subject: string;
  sizeBytes: number;
  attachments: { index: number; filename: string; contentType: string; sizeBytes: number; sha256: string }[];
}

export interface LocalMailServer {
  port: number;
  /** `smtp://127.0.0.1:<port>`, for nodemailer. */
  url: string;
  close(): Promise<void>;
}

const maxMessageBytes = 30 * 1024 * 1024;

/**
 * The project's own SMTP server for development, the demo and tests: it accepts every message
 * (no sign-in, no TLS, only on 127.0.0.1) and keeps it under `dir` as the raw `<id>.eml` and a
 * small `<id>.json` index entry, so the admin mailbox page can list what "the client" received.
 * It delivers nothing onwards. `port` 0 takes any free port.
 */
export async function startLocalMailServer(options: { dir: string; port?: number; host?: string }): Promise<LocalMailServer> {
  const dir = path.resolve(options.dir);
  fs.mkdirSync(dir, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    size: maxMessageBytes,
    banner: 'Boardwalk local mailbox (keeps messages, delivers nothing)',
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('error', callback);
      stream.on('end', () => {
        if (stream.sizeExceeded) {
          callback(Object.assign(new Error('Message too large for the local mailbox'), { responseCode: 552 }));
          return;
        }
        try {
          const raw = Buffer.concat(chunks);
          const entry = storeMessage(dir, raw, {
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to: session.envelope.rcptTo.map((r) => r.address),
          });
          callback(null, `Kept as ${entry.id}`);
        } catch (error) {
          callback(error instanceof Error ? error : new Error(String(error)));
        }
      });
    },
  });
  const host = options.host ?? '127.0.0.1';
  await new Promise<void>((resolve, reject) => {
    const onError = (error: Error) => reject(error);
    server.once('error', onError);
    server.listen(options.port ?? 0, host, () => {
      server.off('error', onError);
      resolve();
    });
  });
  // A client that drops its connection is no reason to stop the server.
  server.on('error', (error) => console.error('Local mail server:', error.message));
  const port = (server.server.address() as AddressInfo).port;
  return {
    port,
    url: `smtp://${host}:${port}`,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

function storeMessage(dir: string, raw: Buffer, envelope: { from: string; to: string[] }): MailboxEntry {
  const receivedAt = new Date().toISOString();
  const id = `${receivedAt.replace(/[-:.]/g, '').replace('T', '-').slice(0, 18)}-${crypto.randomBytes(4).toString('hex')}`;
  const parsed = parseMessage(raw);
  const entry: MailboxEntry = {
    id,
    receivedAt,
    envelopeFrom: envelope.from,
    envelopeTo: envelope.to,
    from: parsed.from,
    to: parsed.to,
    subject: parsed.subject,
    sizeBytes: raw.length,
    attachments: parsed.attachments.map((a, index) => ({
      index,
      filename: a.filename,
      contentType: a.contentType,
      sizeBytes: a.content.length,
      sha256: sha256Hex(a.content),
    })),
  };
  fs.writeFileSync(path.join(dir, `${id}.eml`), raw);
  // The index entry last: a message is listed only once its bytes are complete.
  fs.writeFileSync(path.join(dir, `${id}.json`), `${JSON.stringify(entry, null, 2)}\n`);
  return entry;
}

const idPattern = /^[0-9]{8}-[0-9]{9,10}-[0-9a-f]{8}$/;

/** Every message the local server kept, newest first. */
export function listMailbox(dir: string): MailboxEntry[] {
  if (!fs.existsSync(dir)) return [];
  const entries: MailboxEntry[] = [];
  for (const name of fs.readdirSync(dir)) {
    if (!name.endsWith('.json')) continue;
    try {
      entries.push(JSON.parse(fs.readFileSync(path.join(dir, name), 'utf8')) as MailboxEntry);
    } catch {
      // A half-written or foreign file is not a message.
    }
  }
  return entries.sort((a, b) => (a.receivedAt < b.receivedAt ? 1 : a.receivedAt > b.receivedAt ? -1 : b.id.localeCompare(a.id)));
}

/** One attachment of a kept message, decoded from its `.eml`; undefined when there is none. */
export function mailboxAttachment(dir: string, id: string, index: number): { filename: string; contentType: string; content: Buffer } | undefined {
  if (!idPattern.test(id)) return undefined;
  const file = path.join(dir, `${id}.eml`);
  if (!fs.existsSync(file)) return undefined;
  return parseMessage(fs.readFileSync(file)).attachments[index];
}

/** The raw `.eml` of a kept message. */
export function mailboxRaw(dir: string, id: string): Buffer | undefined {
  if (!idPattern.test(id)) return undefined;
  const file = path.join(dir, `${id}.eml`);
  return fs.existsSync(file) ? fs.readFileSync(file) : undefined;
}
