#!/usr/bin/env node
// Local stand-in for a hosted mail service: an SMTP server on 127.0.0.1 that keeps every message
// and shows them in the browser (http://127.0.0.1:<http-port>/) and as JSON (/messages).
import http from 'node:http';
import { appendFileSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

const arg = (name, dflt) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : dflt;
};
const smtpPort = Number(arg('smtp-port', 2525));
const httpPort = Number(arg('http-port', 8025));
const dir = arg('dir', '.data/mail');
mkdirSync(dir, { recursive: true });
const store = join(dir, 'messages.jsonl');
/** @typedef {{filename:string,contentType:string,size:number}} Attachment */
/**
 * @type {{id:string,receivedAt:string,from:string,to:string[],subject:string,text:string,attachments:Attachment[]}[]}
 */
let messages = existsSync(store)
  ? readFileSync(store, 'utf8')
      .split('\n')
      .filter(Boolean)
      .map((l) => JSON.parse(l))
  : [];

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS', 'AUTH'],
  logger: false,
  size: 25 * 1024 * 1024,
  onData(stream, session, callback) {
    simpleParser(stream)
      .then((mail) => {
        const msg = {
          id: randomUUID(),
          receivedAt: new Date().toISOString(),
          from: mail.from?.text ?? session.envelope.mailFrom?.address ?? '',
          to: session.envelope.rcptTo.map((r) => r.address),
          subject: mail.subject ?? '',
          text: mail.text ?? '',
          attachments: (mail.attachments ?? []).map((a) => ({
            filename: a.filename ?? 'attachment',
            contentType: a.contentType,
            size: a.size,
          })),
        };
        messages.push(msg);
        appendFileSync(store, JSON.stringify(msg) + '\n');
        callback();
      })
      .catch((e) => callback(e));
  },
});

const esc = (s) => String(s).replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]);
const page = (title, body) => `<!doctype html><html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1"><title>${esc(title)}</title>
<style>body{font-family:system-ui,sans-serif;background:#ecebe6;color:#1d1f1e;margin:0;padding:24px}main{max-width:960px;margin:auto}
table{width:100%;border-collapse:collapse;background:#fbfaf7}td,th{padding:10px;border-bottom:1px solid #d4d1c8;text-align:left}
a{color:#2f6b5e}pre{white-space:pre-wrap;background:#fbfaf7;padding:16px;border:1px solid #d4d1c8}.note{color:#5b5e5c}</style>
</head><body><main>${body}</main></body></html>`;

const server = http.createServer((req, res) => {
  const url = new URL(req.url ?? '/', 'http://x');
  if (req.method === 'GET' && url.pathname === '/messages') {
    const to = url.searchParams.get('to');
    const list = to ? messages.filter((m) => m.to.some((t) => t.toLowerCase() === to.toLowerCase())) : messages;
    res.writeHead(200, { 'content-type': 'application/json' });
    return res.end(JSON.stringify(list));
  }
  if (req.method === 'DELETE' && url.pathname === '/messages') {
    messages = [];
    writeFileSync(store, '');
    res.writeHead(204);
    return res.end();
  }
  const m = url.pathname.match(/^\/messages\/([0-9a-f-]{36})$/);
  if (req.method === 'GET' && m) {
    const msg = messages.find((x) => x.id === m[1]);
    if (!msg) {
      res.writeHead(404);
      return res.end('not found');
    }
    res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
    const linked = esc(msg.text).replace(/(https?:\/\/[^\s<]+)/g, '<a href="$1">$1</a>');
    const attachmentList = msg.attachments.map((a) => `${esc(a.filename)} (${esc(a.contentType)}, ${a.size} bytes)`).join(', ');
    const attachments = msg.attachments.length ? `<p>Attachments: ${attachmentList}</p>` : '';
    return res.end(
      page(
        msg.subject,
        `<p><a href="/">← Inbox</a></p><h1>${esc(msg.subject)}</h1>
      <p class="note">From ${esc(msg.from)} to ${esc(msg.to.join(', '))}, ${esc(msg.receivedAt)}</p><pre>${linked}</pre>
      ${attachments}`,
      ),
    );
  }
  if (req.method === 'GET' && url.pathname === '/') {
    res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
    const empty = '<tr><td colspan="3">No messages yet.</td></tr>';
    const rows = [...messages]
      .reverse()
      .map(
        (x) =>
          `<tr><td>${esc(x.receivedAt.replace('T', ' ').slice(0, 19))}</td><td>${esc(x.to.join(', '))}</td><td><a ` +
          `href="/messages/${x.id}">${esc(x.subject)}</a></td></tr>`,
      )
      .join('');
    return res.end(
      page(
        'Local mail inbox',
        `<h1>Local mail inbox</h1><p class="note">Every e-mail Crankjournal sends on this machine lands here;
      nothing leaves the machine.</p>
      <table><thead><tr><th>Received (UTC)</th><th>To</th><th>Subject</th></tr></thead><tbody>${rows || empty}</tbody></table>`,
      ),
    );
  }
  res.writeHead(404);
  res.end('not found');
});

smtp.listen(smtpPort, '127.0.0.1', () => {
  server.listen(httpPort, '127.0.0.1', () => console.log(`mail inbox: SMTP 127.0.0.1:${smtpPort}, read at http://127.0.0.1:${httpPort}/`));
});
const stop = () => {
  smtp.close(() => {});
  server.close(() => process.exit(0));
  setTimeout(() => process.exit(0), 500).unref();
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
