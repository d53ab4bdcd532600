// A small reader for the .eml files the local SMTP sink writes (RFC 5322 messages as nodemailer
// builds them): the headers, the plain-text body and the attachments of a multipart message.
// Enough for the dev mailbox; not a general MIME parser.

export interface EmlPart {
  headers: Record<string, string>;
  contentType: string;
  filename: string | null;
  content: Buffer;
}

export interface ParsedEml {
  headers: Record<string, string>;
  subject: string;
  from: string;
  to: string;
  date: string | null;
  text: string;
  attachments: EmlPart[];
}

function splitHead(raw: Buffer): { head: string; body: Buffer } {
  const at = raw.indexOf('\r\n\r\n');
  if (at >= 0) return { head: raw.subarray(0, at).toString('latin1'), body: raw.subarray(at + 4) };
  const lf = raw.indexOf('\n\n');
  if (lf >= 0) return { head: raw.subarray(0, lf).toString('latin1'), body: raw.subarray(lf + 2) };
  return { head: raw.toString('latin1'), body: Buffer.alloc(0) };
}

function parseHeaders(head: string): Record<string, string> {
  const headers: Record<string, string> = {};
  const lines = head.split(/\r?\n/);
  let current: string | null = null;
  for (const line of lines) {
    if (/^[ \t]/.test(line) && current) {
      headers[current] += ` ${line.trim()}`;
      continue;
    }
    const colon = line.indexOf(':');
    if (colon <= 0) continue;
    current = line.slice(0, colon).trim().toLowerCase();
    const value = line.slice(colon + 1).trim();
    headers[current] = headers[current] ? `${headers[current]}, ${value}` : value;
  }
  return headers;
}

/** RFC 2047 encoded words (=?UTF-8?Q?…?= and =?UTF-8?B?…?=) in a header value. */
export function decodeWords(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g, (_, charset: string, enc: string, text: string) => {
      const bytes =
        enc.toUpperCase() === 'B'
          ? Buffer.from(text, 'base64')
          : Buffer.from(
              text.replace(/_/g, ' ').replace(/=([0-9A-Fa-f]{2})/g, (_m, h: string) => String.fromCharCode(parseInt(h, 16))),
              'latin1',
            );
      return /utf-?8/i.test(charset) ? bytes.toString('utf8') : bytes.toString('latin1');
    });
}

function param(value: string, name: string): string | null {
  const m = new RegExp(`${name}\\*?=(?:"([^"]*)"|([^;\\s]+))`, 'i').exec(value);
  if (!m) return null;
  const v = m[1] ?? m[2];
  // RFC 2231: filename*=utf-8''name%20with%20spaces
  const ext = /^([^']*)'[^']*'(.*)$/.exec(v);
  return ext ? decodeURIComponent(ext[2]) : decodeWords(v);
}

function decodeBody(body: Buffer, encoding: string | undefined): Buffer {
  const e = (encoding ?? '7bit').toLowerCase();
  if (e === 'base64') return Buffer.from(body.toString('latin1').replace(/\s+/g, ''), 'base64');
  if (e === 'quoted-printable') {
    const text = body
      .toString('latin1')
      .replace(/=\r?\n/g, '')
      .replace(/=([0-9A-Fa-f]{2})/g, (_m, h: string) => String.fromCharCode(parseInt(h, 16)));
    return Buffer.from(text, 'latin1');
  }
  return body;
}

function parts(headers: Record<string, string>, body: Buffer): EmlPart[] {
  const type = headers['content-type'] ?? 'text/plain';
  const boundary = /^multipart\//i.test(type) ? param(type, 'boundary') : null;
  if (!boundary) {
    const disposition = headers['content-disposition'] ?? '';
    return [
      {
        headers,
        contentType: type.split(';')[0].trim().toLowerCase(),
        filename: param(disposition, 'filename') ?? param(type, 'name'),
        content: decodeBody(body, headers['content-transfer-encoding']),
      },
    ];
  }
  const text = body.toString('latin1');
  const marker = `--${boundary}`;
  const out: EmlPart[] = [];
  const pieces = text.split(marker).slice(1);
  for (const piece of pieces) {
    if (piece.startsWith('--')) break;
    const chunk = Buffer.from(piece.replace(/^\r?\n/, '').replace(/\r?\n$/, ''), 'latin1');
    const { head, body: partBody } = splitHead(chunk);
    out.push(...parts(parseHeaders(head), partBody));
  }
  return out;
}

export function parseEml(raw: Buffer): ParsedEml {
  const { head, body } = splitHead(raw);
  const headers = parseHeaders(head);
  const all = parts(headers, body);
  const textPart = all.find((p) => p.contentType === 'text/plain' && !p.filename);
  return {
    headers,
    subject: decodeWords(headers.subject ?? ''),
    from: decodeWords(headers.from ?? ''),
    to: decodeWords(headers.to ?? ''),
    date: headers.date ?? null,
    text: textPart ? textPart.content.toString('utf8') : '',
    attachments: all.filter((p) => p.filename),
  };
}
