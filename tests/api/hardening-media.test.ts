// Uploads and media edits under issue 10: a second file in one upload leaves nothing behind, a
// PATCH keeps the fields it leaves out, and leftovers are swept on a schedule with a grace period.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { existsSync, mkdtempSync, readdirSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { signInAs } from '../helpers/api';
import { counts } from '../helpers/db';
import { Build, Media } from '../../server/models';
import { config } from '../../server/config';
import { listKeys, putBuffer } from '../../server/storage';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { testApp } from '../helpers/api';

const testAppServer = () => http.createServer(testApp());

import { startMediaSweeper, stopMediaSweeper } from '../../server/services/mediaSweep';

type Agent = Awaited<ReturnType<typeof signInAs>>;
const png = () =>
  sharp({ create: { width: 300, height: 200, channels: 4, background: '#4a7a33' } })
    .png()
    .toBuffer();
function mp4(bytes: number): Buffer {
  const b = Buffer.alloc(bytes, 0x2a);
  Buffer.from('000000186674797069736f6d0000020069736f6d69736f32', 'hex').copy(b, 0);
  return b;
}
async function keysUnder(prefix: string) {
  const keys: string[] = [];
  for await (const o of listKeys(prefix)) keys.push(o.key);
  return keys.sort();
}

let build: Build;
let installer: Agent;
let uploadDir: string;
beforeAll(async () => {
  build = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
  installer = await signInAs('installer');
  uploadDir = mkdtempSync(path.join(os.tmpdir(), 'bayslate-hardening-uploads-'));
  (config() as { UPLOAD_DIR: string }).UPLOAD_DIR = uploadDir;
});
afterAll(() => rmSync(uploadDir, { recursive: true, force: true }));

describe('uploads', () => {
  it('a second file in one upload is refused and leaves no object, row or temp file', async () => {
    const before = await counts('media', 'activities');
    const keysBefore = await keysUnder(`builds/${build.id}/`);
    const res = await installer
      .post(`/api/builds/${build.id}/media`)
      .field('stage', 'before')
      .attach('file', mp4(3 * 1024 * 1024), 'first.mp4')
      .attach('file', await png(), 'second.png');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toContain('one file');
    expect(await counts('media', 'activities')).toEqual(before);
    expect(await keysUnder(`builds/${build.id}/`)).toEqual(keysBefore);
    expect(readdirSync(uploadDir)).toEqual([]);
  });

  it('an upload the client breaks off mid-way leaves no object, no row and no temp file', async () => {
    const keysBefore = await keysUnder(`builds/${build.id}/`);
    const before = await counts('media');
    const server = testAppServer();
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
    const port = (server.address() as AddressInfo).port;
    const login = await request(testApp())
      .post('/api/auth/login')
      .set('X-Requested-With', 'Bayslate')
      .send({ email: 'installer@cedar-ridge.test', password: 'bayslate-demo' });
    const cookie = String(login.headers['set-cookie']?.[0] ?? '').split(';')[0]!;
    const boundary = 'bayslate-broken-upload';
    const head = Buffer.from(
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="broken.mp4"\r\nContent-Type: video/mp4\r\n\r\n`,
    );
    const req = http.request({
      host: '127.0.0.1',
      port,
      method: 'POST',
      path: `/api/builds/${build.id}/media`,
      headers: {
        'Content-Type': `multipart/form-data; boundary=${boundary}`,
        'Content-Length': String(head.length + 40 * 1024 * 1024),
        'X-Requested-With': 'Bayslate',
        Cookie: cookie,
      },
    });
    req.on('error', () => undefined);
    req.write(head);
    // 20 MB of a 40 MB body: past the first 8 MB part of the multipart upload, then the line drops.
    const chunk = mp4(1024 * 1024);
    for (let i = 0; i < 20; i++)
      await new Promise<void>((r) => (req.write(chunk) ? r() : req.once('drain', () => r())));
    await new Promise((r) => setTimeout(r, 500));
    req.destroy();
    // The server notices the broken line, aborts the multipart upload and removes the temp file.
    let left: string[] = readdirSync(uploadDir);
    for (let i = 0; i < 40 && left.length; i++) {
      await new Promise((r) => setTimeout(r, 100));
      left = readdirSync(uploadDir);
    }
    await new Promise<void>((r) => server.close(() => r()));
    expect(left).toEqual([]);
    expect(await keysUnder(`builds/${build.id}/`)).toEqual(keysBefore);
    expect(await counts('media')).toEqual(before);
  });

  it('the sweeper runs on its own timer: old leftovers go, young ones and referenced ones stay', async () => {
    const oldKey = `builds/${build.id}/sweeper-old-${Date.now()}.bin`;
    await putBuffer(oldKey, Buffer.from('left behind'), 'application/octet-stream');
    const oldTemp = path.join(uploadDir, 'crashed-upload.part');
    const youngTemp = path.join(uploadDir, 'in-progress.part');
    writeFileSync(oldTemp, 'half');
    writeFileSync(youngTemp, 'half');
    const hourAgo = new Date(Date.now() - 3600_000);
    utimesSync(oldTemp, hourAgo, hourAgo);
    const kept = (await installer.post(`/api/builds/${build.id}/media`).attach('file', await png(), 'kept.png')).body
      .media;
    // Objects: the grace (1 s) is shorter than the wait, so only "no row names it" keeps one.
    // Temp files: 30 minutes of grace keep the young one and not the hour-old one.
    await new Promise((r) => setTimeout(r, 1100));
    const passes = await new Promise<number>((resolve) => {
      let n = 0;
      startMediaSweeper({
        intervalMs: 100,
        objectGraceMs: 1000,
        tempGraceMs: 30 * 60_000,
        onPass: () => (++n === 2 ? resolve(n) : undefined),
      });
    });
    await stopMediaSweeper();
    expect(passes).toBe(2);
    const keys = await keysUnder(`builds/${build.id}/`);
    expect(keys).not.toContain(oldKey);
    const keptRow = (await Media.findByPk(kept.id))!;
    expect(keys).toContain(keptRow.objectKey);
    expect(keys).toContain(keptRow.thumbKey);
    expect(existsSync(oldTemp)).toBe(false);
    expect(existsSync(youngTemp)).toBe(true);
    rmSync(youngTemp);
  });
});

describe('media edits', () => {
  it('a PATCH with only the stage keeps the caption, and one with only the caption keeps the stage', async () => {
    const m = (
      await installer
        .post(`/api/builds/${build.id}/media`)
        .field('caption', 'Bracket before paint')
        .field('stage', 'before')
        .attach('file', await png(), 'bracket.png')
    ).body.media;
    const a = await installer.patch(`/api/builds/${build.id}/media/${m.id}`).send({ stage: 'after' });
    expect(a.status).toBe(200);
    expect(a.body.media).toMatchObject({ caption: 'Bracket before paint', stage: 'after' });
    const b = await installer.patch(`/api/builds/${build.id}/media/${m.id}`).send({ caption: 'Bracket painted' });
    expect(b.body.media).toMatchObject({ caption: 'Bracket painted', stage: 'after' });
    const c = await installer.patch(`/api/builds/${build.id}/media/${m.id}`).send({ caption: null });
    expect(c.body.media).toMatchObject({ caption: null, stage: 'after' });
  });
});
