/**
 * A small reader for RFC 5322 / MIME messages, enough for what nodemailer writes and the
 * Outbox shows: headers (unfolded, RFC 2047 words decoded), text and HTML bodies, and
 * attachments (base64, quoted-printable, 7bit/8bit/binary; RFC 2231 file names).
 */

export interface ParsedAttachment {
  filename: string;
  contentType: string;
  content: Buffer;
}

export interface ParsedMessage {
  headers: Map<string, string[]>;
  subject: string;
  from: string;
  to: string;
  date: Date | null;
  messageId: string | null;
  text: string;
  html: string | null;
  attachments: ParsedAttachment[];
}

interface Part {
  headers: Map<string, string[]>;
  body: Buffer;
}

function decodeCharset(bytes: Buffer, charset: string | undefined): string {
  const label = (charset || 'utf-8').toLowerCase();
  try {
    return new TextDecoder(label).decode(bytes);
  } catch {
    return bytes.toString('utf8');
  }
}

function decodeQuotedPrintable(input: Buffer): Buffer {
  const s = input.toString('latin1').replace(/=\r?\n/g, '');
  const out: number[] = [];
  for (let i = 0; i < s.length; i++) {
    const c = s[i];
    if (c === '=' && /^[0-9A-Fa-f]{2}$/.test(s.slice(i + 1, i + 3))) {
      out.push(parseInt(s.slice(i + 1, i + 3), 16));
      i += 2;
    } else {
      out.push(s.charCodeAt(i) & 0xff);
    }
  }
  return Buffer.from(out);
}

/** `=?utf-8?B?…?=` and `=?utf-8?Q?…?=` words; whitespace between two words is dropped. */
export function decodeWords(value: string): string {
  return value
    .replace(/(=\?[^?]+\?[BbQq]\?[^?]*\?=)\s+(?==\?[^?]+\?[BbQq]\?[^?]*\?=)/g, '$1')
    .replace(/=\?([^?*]+)(?:\*[^?]*)?\?([BbQq])\?([^?]*)\?=/g, (_m, charset: string, enc: string, text: string) => {
      const bytes =
        enc.toUpperCase() === 'B'
          ? Buffer.from(text, 'base64')
          : decodeQuotedPrintable(Buffer.from(text.replace(/_/g, ' '), 'latin1'));
      return decodeCharset(bytes, charset);
    });
}

function splitHeaderBody(raw: Buffer): { head: string; body: Buffer } {
  const crlf = raw.indexOf('\r\n\r\n');
  const lf = raw.indexOf('\n\n');
  if (crlf >= 0 && (lf < 0 || crlf <= lf)) return { head: raw.subarray(0, crlf).toString('latin1'), body: raw.subarray(crlf + 4) };
  if (lf >= 0) return { head: raw.subarray(0, lf).toString('latin1'), body: raw.subarray(lf + 2) };
  return { head: raw.toString('latin1'), body: Buffer.alloc(0) };
}

function parseHeaders(head: string): Map<string, string[]> {
  const headers = new Map<string, string[]>();
  const lines = head.split(/\r?\n/);
  let current: string | null = null;
  const flush = () => {
    if (current === null) return;
    const colon = current.indexOf(':');
    if (colon > 0) {
      const name = current.slice(0, colon).trim().toLowerCase();
      // Header bytes are kept as latin1 above; 8-bit UTF-8 headers are re-read as UTF-8.
      const value = Buffer.from(current.slice(colon + 1).trim(), 'latin1').toString('utf8');
      headers.set(name, [...(headers.get(name) ?? []), value]);
    }
  };
  for (const line of lines) {
    if (/^[ \t]/.test(line) && current !== null) current += ' ' + line.trim();
    else {
      flush();
      current = line;
    }
  }
  flush();
  return headers;
}

const first = (headers: Map<string, string[]>, name: string) => headers.get(name)?.[0];

/** `type/sub; a=b; c="d"` → value and lower-cased params (RFC 2231 continuations joined). */
export function parseHeaderParams(value: string | undefined): { value: string; params: Record<string, string> } {
  if (!value) return { value: '', params: {} };
  const parts: string[] = [];
  let cur = '';
  let quoted = false;
  for (let i = 0; i < value.length; i++) {
    const c = value[i];
    if (c === '"') quoted = !quoted;
    if (c === '\\' && quoted) {
      cur += value[++i] ?? '';
      continue;
    }
    if (c === ';' && !quoted) {
      parts.push(cur);
      cur = '';
    } else cur += c;
  }
  parts.push(cur);
  const params: Record<string, string> = {};
  const extended: Record<string, { index: number; value: string; encoded: boolean }[]> = {};
  for (const part of parts.slice(1)) {
    const eq = part.indexOf('=');
    if (eq < 0) continue;
    const key = part.slice(0, eq).trim().toLowerCase();
    let val = part.slice(eq + 1).trim();
    if (val.startsWith('"') && val.endsWith('"')) val = val.slice(1, -1);
    const m = /^([^*]+)(?:\*(\d+))?(\*)?$/.exec(key);
    if (m && (m[2] !== undefined || m[3] !== undefined)) {
      (extended[m[1]] ??= []).push({ index: Number(m[2] ?? 0), value: val, encoded: m[3] !== undefined });
    } else params[key] = decodeWords(val);
  }
  for (const [name, pieces] of Object.entries(extended)) {
    pieces.sort((a, b) => a.index - b.index);
    let charset = 'utf-8';
    const bytes: number[] = [];
    pieces.forEach((piece, i) => {
      let v = piece.value;
      if (piece.encoded) {
        if (i === 0) {
          const q = /^([^']*)'[^']*'(.*)$/.exec(v);
          if (q) {
            charset = q[1] || charset;
            v = q[2];
          }
        }
        for (let j = 0; j < v.length; j++) {
          if (v[j] === '%' && /^[0-9A-Fa-f]{2}$/.test(v.slice(j + 1, j + 3))) {
            bytes.push(parseInt(v.slice(j + 1, j + 3), 16));
            j += 2;
          } else bytes.push(v.charCodeAt(j) & 0xff);
        }
      } else for (const b of Buffer.from(v, 'utf8')) bytes.push(b);
    });
    params[name] = decodeCharset(Buffer.from(bytes), charset);
  }
  return { value: parts[0].trim().toLowerCase(), params };
}

function decodeBody(part: Part): Buffer {
  const encoding = (first(part.headers, 'content-transfer-encoding') ?? '7bit').toLowerCase().trim();
  if (encoding === 'base64') return Buffer.from(part.body.toString('latin1').replace(/[^A-Za-z0-9+/=]/g, ''), 'base64');
  if (encoding === 'quoted-printable') return decodeQuotedPrintable(part.body);
  return part.body;
}

function splitMultipart(body: Buffer, boundary: string): Buffer[] {
  const text = body.toString('latin1');
  const delimiter = `--${boundary}`;
  const parts: Buffer[] = [];
  let pos = text.indexOf(delimiter);
  while (pos >= 0) {
    const after = pos + delimiter.length;
    if (text.startsWith('--', after)) break;
    const start = text.indexOf('\n', after);
    if (start < 0) break;
    const next = text.indexOf(`\n${delimiter}`, start);
    const end = next < 0 ? text.length : next;
    let chunk = text.slice(start + 1, end);
    if (chunk.endsWith('\r')) chunk = chunk.slice(0, -1);
    parts.push(Buffer.from(chunk, 'latin1'));
    if (next < 0) break;
    pos = next + 1;
  }
  return parts;
}

function walk(part: Part, out: ParsedMessage) {
  const type = parseHeaderParams(first(part.headers, 'content-type') ?? 'text/plain; charset=us-ascii');
  const disposition = parseHeaderParams(first(part.headers, 'content-disposition'));
  if (type.value.startsWith('multipart/') && type.params.boundary) {
    for (const chunk of splitMultipart(part.body, type.params.boundary)) {
      const { head, body } = splitHeaderBody(chunk);
      walk({ headers: parseHeaders(head), body }, out);
    }
    return;
  }
  const content = decodeBody(part);
  const filename = disposition.params.filename ?? type.params.name;
  const isText = type.value === 'text/plain' || type.value === 'text/html';
  if (disposition.value === 'attachment' || (filename && !isText) || (!isText && disposition.value !== 'inline' && type.value !== '')) {
    out.attachments.push({ filename: filename ?? `attachment-${out.attachments.length + 1}`, contentType: type.value || 'application/octet-stream', content });
    return;
  }
  if (type.value === 'text/html') {
    if (out.html === null) out.html = decodeCharset(content, type.params.charset);
  } else if (type.value === 'text/plain' || type.value === '') {
    if (!out.text) out.text = decodeCharset(content, type.params.charset);
  } else {
    out.attachments.push({ filename: filename ?? `part-${out.attachments.length + 1}`, contentType: type.value, content });
  }
}

export function parseMessage(raw: Buffer): ParsedMessage {
  const { head, body } = splitHeaderBody(raw);
  const headers = parseHeaders(head);
  const dateHeader = first(headers, 'date');
  const date = dateHeader ? new Date(dateHeader) : null;
  const out: ParsedMessage = {
    headers,
    subject: decodeWords(first(headers, 'subject') ?? ''),
    from: decodeWords(first(headers, 'from') ?? ''),
    to: decodeWords((headers.get('to') ?? []).join(', ')),
    date: date && !Number.isNaN(date.getTime()) ? date : null,
    messageId: first(headers, 'message-id') ?? null,
    text: '',
    html: null,
    attachments: [],
  };
  walk({ headers, body }, out);
  return out;
}
