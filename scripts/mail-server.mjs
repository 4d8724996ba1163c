#!/usr/bin/env node
// Local SMTP stand-in for development and tests: accepts every message on loopback (any or no
// auth, no TLS), stores each as a JSON file, and serves a small inbox (HTML for people, JSON for
// tests). The app talks to it like to any SMTP server, so a real one is just different SMTP_*
// settings.
//
//   node scripts/mail-server.mjs --smtp-port 1025 --http-port 1080 --dir .data/dev/mail [--host 127.0.0.1]
//
// HTTP:  GET /                     inbox page, newest first
//        GET /messages/:id         one message (HTML body in a sandboxed iframe, plus the text)
//        GET /api/messages[?to=x]  JSON list, newest first, optionally only mail to address x
//        GET /api/messages/:id     JSON of one message
//        DELETE /api/messages      clear the inbox   (DELETE /api/messages/:id removes one)
//        GET /api/health           {"ok":true}
import crypto from 'node:crypto';
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

const { values: opts } = parseArgs({
  options: {
    'smtp-port': { type: 'string', default: '1025' },
    'http-port': { type: 'string', default: '1080' },
    dir: { type: 'string', default: '.data/dev/mail' },
    host: { type: 'string', default: '127.0.0.1' },
  },
});
const HOST = opts.host;
const SMTP_PORT = Number(opts['smtp-port']);
const HTTP_PORT = Number(opts['http-port']);
const DIR = path.resolve(opts.dir);
fs.mkdirSync(DIR, { recursive: true });

const log = (msg) => console.log(`${new Date().toISOString()} ${msg}`);

// ---------------------------------------------------------------------------------------------
// storage: one JSON file per message; ids sort by arrival time

let seq = 0;
function newId() {
  seq = (seq + 1) % 10000;
  return `${String(Date.now()).padStart(13, '0')}-${String(seq).padStart(4, '0')}-${crypto.randomBytes(3).toString('hex')}`;
}
const ID_RE = /^[0-9]{13}-[0-9]{4}-[0-9a-f]{6}$/;

function save(msg) {
  const file = path.join(DIR, `${msg.id}.json`);
  const tmp = `${file}.tmp`;
  fs.writeFileSync(tmp, JSON.stringify(msg, null, 2));
  fs.renameSync(tmp, file); // readers never see a half-written message
}

function load(id) {
  if (!ID_RE.test(id)) return null;
  try {
    return JSON.parse(fs.readFileSync(path.join(DIR, `${id}.json`), 'utf8'));
  } catch {
    return null;
  }
}

function list(to) {
  let files = [];
  try {
    files = fs.readdirSync(DIR).filter((f) => f.endsWith('.json'));
  } catch {}
  const want = to ? to.trim().toLowerCase() : null;
  return files
    .sort()
    .reverse()
    .map((f) => load(f.slice(0, -5)))
    .filter((m) => m && (!want || m.to.some((a) => a.toLowerCase() === want)));
}

function clear(id) {
  let n = 0;
  for (const f of fs.readdirSync(DIR)) {
    if (!f.endsWith('.json') || (id && f !== `${id}.json`)) continue;
    try {
      fs.unlinkSync(path.join(DIR, f));
      n++;
    } catch {}
  }
  return n;
}

// ---------------------------------------------------------------------------------------------
// SMTP

const addresses = (field) =>
  [].concat(field || []).flatMap((a) => (a.value || []).map((v) => v.address).filter(Boolean));

const smtp = new SMTPServer({
  secure: false,
  disabledCommands: ['STARTTLS'], // loopback only: no TLS, so clients do not try to upgrade
  authOptional: true,
  allowInsecureAuth: true, // accept AUTH over plain TCP, with any credentials
  onAuth(auth, _session, cb) {
    cb(null, { user: auth.username || 'anyone' });
  },
  size: 25 * 1024 * 1024,
  logger: false,
  banner: 'Couplet mail stand-in',
  onData(stream, session, cb) {
    simpleParser(stream)
      .then((parsed) => {
        if (stream.sizeExceeded) return cb(Object.assign(new Error('message too large'), { responseCode: 552 }));
        // Recipients: the envelope (includes Bcc) plus the To/Cc headers, without duplicates.
        const to = [];
        for (const a of [...session.envelope.rcptTo.map((r) => r.address), ...addresses(parsed.to), ...addresses(parsed.cc)]) {
          if (!to.some((x) => x.toLowerCase() === a.toLowerCase())) to.push(a);
        }
        const msg = {
          id: newId(),
          from: parsed.from?.text || session.envelope.mailFrom?.address || '',
          to,
          subject: parsed.subject || '',
          text: parsed.text || '',
          html: parsed.html || null,
          date: (parsed.date instanceof Date && !isNaN(parsed.date) ? parsed.date : new Date()).toISOString(),
          receivedAt: new Date().toISOString(),
          messageId: parsed.messageId || null,
          attachments: (parsed.attachments || []).map((a) => ({ filename: a.filename || null, contentType: a.contentType, size: a.size })),
        };
        save(msg);
        log(`received ${msg.id} from ${msg.from} to ${to.join(', ')}: ${msg.subject}`);
        cb(null, `queued as ${msg.id}`);
      })
      .catch((err) => {
        log(`could not parse a message: ${err.message}`);
        cb(err);
      });
  },
});
smtp.on('error', (err) => log(`SMTP error: ${err.message}`));

// ---------------------------------------------------------------------------------------------
// HTTP inbox

const esc = (s) =>
  String(s ?? '').replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]);

/** Escape text, turning http(s) URLs into links (each piece escaped on its own). */
function linkify(text) {
  const parts = String(text ?? '').split(/(https?:\/\/[^\s<>"']+)/g);
  return parts.map((p, i) => (i % 2 ? `<a href="${esc(p)}" target="_blank" rel="noopener">${esc(p)}</a>` : esc(p))).join('');
}

const STYLE = `body{font:14px/1.45 system-ui,sans-serif;margin:0;color:#1d2330;background:#f6f7f9}
header{background:#1d2330;color:#fff;padding:12px 20px;display:flex;gap:16px;align-items:center}
header a{color:#fff}main{padding:16px 20px;max-width:1100px}
table{border-collapse:collapse;width:100%;background:#fff}td,th{padding:8px 10px;border-bottom:1px solid #e3e6eb;text-align:left;vertical-align:top}
th{background:#eef0f4;font-weight:600}tr:hover td{background:#f2f6ff}a{color:#1f5fd1}
.meta td:first-child{width:90px;color:#667}.empty{color:#667;padding:24px;background:#fff}
iframe{width:100%;height:520px;border:1px solid #d5d9e0;background:#fff}pre{white-space:pre-wrap;background:#fff;border:1px solid #d5d9e0;padding:12px}
button{font:inherit;padding:4px 10px;cursor:pointer}form{margin:0 0 0 auto}`;

function page(title, body) {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)}</title>
<meta name="viewport" content="width=device-width,initial-scale=1"><style>${STYLE}</style></head>
<body><header><strong>Couplet mail stand-in</strong><a href="/">Inbox</a>
<span>SMTP ${esc(HOST)}:${SMTP_PORT}</span>
<form method="post" action="/clear"><button type="submit">Clear inbox</button></form></header>
<main>${body}</main></body></html>`;
}

function inboxPage() {
  const msgs = list();
  if (!msgs.length) return page('Inbox (0)', '<p class="empty">No messages yet. Mail sent to SMTP ' + `${esc(HOST)}:${SMTP_PORT} shows up here; reload the page.</p>`);
  const rows = msgs
    .map(
      (m) => `<tr><td>${esc(new Date(m.receivedAt || m.date).toLocaleString('en-GB'))}</td><td>${esc(m.from)}</td>
<td>${esc(m.to.join(', '))}</td><td><a href="/messages/${esc(m.id)}">${esc(m.subject || '(no subject)')}</a></td></tr>`,
    )
    .join('\n');
  return page(`Inbox (${msgs.length})`, `<table><tr><th>Received</th><th>From</th><th>To</th><th>Subject</th></tr>${rows}</table>`);
}

function messagePage(m) {
  // The mail's own HTML runs in a sandbox without scripts or same-origin access; links open in a
  // new tab (allow-popups) so an invitation link can be followed from here.
  const html = m.html
    ? `<h3>HTML</h3><iframe sandbox="allow-popups allow-popups-to-escape-sandbox" referrerpolicy="no-referrer"
 srcdoc="${esc(`<base target="_blank">${m.html}`)}"></iframe>`
    : '';
  return page(
    m.subject || '(no subject)',
    `<table class="meta"><tr><td>Subject</td><td><strong>${esc(m.subject)}</strong></td></tr>
<tr><td>From</td><td>${esc(m.from)}</td></tr><tr><td>To</td><td>${esc(m.to.join(', '))}</td></tr>
<tr><td>Date</td><td>${esc(m.date)}</td></tr><tr><td>JSON</td><td><a href="/api/messages/${esc(m.id)}">/api/messages/${esc(m.id)}</a></td></tr></table>
${html}<h3>Text</h3><pre>${linkify(m.text) || '<em>(no text part)</em>'}</pre>`,
  );
}

function send(res, status, type, body, extra = {}) {
  res.writeHead(status, {
    'Content-Type': type,
    'Cache-Control': 'no-store',
    'X-Content-Type-Options': 'nosniff',
    'X-Frame-Options': 'DENY',
    'Referrer-Policy': 'no-referrer',
    ...(type.startsWith('text/html')
      ? { 'Content-Security-Policy': "default-src 'none'; style-src 'unsafe-inline'; img-src data: cid:; form-action 'self'; frame-ancestors 'none'" }
      : {}),
    ...extra,
  });
  res.end(body);
}
const json = (res, status, data) => send(res, status, 'application/json; charset=utf-8', JSON.stringify(data));

/** Changing requests only from our own page or from non-browser clients (no Origin header). */
function sameOriginOrNone(req) {
  const origin = req.headers.origin;
  return !origin || origin === `http://${req.headers.host}`;
}

const web = http.createServer((req, res) => {
  try {
    const url = new URL(req.url, `http://${req.headers.host || 'localhost'}`);
    const p = url.pathname.replace(/\/+$/, '') || '/';
    const m = p.match(/^\/(?:api\/)?messages\/([^/]+)$/);
    if (req.method === 'GET' && p === '/api/health') return json(res, 200, { ok: true });
    if (req.method === 'GET' && p === '/api/messages') return json(res, 200, list(url.searchParams.get('to')));
    if (req.method === 'DELETE' && p === '/api/messages') {
      if (!sameOriginOrNone(req)) return json(res, 403, { error: 'cross-origin request refused' });
      return json(res, 200, { deleted: clear() });
    }
    if (m && p.startsWith('/api/')) {
      if (req.method === 'GET') {
        const msg = load(m[1]);
        return msg ? json(res, 200, msg) : json(res, 404, { error: 'no such message' });
      }
      if (req.method === 'DELETE') {
        if (!sameOriginOrNone(req)) return json(res, 403, { error: 'cross-origin request refused' });
        return clear(m[1]) ? json(res, 200, { deleted: 1 }) : json(res, 404, { error: 'no such message' });
      }
    }
    if (req.method === 'GET' && p === '/') return send(res, 200, 'text/html; charset=utf-8', inboxPage());
    if (req.method === 'GET' && m) {
      const msg = load(m[1]);
      return msg
        ? send(res, 200, 'text/html; charset=utf-8', messagePage(msg))
        : send(res, 404, 'text/html; charset=utf-8', page('Not found', '<p class="empty">No such message.</p>'));
    }
    if (req.method === 'POST' && p === '/clear') {
      if (!sameOriginOrNone(req)) return send(res, 403, 'text/plain; charset=utf-8', 'cross-origin request refused');
      clear();
      return send(res, 303, 'text/plain; charset=utf-8', 'cleared', { Location: '/' });
    }
    return json(res, 404, { error: 'not found' });
  } catch (err) {
    log(`HTTP error: ${err.stack}`);
    return json(res, 500, { error: 'internal error' });
  }
});

// ---------------------------------------------------------------------------------------------

function listen(server, port, what) {
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, HOST, () => {
      server.off('error', reject);
      resolve();
    });
  }).catch((err) => {
    console.error(`cannot listen for ${what} on ${HOST}:${port}: ${err.message}`);
    process.exit(1);
  });
}

await listen(smtp, SMTP_PORT, 'SMTP');
await listen(web, HTTP_PORT, 'HTTP');
log(`mail stand-in ready: SMTP ${HOST}:${SMTP_PORT}, inbox http://${HOST}:${HTTP_PORT}, messages in ${DIR}`);

let stopping = false;
for (const sig of ['SIGTERM', 'SIGINT', 'SIGHUP']) {
  process.on(sig, () => {
    if (stopping) return;
    stopping = true;
    log(`${sig}: stopping`);
    web.close();
    web.closeAllConnections?.();
    smtp.close(() => process.exit(0));
    setTimeout(() => process.exit(0), 3000).unref();
  });
}
