// A local SMTP server for development and tests (smtp-server), so mail goes out through the same
// nodemailer calls as in production. It listens on a free port on 127.0.0.1 and stores every
// message it receives as JSON (envelope, decoded headers, the text, attachments) in
// <data dir>/mailbox/, where the admin mailbox page reads it. Nothing is relayed anywhere.
import { mkdirSync, renameSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { join } from 'node:path';
import { SMTPServer } from 'smtp-server';

const MAX_BYTES = 10 * 1024 * 1024;

/**
 * Starts the fake on a free port and points this process at it (SMTP_URL, CAGEWRIGHT_MAILBOX_DIR)
 * unless told not to. Resolves to { url, port, mailboxDir, stop }.
 */
export async function startFakeSmtp({ dataDir, port = 0, setEnv = true } = {}) {
  if (!dataDir) throw new Error('startFakeSmtp: give the data directory');
  const mailboxDir = join(dataDir, 'mailbox');
  mkdirSync(mailboxDir, { recursive: true });
  let seq = 0;
  const server = new SMTPServer({
    secure: false,
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: MAX_BYTES,
    onData(stream, session, callback) {
      const chunks = [];
      stream.on('data', (c) => chunks.push(c));
      stream.on('end', () => {
        if (stream.sizeExceeded) return callback(Object.assign(new Error('Message too large'), { responseCode: 552 }));
        try {
          const raw = Buffer.concat(chunks).toString('latin1');
          const message = parseMessage(raw);
          const receivedAt = new Date();
          const id = `${receivedAt.toISOString().replace(/[:.]/g, '-')}-${String(++seq).padStart(4, '0')}-${randomBytes(3).toString('hex')}`;
          const record = {
            id,
            receivedAt: receivedAt.toISOString(),
            envelope: {
              from: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
              to: session.envelope.rcptTo.map((r) => r.address),
            },
            ...message,
          };
          // Write then rename, so a reader never sees half a message.
          const file = join(mailboxDir, `${id}.json`);
          writeFileSync(`${file}.tmp`, JSON.stringify(record, null, 2));
          renameSync(`${file}.tmp`, file);
          callback(null, `Stored as ${id}`);
        } catch (err) {
          callback(err);
        }
      });
    },
  });
  await new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve(undefined));
  });
  server.on('error', (err) => console.error('cagewright: fake SMTP server:', err.message));
  const actual = server.server.address().port;
  const url = `smtp://127.0.0.1:${actual}`;
  if (setEnv) {
    process.env.SMTP_URL = url;
    process.env.CAGEWRIGHT_MAILBOX_DIR = mailboxDir;
  }
  return { url, port: actual, mailboxDir, stop: () => new Promise((r) => server.close(() => r(undefined))) };
}

// ---------------------------------------------------------------------------------------------
// Just enough MIME to read what nodemailer sends: headers with encoded words, quoted-printable
// and base64 bodies, multipart messages with a text part and attachments.

function splitHead(raw) {
  const m = /\r?\n\r?\n/.exec(raw);
  const head = m ? raw.slice(0, m.index) : raw;
  const body = m ? raw.slice(m.index + m[0].length) : '';
  const headers = {};
  for (const line of head.replace(/\r?\n[ \t]+/g, ' ').split(/\r?\n/)) {
    const colon = line.indexOf(':');
    if (colon <= 0) continue;
    const name = line.slice(0, colon).trim().toLowerCase();
    const value = decodeWords(line.slice(colon + 1).trim());
    headers[name] = headers[name] ? `${headers[name]}, ${value}` : value;
  }
  return { headers, body };
}

function qpBytes(s) {
  const out = [];
  for (let i = 0; i < s.length; i++) {
    const hex = s.slice(i + 1, i + 3);
    if (s[i] === '=' && /^[0-9A-Fa-f]{2}$/.test(hex)) {
      out.push(parseInt(hex, 16));
      i += 2;
    } else out.push(s.charCodeAt(i) & 0xff);
  }
  return Buffer.from(out);
}

function decodeText(bytes, charset) {
  try {
    return new TextDecoder(charset || 'utf-8').decode(bytes);
  } catch {
    return new TextDecoder('utf-8').decode(bytes);
  }
}

function decodeWords(value) {
  // Raw 8-bit header bytes (read as latin1) are UTF-8; then the encoded words.
  return value
    .replace(/[\u0080-\u00ff]+/g, (s) => decodeText(Buffer.from(s, 'latin1'), 'utf-8'))
    .replace(/(=\?[^?]+\?[bBqQ]\?[^?]*\?=)\s+(?==\?)/g, '$1')
    .replace(/=\?([^?]+)\?([bBqQ])\?([^?]*)\?=/g, (_, charset, enc, text) =>
      decodeText(enc.toUpperCase() === 'B' ? Buffer.from(text, 'base64') : qpBytes(text.replace(/_/g, ' ')), charset),
    );
}

function param(header, name) {
  const m = new RegExp(`${name}\\*?=("([^"]*)"|[^;\\s]+)`, 'i').exec(header ?? '');
  return m ? (m[2] ?? m[1]) : null;
}

function decodeBody(body, headers) {
  const cte = (headers['content-transfer-encoding'] ?? '7bit').toLowerCase();
  const bytes =
    cte === 'base64'
      ? Buffer.from(body.replace(/\s+/g, ''), 'base64')
      : cte === 'quoted-printable'
        ? qpBytes(body.replace(/=\r?\n/g, ''))
        : Buffer.from(body, 'latin1');
  return bytes;
}

function walk(raw, out) {
  const { headers, body } = splitHead(raw);
  const type = (headers['content-type'] ?? 'text/plain').split(';')[0].trim().toLowerCase();
  if (type.startsWith('multipart/')) {
    const boundary = param(headers['content-type'], 'boundary');
    if (!boundary) return headers;
    const parts = body.split(new RegExp(`\\r?\\n?--${boundary.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}(?:--)?[ \\t]*\\r?\\n?`));
    for (const part of parts.slice(1)) if (part.trim()) walk(part, out);
    return headers;
  }
  const bytes = decodeBody(body, headers);
  const disposition = headers['content-disposition'] ?? '';
  const filename = param(disposition, 'filename') ?? param(headers['content-type'], 'name');
  if (filename || /^attachment/i.test(disposition)) {
    const text =
      type.startsWith('text/') && bytes.length <= 100_000 ? decodeText(bytes, param(headers['content-type'], 'charset')) : undefined;
    out.attachments.push({ filename, contentType: type, size: bytes.length, ...(text !== undefined ? { content: text } : {}) });
  } else if (type === 'text/plain' && out.text === null) {
    out.text = decodeText(bytes, param(headers['content-type'], 'charset')).replace(/\r\n/g, '\n');
  } else if (type === 'text/html' && out.html === null) {
    out.html = decodeText(bytes, param(headers['content-type'], 'charset'));
  }
  return headers;
}

const addresses = (v) => (v ? [...v.matchAll(/[^\s<>,"()]+@[^\s<>,"()]+/g)].map((m) => m[0].toLowerCase()) : []);

export function parseMessage(raw) {
  const out = { text: null, html: null, attachments: [] };
  const headers = walk(raw, out);
  return {
    subject: headers.subject ?? '',
    from: headers.from ?? '',
    to: addresses(headers.to),
    cc: addresses(headers.cc),
    date: headers.date ?? null,
    messageId: headers['message-id'] ?? null,
    headers,
    text: out.text ?? '',
    html: out.html,
    attachments: out.attachments,
  };
}
