// The local fake S3 and SMTP servers for tests, on loopback free ports. The storage and mail
// features fill these in; until then they report placeholders.
import os from 'node:os';
import path from 'node:path';
import { mkdtempSync, rmSync } from 'node:fs';
import { startFakeS3 } from '../../server/storage/localS3';

/** The bucket the test fake S3 creates (the default S3_BUCKET). */
export const TEST_BUCKET = 'bayslate-media';

export async function startTestFakes() {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'bayslate-test-fakes-'));
  const s3 = await startFakeS3({ directory: path.join(dir, 's3'), bucket: TEST_BUCKET });
  return {
    s3Endpoint: s3.endpoint,
    smtpPort: 9,
    mailDir: path.join(dir, 'mail'),
    stop: async () => {
      await s3.stop().catch(() => undefined);
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
