// The local fake S3 and SMTP servers for tests, on loopback free ports. The storage and mail
// features fill these in; until then they report placeholders.
import os from 'node:os';
import path from 'node:path';
import { mkdtempSync, rmSync } from 'node:fs';

export async function startTestFakes() {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'bayslate-test-fakes-'));
  return {
    s3Endpoint: 'http://127.0.0.1:9',
    smtpPort: 9,
    mailDir: path.join(dir, 'mail'),
    stop: async () => rmSync(dir, { recursive: true, force: true }),
  };
}
