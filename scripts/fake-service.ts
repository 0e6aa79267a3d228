// Runs one local fake in a process of its own, for `npm start` (scripts/start.mjs):
//   node --import tsx scripts/fake-service.ts s3   (LOCAL_S3_DIR, LOCAL_S3_PORT, S3_BUCKET)
//   node --import tsx scripts/fake-service.ts smtp (LOCAL_MAIL_DIR, LOCAL_SMTP_PORT)
// It listens on 127.0.0.1 only, prints "fake <kind> ready on <port>" once it listens, and exits on
// SIGTERM. A crash here never reaches the server: the local start restarts this process.
// Development only: nothing in the server imports this file.
import path from 'node:path';
import { startFakeS3 } from '../server/storage/localS3';
import { startFakeSmtp } from '../server/mail/fakeSmtp';

const kind = process.argv[2];
const env = process.env;

async function main() {
  let stop: () => Promise<void>;
  let port: number;
  if (kind === 's3') {
    const s3 = await startFakeS3({
      directory: path.resolve(env.LOCAL_S3_DIR ?? '.data/s3'),
      bucket: env.S3_BUCKET ?? 'bayslate-media',
      port: Number(env.LOCAL_S3_PORT ?? 0),
    });
    ({ stop, port } = s3);
  } else if (kind === 'smtp') {
    const smtp = await startFakeSmtp({
      dir: path.resolve(env.LOCAL_MAIL_DIR ?? '.data/mail'),
      port: Number(env.LOCAL_SMTP_PORT ?? 0),
    });
    ({ stop, port } = smtp);
  } else {
    throw new Error(`unknown fake "${kind}" (s3 or smtp)`);
  }
  console.log(`fake ${kind} ready on ${port}`);
  const end = () => void stop().finally(() => process.exit(0));
  process.on('SIGTERM', end);
  process.on('SIGINT', end);
}

main().catch((err) => {
  console.error(`[bayslate] the local fake ${kind} could not start: ${err?.message ?? err}`);
  process.exit(1);
});
