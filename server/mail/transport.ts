// The nodemailer transport: a real SMTP provider from SMTP_URL, or the in-process fake on loopback.
import nodemailer, { type Transporter } from 'nodemailer';
import { config } from '../config';

let localPort: number | null = null;
let cached: Transporter | null = null;

/** The local fake SMTP announces its port here once it listens. */
export function useLocalSmtp(port: number | null) {
  localPort = port;
  cached = null;
}

/** A transport for the fake SMTP on loopback (plain SMTP: its bundled certificate has expired). */
export function fakeTransport(port: number): Transporter {
  return nodemailer.createTransport({
    host: '127.0.0.1',
    port,
    secure: false,
    ignoreTLS: true,
    connectionTimeout: 5000,
    greetingTimeout: 5000,
    socketTimeout: 10_000,
  });
}

export function mailTransport(): Transporter | null {
  if (cached) return cached;
  const url = config().SMTP_URL;
  if (url) cached = nodemailer.createTransport(url, {});
  else if (localPort !== null) cached = fakeTransport(localPort);
  return cached;
}

/** The address part of MAIL_FROM, for Message-IDs. */
export function mailDomain() {
  const m = /@([^>\s]+)/.exec(config().MAIL_FROM);
  return m?.[1] ?? 'bayslate.local';
}
