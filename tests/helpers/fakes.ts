// The local fake S3 and SMTP servers for tests, on loopback free ports. The storage and mail
// features fill these in; until then they report placeholders.
import os from 'node:os';
import path from 'node:path';
import { mkdtempSync, rmSync } from 'node:fs';
import { startFakeS3 } from '../../server/storage/localS3';
import { startFakeSmtp } from '../../server/mail/fakeSmtp';

/** The bucket the test fake S3 creates (the default S3_BUCKET). */
export const TEST_BUCKET = 'bayslate-media';

export async function startTestFakes() {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'bayslate-test-fakes-'));
  const s3 = await startFakeS3({ directory: path.join(dir, 's3'), bucket: TEST_BUCKET });
  // A real SMTP server on a free loopback port; every message lands in mailDir as an .eml file.
  const smtp = await startFakeSmtp({ dir: path.join(dir, 'mail') });
  return {
    s3Endpoint: s3.endpoint,
    smtpPort: smtp.port,
    mailDir: smtp.dir,
    stop: async () => {
      await s3.stop().catch(() => undefined);
      await smtp.stop().catch(() => undefined);
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
