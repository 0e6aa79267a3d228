// What was seen (3): the local fake S3 ran inside the server process, and one malformed multipart
// POST to its port crashed the whole server. Now `npm start` runs it in a process of its own
// (scripts/lib/local-fakes.mjs): the same POST ends only that process, which is started again on
// the same port.
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { request } from 'node:http';
import { keepFakeRunning } from '../../scripts/lib/local-fakes.mjs';

const root = path.resolve(import.meta.dirname, '../..');
const dir = mkdtempSync(path.join(os.tmpdir(), 'bayslate-fake-s3-'));
let fake: Awaited<ReturnType<typeof keepFakeRunning>> | null = null;
afterAll(async () => {
  await fake?.stop();
  rmSync(dir, { recursive: true, force: true });
});

/** The multipart body that took s3rver's parser down: a file part cut off before its boundary. */
function malformedPost(port: number) {
  const body =
    '--xyz\r\nContent-Disposition: form-data; name="key"\r\n\r\nx\r\n--xyz\r\nContent-Disposition: form-data; name="file"; filename="a"\r\n\r\nabc';
  return new Promise<void>((resolve) => {
    const req = request({
      host: '127.0.0.1',
      port,
      method: 'POST',
      path: '/bayslate-media',
      headers: { 'Content-Type': 'multipart/form-data; boundary=xyz', 'Content-Length': Buffer.byteLength(body) },
    });
    req.on('error', () => resolve());
    req.on('response', (res) => (res.resume(), resolve()));
    req.end(body);
  });
}

describe('the local fake S3 in its own process', () => {
  it('a malformed multipart POST ends only the fake, and the local start brings it back on the same port', async () => {
    fake = await keepFakeRunning(root, 's3', { ...process.env, LOCAL_S3_DIR: dir, S3_BUCKET: 'bayslate-media' });
    const firstPid = fake.pid();
    expect((await fetch(`http://127.0.0.1:${fake.port}/bayslate-media`)).status).toBe(200);
    await malformedPost(fake.port);
    // Wait for the specific outcome: a new process answering on the same port.
    const until = Date.now() + 20_000;
    let answered = false;
    while (!answered && Date.now() < until) {
      await new Promise((r) => setTimeout(r, 200));
      if (fake.pid() === firstPid) continue;
      answered = await fetch(`http://127.0.0.1:${fake.port}/bayslate-media`).then(
        (r) => r.status === 200,
        () => false,
      );
    }
    expect(fake.pid()).not.toBe(firstPid);
    expect(answered).toBe(true);
  });
});
