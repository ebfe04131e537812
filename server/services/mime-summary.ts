/**
 * Just enough MIME (RFC 2045–2047) to show a captured message: its subject, its plain text, and each
 * attachment's name, type and decoded size. Not a general parser; it reads what nodemailer writes.
 */
import type { MailAttachmentInfo } from '../models/mail-message';

export interface MimeSummary {
  subject: string;
  text: string;
  attachments: MailAttachmentInfo[];
}

interface Part {
  headers: Map<string, string>;
  body: string;
}

/** Splits header block and body; unfolds continued header lines; names are lower-cased. */
function splitPart(raw: string): Part {
  const at = raw.search(/\r?\n\r?\n/);
  const head = at < 0 ? raw : raw.slice(0, at);
  const body = at < 0 ? '' : raw.slice(at).replace(/^\r?\n\r?\n/, '');
  const headers = new Map<string, string>();
  for (const line of head.replace(/\r?\n[ \t]+/g, ' ').split(/\r?\n/)) {
    const colon = line.indexOf(':');
    if (colon > 0) headers.set(line.slice(0, colon).trim().toLowerCase(), line.slice(colon + 1).trim());
  }
  return { headers, body };
}

/** A parameter of a structured header, e.g. boundary or filename (quoted or not). */
function param(header: string | undefined, name: string): string | null {
  const m = header?.match(new RegExp(`${name}\\*?=(?:"([^"]*)"|([^;\\s]*))`, 'i'));
  return m ? decodeWords(m[1] ?? m[2]) : null;
}

/** RFC 2047 encoded words (=?charset?B|Q?…?=) to text. */
export function decodeWords(value: string): string {
  // Whitespace between two adjacent encoded words is not part of the text (RFC 2047 §6.2).
  return value
    .replace(/(\?=)\s+(?==\?)/g, '$1')
    .replace(/=\?([^?]+)\?([BbQq])\?([^?]*)\?=/g, (_m, _charset, enc: string, data: string) =>
      enc.toUpperCase() === 'B' ? Buffer.from(data, 'base64').toString('utf8') : decodeQuotedPrintable(data.replace(/_/g, ' ')),
    );
}

/** Quoted-printable (RFC 2045 §6.7) to UTF-8 text. */
export function decodeQuotedPrintable(text: string): string {
  const bytes: number[] = [];
  const src = text.replace(/=\r?\n/g, '');
  for (let i = 0; i < src.length; i++) {
    if (src[i] === '=' && /^[0-9A-Fa-f]{2}$/.test(src.slice(i + 1, i + 3))) {
      bytes.push(Number.parseInt(src.slice(i + 1, i + 3), 16));
      i += 2;
    } else bytes.push(...Buffer.from(src[i], 'utf8'));
  }
  return Buffer.from(bytes).toString('utf8');
}

function decodeBody(part: Part): Buffer {
  const encoding = (part.headers.get('content-transfer-encoding') ?? '7bit').toLowerCase();
  if (encoding === 'base64') return Buffer.from(part.body.replace(/\s+/g, ''), 'base64');
  if (encoding === 'quoted-printable') return Buffer.from(decodeQuotedPrintable(part.body), 'utf8');
  return Buffer.from(part.body, 'utf8');
}

function walk(part: Part, out: MimeSummary): void {
  const type = part.headers.get('content-type') ?? 'text/plain';
  const boundary = param(type, 'boundary');
  if (/^multipart\//i.test(type) && boundary) {
    const sections = part.body.split(`--${boundary}`).slice(1);
    for (const section of sections) {
      if (section.startsWith('--')) break;
      walk(splitPart(section.replace(/^\r?\n/, '')), out);
    }
    return;
  }
  const disposition = part.headers.get('content-disposition');
  const fileName = param(disposition, 'filename') ?? param(type, 'name');
  if (fileName || /^attachment/i.test(disposition ?? '')) {
    out.attachments.push({ fileName: fileName ?? 'unnamed', contentType: type.split(';')[0].trim().toLowerCase(), sizeBytes: decodeBody(part).length });
  } else if (/^text\/plain/i.test(type) && out.text === '') out.text = decodeBody(part).toString('utf8').replace(/\r\n/g, '\n').trimEnd();
}

export function summarizeMime(raw: string): MimeSummary {
  const top = splitPart(raw);
  const out: MimeSummary = { subject: decodeWords(top.headers.get('subject') ?? ''), text: '', attachments: [] };
  walk(top, out);
  return out;
}
