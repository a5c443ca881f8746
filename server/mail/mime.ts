/**
 * Just enough MIME reading (RFC 2045–2047) to list what the local mail server received: the
 * headers of a message and its attachments' names, types and bytes. It reads what nodemailer (and
 * ordinary mail programs) write — multipart trees, base64 and quoted-printable bodies, encoded-word
 * headers — and is not a general mail parser: anything it cannot decode is kept as raw bytes.
 */

export interface MimePart {
  headers: Map<string, string>;
  /** Decoded body bytes (transfer encoding undone) for a leaf part. */
  body: Buffer;
  children: MimePart[];
}

export interface ParsedAttachment {
  filename: string;
  contentType: string;
  content: Buffer;
}

export interface ParsedMessage {
  from: string;
  to: string;
  subject: string;
  date: string | null;
  messageId: string | null;
  text: string;
  attachments: ParsedAttachment[];
}

/** Splits raw bytes into the header block and the body at the first empty line. */
function splitHead(raw: Buffer): { head: string; body: Buffer } {
  const crlf = raw.indexOf('\r\n\r\n');
  const lf = raw.indexOf('\n\n');
  let cut: number;
  let skip: number;
  if (crlf !== -1 && (lf === -1 || crlf <= lf)) [cut, skip] = [crlf, 4];
  else if (lf !== -1) [cut, skip] = [lf, 2];
  else [cut, skip] = [raw.length, 0];
  return { head: raw.subarray(0, cut).toString('latin1'), body: raw.subarray(Math.min(raw.length, cut + skip)) };
}

/** Header names lower-cased; folded lines joined; the first of a repeated header kept. */
export function parseHeaders(head: string): Map<string, string> {
  const headers = new Map<string, string>();
  const unfolded = head.replace(/\r?\n[ \t]+/g, ' ');
  for (const line of unfolded.split(/\r?\n/)) {
    const colon = line.indexOf(':');
    if (colon <= 0) continue;
    const name = line.slice(0, colon).trim().toLowerCase();
    if (!headers.has(name)) headers.set(name, line.slice(colon + 1).trim());
  }
  return headers;
}

/** `type/subtype; a=b; c="d"` → the value and its parameters (RFC 2231 `name*=` forms included). */
export function parseHeaderValue(value: string): { value: string; params: Record<string, string> } {
  const parts = value.split(/;(?=(?:[^"]*"[^"]*")*[^"]*$)/);
  const params: Record<string, string> = {};
  const continued: Record<string, string[]> = {};
  for (const part of parts.slice(1)) {
    const eq = part.indexOf('=');
    if (eq === -1) continue;
    const key = part.slice(0, eq).trim().toLowerCase();
    let raw = part.slice(eq + 1).trim();
    if (raw.startsWith('"') && raw.endsWith('"')) raw = raw.slice(1, -1).replace(/\\(.)/g, '$1');
    const split = /^(.+?)\*(\d+)?\*?$/.exec(key);
    if (split && (key.endsWith('*') || split[2] !== undefined)) {
      (continued[split[1]!] ??= [])[Number(split[2] ?? 0)] = raw;
    } else {
      params[key] = raw;
    }
  }
  for (const [key, pieces] of Object.entries(continued)) {
    const joined = pieces.join('');
    const extended = /^([^']*)'[^']*'(.*)$/.exec(joined);
    params[key] = extended ? decodePercent(extended[2]!, extended[1] || 'utf-8') : joined;
  }
  return { value: (parts[0] ?? '').trim().toLowerCase(), params };
}

function decodePercent(text: string, charset: string): string {
  const bytes = Buffer.from(text.replace(/%([0-9a-f]{2})/gi, (_m, hex: string) => String.fromCharCode(parseInt(hex, 16))), 'latin1');
  return decodeCharset(bytes, charset);
}

function decodeCharset(bytes: Buffer, charset: string): string {
  try {
    return new TextDecoder(charset.toLowerCase()).decode(bytes);
  } catch {
    return bytes.toString('latin1');
  }
}

/** RFC 2047 encoded words (`=?utf-8?B?…?=`, `=?utf-8?Q?…?=`) in a header value. */
export function decodeEncodedWords(value: string): string {
  return value
    .replace(/(=\?[^?]+\?[bqBQ]\?[^?]*\?=)\s+(?==\?)/g, '$1')
    .replace(/=\?([^?*]+)(?:\*[^?]*)?\?([bqBQ])\?([^?]*)\?=/g, (_m, charset: string, encoding: string, text: string) => {
      const bytes =
        encoding.toUpperCase() === 'B'
          ? Buffer.from(text, 'base64')
          : Buffer.from(
              text.replace(/_/g, ' ').replace(/=([0-9a-f]{2})/gi, (_q, hex: string) => String.fromCharCode(parseInt(hex, 16))),
              'latin1',
            );
      return decodeCharset(bytes, charset);
    });
}

function decodeQuotedPrintable(body: Buffer): Buffer {
  const text = body.toString('latin1').replace(/=\r?\n/g, '');
  return Buffer.from(text.replace(/=([0-9a-f]{2})/gi, (_m, hex: string) => String.fromCharCode(parseInt(hex, 16))), 'latin1');
}

function decodeBody(body: Buffer, encoding: string | undefined): Buffer {
  switch ((encoding ?? '').trim().toLowerCase()) {
    case 'base64':
      return Buffer.from(body.toString('latin1').replace(/[^A-Za-z0-9+/=]/g, ''), 'base64');
    case 'quoted-printable':
      return decodeQuotedPrintable(body);
    default:
      return body;
  }
}

/** Parses one MIME entity (a whole message or a part of one). */
export function parseMime(raw: Buffer, depth = 0): MimePart {
  const { head, body } = splitHead(raw);
  const headers = parseHeaders(head);
  const type = parseHeaderValue(headers.get('content-type') ?? 'text/plain');
  const boundary = type.params.boundary;
  if (type.value.startsWith('multipart/') && boundary && depth < 10) {
    return { headers, body: Buffer.alloc(0), children: splitMultipart(body, boundary).map((part) => parseMime(part, depth + 1)) };
  }
  return { headers, body: decodeBody(body, headers.get('content-transfer-encoding')), children: [] };
}

function splitMultipart(body: Buffer, boundary: string): Buffer[] {
  const delimiter = `--${boundary}`;
  const parts: Buffer[] = [];
  let start = -1;
  let index = body.indexOf(delimiter);
  while (index !== -1) {
    const lineStart = index === 0 || body[index - 1] === 0x0a;
    if (lineStart) {
      if (start !== -1) {
        // The line break before the delimiter belongs to the delimiter.
        let end = index;
        if (body[end - 1] === 0x0a) end -= 1;
        if (body[end - 1] === 0x0d) end -= 1;
        parts.push(body.subarray(start, end));
      }
      const after = index + delimiter.length;
      if (body.subarray(after, after + 2).toString('latin1') === '--') return parts;
      const nextLine = body.indexOf(0x0a, after);
      if (nextLine === -1) return parts;
      start = nextLine + 1;
    }
    index = body.indexOf(delimiter, index + delimiter.length);
  }
  return parts;
}

function leaves(part: MimePart): MimePart[] {
  return part.children.length === 0 ? [part] : part.children.flatMap(leaves);
}

/** The headers, the first plain-text body and the attachments of a raw message. */
export function parseMessage(raw: Buffer): ParsedMessage {
  const root = parseMime(raw);
  const header = (name: string) => decodeEncodedWords(root.headers.get(name) ?? '');
  const attachments: ParsedAttachment[] = [];
  let text = '';
  for (const leaf of leaves(root)) {
    const type = parseHeaderValue(leaf.headers.get('content-type') ?? 'text/plain');
    const disposition = parseHeaderValue(leaf.headers.get('content-disposition') ?? '');
    const filename = disposition.params.filename ?? type.params.name;
    if (disposition.value === 'attachment' || (filename && !type.value.startsWith('text/'))) {
      attachments.push({ filename: decodeEncodedWords(filename ?? 'attachment'), contentType: type.value, content: leaf.body });
    } else if (type.value === 'text/plain' && !text) {
      text = decodeCharset(leaf.body, type.params.charset ?? 'utf-8');
    }
  }
  return {
    from: header('from'),
    to: header('to'),
    subject: header('subject'),
    date: root.headers.get('date') ?? null,
    messageId: root.headers.get('message-id') ?? null,
    text,
    attachments,
  };
}
