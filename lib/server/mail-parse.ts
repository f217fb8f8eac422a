/**
 * Just enough MIME to read the messages our own mailer sends (nodemailer: text/plain, maybe inside
 * multipart/alternative, quoted-printable or base64). The mail fake stores the raw message too.
 */
export interface ParsedMail {
  subject: string;
  text: string;
}

function splitHead(raw: string): [Record<string, string>, string] {
  const idx = raw.search(/\r?\n\r?\n/);
  const head = idx < 0 ? raw : raw.slice(0, idx);
  const body = idx < 0 ? '' : raw.slice(idx).replace(/^\r?\n\r?\n/, '');
  const headers: Record<string, string> = {};
  let last = '';
  for (const line of head.split(/\r?\n/)) {
    if (/^\s/.test(line) && last) {
      headers[last] += ' ' + line.trim();
    } else {
      const m = /^([^:]+):\s*(.*)$/.exec(line);
      if (m) {
        last = m[1].toLowerCase();
        headers[last] = m[2];
      }
    }
  }
  return [headers, body];
}

function decodeBody(body: string, encoding = ''): string {
  const enc = encoding.toLowerCase();
  if (enc === 'base64') return Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8');
  if (enc === 'quoted-printable') {
    const bytes = body
      .replace(/=\r?\n/g, '')
      .replace(/=([0-9A-Fa-f]{2})/g, (_, h: string) => String.fromCharCode(parseInt(h, 16)));
    return Buffer.from(bytes, 'latin1').toString('utf8');
  }
  return body;
}

/** RFC 2047 encoded words in headers (=?utf-8?Q?…?= and =?utf-8?B?…?=). */
function decodeWords(s: string): string {
  return s.replace(/=\?([^?]+)\?([QqBb])\?([^?]*)\?=\s*/g, (_, _cs: string, kind: string, data: string) =>
    kind.toUpperCase() === 'B'
      ? Buffer.from(data, 'base64').toString('utf8')
      : Buffer.from(data.replace(/_/g, ' ').replace(/=([0-9A-Fa-f]{2})/g, (__, h: string) => String.fromCharCode(parseInt(h, 16))), 'latin1').toString('utf8'),
  );
}

function textOf(headers: Record<string, string>, body: string): string {
  const type = headers['content-type'] ?? 'text/plain';
  const boundary = /boundary="?([^";]+)"?/i.exec(type)?.[1];
  if (/^multipart\//i.test(type) && boundary) {
    const parts = body.split(`--${boundary}`).slice(1);
    for (const part of parts) {
      if (part.startsWith('--')) break;
      const [h, b] = splitHead(part.replace(/^\r?\n/, ''));
      const t = textOf(h, b);
      if (t) return t;
    }
    return '';
  }
  if (/^text\/plain/i.test(type)) return decodeBody(body, headers['content-transfer-encoding']).trim();
  return '';
}

export function parseMail(raw: string): ParsedMail {
  const [headers, body] = splitHead(raw);
  return { subject: decodeWords(headers['subject'] ?? ''), text: textOf(headers, body) };
}
