// Reads the test fake SMTP's .eml files (tests/helpers/fakes.ts) for mail sent to one address.
import { inject } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { simpleParser, type ParsedMail } from 'mailparser';

export interface ReceivedMail {
  file: string;
  to: string;
  subject: string;
  text: string;
  messageId: string;
  headers: ParsedMail['headers'];
}

export const mailDir = () => inject('mailDir');

/** Every mail the fake SMTP received for `address`, oldest first. */
export async function mailsTo(address: string): Promise<ReceivedMail[]> {
  const dir = mailDir();
  let files: string[] = [];
  try {
    files = readdirSync(dir)
      .filter((f) => f.endsWith('.eml'))
      .sort();
  } catch {
    return [];
  }
  const out: ReceivedMail[] = [];
  for (const file of files) {
    const raw = readFileSync(path.join(dir, file));
    if (!raw.includes(address)) continue;
    const m = await simpleParser(raw);
    const to = Array.isArray(m.to) ? m.to.map((a) => a.text).join(', ') : (m.to?.text ?? '');
    if (!to.includes(address)) continue;
    out.push({
      file,
      to,
      subject: m.subject ?? '',
      text: m.text ?? '',
      messageId: m.messageId ?? '',
      headers: m.headers,
    });
  }
  return out;
}

/** Waits until `address` has at least `n` mails (a worker in another process may be sending). */
export async function waitForMails(address: string, n = 1, timeoutMs = 15_000): Promise<ReceivedMail[]> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const list = await mailsTo(address);
    if (list.length >= n) return list;
    if (Date.now() > until) throw new Error(`expected ${n} mail(s) to ${address}, found ${list.length}`);
    await new Promise((r) => setTimeout(r, 150));
  }
}

/** The first link in a mail's text that starts with `prefix`. */
export function linkIn(mail: ReceivedMail, prefix: string): string {
  const m = mail.text.match(/https?:\/\/[^\s]+/g)?.find((u) => u.includes(prefix));
  if (!m) throw new Error(`no ${prefix} link in mail "${mail.subject}":\n${mail.text}`);
  return m;
}

export const uniqueAddress = (label: string) =>
  `${label}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 7)}@viewers.test`;
