// A fake SMTP server on loopback that keeps every message it receives as an .eml file, for
// `npm start` without SMTP_URL (the development inbox reads the folder) and for the tests.
import { SMTPServer } from 'smtp-server';
import { mkdirSync, writeFileSync, renameSync } from 'node:fs';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import type { AddressInfo } from 'node:net';

export interface FakeSmtp {
  port: number;
  dir: string;
  stop: () => Promise<void>;
}

let seq = 0;
/** File names sort by arrival: zero-padded milliseconds, then a per-process counter. */
export function emlName() {
  seq = (seq + 1) % 1_000_000;
  return `${String(Date.now()).padStart(15, '0')}-${String(seq).padStart(6, '0')}-${randomBytes(3).toString('hex')}.eml`;
}

export async function startFakeSmtp(opts: { dir: string; port?: number; host?: string }): Promise<FakeSmtp> {
  mkdirSync(opts.dir, { recursive: true });
  const server = new SMTPServer({
    // The bundled certificate of smtp-server has expired; the fake speaks plain SMTP on loopback only.
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    logger: false,
    size: 10 * 1024 * 1024,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        try {
          const name = emlName();
          // Write then rename, so a reader never sees half a message.
          const tmp = path.join(opts.dir, `.${name}.tmp`);
          writeFileSync(tmp, Buffer.concat(chunks));
          renameSync(tmp, path.join(opts.dir, name));
          callback();
        } catch (err) {
          callback(err as Error);
        }
      });
    },
  });
  const host = opts.host ?? '127.0.0.1';
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, host, () => resolve());
  });
  const port = (server.server.address() as AddressInfo).port;
  return { port, dir: opts.dir, stop: () => new Promise<void>((r) => server.close(() => r())) };
}
