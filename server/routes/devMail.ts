// The development inbox at /dev/mail (demo mode only; app.ts mounts it only then): the .eml files the local fake SMTP saved,
// newest first, each readable as plain text. Everything shown is escaped; only http(s) links
// found in the text are made clickable.
import { Router } from 'express';
import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { config } from '../config';

// mailparser is a development dependency: loaded on first use, and the inbox exists in demo mode
// only, which a production start refuses.
type Parser = typeof import('mailparser').simpleParser;
let parser: Promise<Parser> | null = null;
const simpleParser: Parser = (async (source: Buffer) => {
  parser ??= import('mailparser').then((m) => m.simpleParser);
  return (await parser)(source);
}) as Parser;

const esc = (s: unknown) =>
  String(s ?? '').replace(
    /[&<>"']/g,
    (ch) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[ch]!,
  );

const NAME = /^[0-9A-Za-z_-]{1,80}\.eml$/;
const LINK = /https?:\/\/[^\s<>"')]+/g;

function page(title: string, body: string) {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<title>${esc(title)} · Bayslate development inbox</title><link rel="icon" href="/favicon.svg">
<style>body{font-family:system-ui,sans-serif;background:#faf8f3;color:#1d1f22;margin:0;padding:1rem;max-width:60rem}pre{overflow-wrap:anywhere}
h1{font-size:1.4rem}table{border-collapse:collapse;width:100%;table-layout:fixed}th,td{text-align:left;padding:.4rem .6rem;border-bottom:1px solid #e4dfd3;vertical-align:top;overflow-wrap:anywhere}
th{background:#f1ede4}a{color:#30485c}pre{white-space:pre-wrap;background:#fff;border:1px solid #e4dfd3;padding:1rem;border-radius:6px}
.note{color:#5c616b}</style></head><body><main>${body}</main></body></html>`;
}

async function listFiles(dir: string) {
  try {
    return (await readdir(dir))
      .filter((n) => NAME.test(n))
      .sort()
      .reverse();
  } catch {
    return [];
  }
}

/** Text with each http(s) address turned into a link; everything else escaped. */
function linkify(text: string) {
  let out = '';
  let last = 0;
  for (const m of text.matchAll(LINK)) {
    out += esc(text.slice(last, m.index)) + `<a href="${esc(m[0])}">${esc(m[0])}</a>`;
    last = m.index! + m[0].length;
  }
  return out + esc(text.slice(last));
}

export function devMailRouter() {
  const router = Router();
  router.use((_req, res, next) =>
    config().BAYSLATE_DEMO ? next() : res.status(404).type('text/plain').send('Not found'),
  );
  router.get('/', async (_req, res) => {
    const dir = path.resolve(config().LOCAL_MAIL_DIR);
    const files = (await listFiles(dir)).slice(0, 200);
    const rows: string[] = [];
    for (const f of files) {
      const m = await simpleParser(await readFile(path.join(dir, f))).catch(() => null);
      if (!m) continue;
      const to = Array.isArray(m.to) ? m.to.map((a) => a.text).join(', ') : (m.to?.text ?? '');
      rows.push(
        `<tr><td>${esc(m.date?.toISOString().replace('T', ' ').slice(0, 19) ?? '')}</td><td>${esc(to)}</td><td><a href="/dev/mail/${esc(f)}">${esc(m.subject ?? '(no subject)')}</a></td></tr>`,
      );
    }
    res
      .type('html')
      .send(
        page(
          'Inbox',
          `<h1>Development inbox</h1><p class="note">Mail the local fake SMTP server received (demo mode only), newest first. Folder: ${esc(dir)}</p>` +
            (rows.length
              ? `<table><thead><tr><th scope="col">Received</th><th scope="col">To</th><th scope="col">Subject</th></tr></thead><tbody>${rows.join('')}</tbody></table>`
              : '<p>No mail yet. Request or vote on a public build page and the confirmation mail shows up here.</p>'),
        ),
      );
  });
  router.get('/:file', async (req, res) => {
    const file = String(req.params.file);
    if (!NAME.test(file)) return res.status(404).type('text/plain').send('Not found');
    const raw = await readFile(path.join(path.resolve(config().LOCAL_MAIL_DIR), file)).catch(() => null);
    if (!raw) return res.status(404).type('text/plain').send('Not found');
    const m = await simpleParser(raw);
    const to = Array.isArray(m.to) ? m.to.map((a) => a.text).join(', ') : (m.to?.text ?? '');
    res.type('html').send(
      page(
        m.subject ?? 'Mail',
        `<p><a href="/dev/mail">← Inbox</a></p><h1>${esc(m.subject ?? '(no subject)')}</h1>
<table><tbody><tr><th scope="row">From</th><td>${esc(m.from?.text)}</td></tr><tr><th scope="row">To</th><td>${esc(to)}</td></tr>
<tr><th scope="row">Date</th><td>${esc(m.date?.toISOString())}</td></tr></tbody></table>
<h2>Text</h2><pre>${linkify(m.text ?? '')}</pre>`,
      ),
    );
  });
  return router;
}
