// Media on routes/media.ts: byte-exact round trips through object storage, every refused input
// (nothing stored), storage down, the leftover sweep, and the role rules (invoices hidden).
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { anonymous, signInAs } from '../helpers/api';
import { counts } from '../helpers/db';
import { Build, Media, Part, Upgrade } from '../../server/models';
import { config } from '../../server/config';
import { configureStorage, storageSettings, putBuffer, listKeys } from '../../server/storage';
import { startFakeS3, type FakeS3 } from '../../server/storage/localS3';
import { sweepOrphans } from '../../server/services/mediaSweep';
import { everyAnswerHasAContract } from '../helpers/contract';

// /api/health is another domain's (its contract comes with it).
everyAnswerHasAContract({ except: ['/api/health'] });

// One sign-in per role for the whole file (sign-in is rate-limited).
const agents = new Map<string, Promise<Agent>>();
const as = (role: 'owner' | 'producer' | 'installer' | 'marketing') => {
  if (!agents.has(role)) agents.set(role, signInAs(role));
  return agents.get(role)!;
};

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');
type Agent = Awaited<ReturnType<typeof signInAs>>;

// --- generated test files (no fixtures on disk) ---
const jpeg = () =>
  sharp({ create: { width: 1200, height: 800, channels: 3, background: '#3d5a73' } })
    .jpeg({ quality: 80 })
    .toBuffer();
const png = () =>
  sharp({ create: { width: 300, height: 200, channels: 4, background: '#b34a14' } })
    .png()
    .toBuffer();
/** An ISO base-media header (ftyp isom) followed by filler: passes as MP4 by content. */
function mp4(bytes = 256 * 1024): Buffer {
  const b = Buffer.alloc(bytes, 0x2a);
  Buffer.from('000000186674797069736f6d0000020069736f6d69736f32', 'hex').copy(b, 0);
  return b;
}
const pdf = () =>
  Buffer.from(
    '%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[]/Count 0>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n',
  );
/** An ELF executable header: what a renamed program starts with. */
const elf = () => Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]), Buffer.alloc(8000, 0)]);

let build: Build;
let other: Build;
let upgrade: Upgrade;
let otherUpgrade: Upgrade;
let part: Part;
let uploadDir: string;
const TABLES = ['media', 'activities'] as const;

beforeAll(async () => {
  build = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
  upgrade = (await Upgrade.findOne({ where: { buildId: build.id, title: 'Trailer wiring, 7-pin' } }))!;
  part = (await Part.findOne({ where: { buildId: build.id } }))!;
  other = await Build.create({
    slug: 'media-other',
    name: 'Other',
    year: 2021,
    make: 'Halvorsen',
    model: 'Skua',
    vin: null,
    mileage: null,
    budgetCents: null,
    labourRateCents: null,
    campaign: null,
    summary: null,
  });
  otherUpgrade = await Upgrade.create({
    buildId: other.id,
    title: 'Other build upgrade',
    area: 'front',
    replaces: null,
    becomes: null,
    installedOn: null,
    episodeId: null,
    episodePosition: null,
    notes: null,
    tireFrom: null,
    tireTo: null,
  });
  // A temporary folder of this file's own, so "nothing left on disk" is this file's claim only.
  uploadDir = mkdtempSync(path.join(os.tmpdir(), 'bayslate-media-uploads-'));
  (config() as { UPLOAD_DIR: string }).UPLOAD_DIR = uploadDir;
});
afterAll(() => rmSync(uploadDir, { recursive: true, force: true }));

function upload(
  agent: Agent,
  file: Buffer,
  name: string,
  fields: Record<string, string | number> = {},
  buildId = build.id,
) {
  let req = agent.post(`/api/builds/${buildId}/media`);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, String(v));
  return req.attach('file', file, { filename: name, contentType: 'image/jpeg' });
}

async function fetchBytes(url: string) {
  const r = await fetch(url);
  return { status: r.status, headers: r.headers, body: Buffer.from(await r.arrayBuffer()) };
}

/** Follows our download route's redirect to the presigned URL and returns the bytes. */
async function download(agent: Agent, id: number, buildId = build.id) {
  const res = await agent.get(`/api/builds/${buildId}/media/${id}/download`).redirects(0);
  expect(res.status).toBe(302);
  expect(res.headers.location).toMatch(/^http:\/\/127\.0\.0\.1:\d+\//);
  return fetchBytes(res.headers.location);
}

describe('media: uploads round-trip byte-exact', () => {
  it('a photo: stored, thumbnail made once, sha256 of the download equals the upload', async () => {
    const installer = await as('installer');
    const file = await jpeg();
    const res = await upload(installer, file, 'wiring-under-frame.jpg', {
      upgradeId: upgrade.id,
      stage: 'during',
      caption: 'Loom along the rail',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const m = res.body.media;
    expect(m).toMatchObject({
      kind: 'photo',
      stage: 'during',
      caption: 'Loom along the rail',
      upgradeId: upgrade.id,
      contentType: 'image/jpeg',
      sizeBytes: file.length,
      sha256: sha(file),
      originalName: 'wiring-under-frame.jpg',
    });
    const row = (await Media.findByPk(m.id))!;
    // Our own key, never the person's file name.
    expect(row.objectKey).toMatch(new RegExp(`^builds/${build.id}/\\d{4}-\\d{2}/[0-9a-f-]{36}\\.jpg$`));
    expect(row.objectKey).not.toContain('wiring');
    const got = await download(installer, m.id);
    expect(got.status).toBe(200);
    expect(sha(got.body)).toBe(sha(file));
    expect(got.headers.get('content-disposition')).toContain('filename="wiring-under-frame.jpg"');
    const thumb = await fetchBytes(m.thumbUrl);
    expect(thumb.status).toBe(200);
    const meta = await sharp(thumb.body).metadata();
    expect(meta.format).toBe('webp');
    expect(Math.max(meta.width!, meta.height!)).toBe(400);
    expect(thumb.body.length).toBeLessThan(file.length);
  });

  it('a video (MP4 by content) round-trips; no thumbnail is claimed', async () => {
    const producer = await as('producer');
    const file = mp4(3 * 1024 * 1024 + 17);
    const res = await upload(producer, file, 'install-take-2.mp4', { upgradeId: upgrade.id, stage: 'during' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.media).toMatchObject({
      kind: 'video',
      contentType: 'video/mp4',
      sizeBytes: file.length,
      thumbUrl: null,
    });
    const got = await download(producer, res.body.media.id);
    expect(sha(got.body)).toBe(sha(file));
    // The inline URL plays in the page under the right type.
    const inline = await fetchBytes(res.body.media.url);
    expect(inline.headers.get('content-type')).toBe('video/mp4');
  });

  it('a PDF invoice on a part round-trips for the owner and keeps a UTF-8 name', async () => {
    const owner = await as('owner');
    const file = pdf();
    const res = await upload(owner, file, 'Rechnung Nr. 7 – Kabelbaum.pdf', { partId: part.id });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.media).toMatchObject({
      kind: 'document',
      partId: part.id,
      upgradeId: part.upgradeId,
      originalName: 'Rechnung Nr. 7 – Kabelbaum.pdf',
    });
    const got = await download(owner, res.body.media.id);
    expect(sha(got.body)).toBe(sha(file));
    const cd = got.headers.get('content-disposition')!;
    expect(cd).toContain('attachment;');
    expect(cd).toContain("filename*=UTF-8''Rechnung%20Nr.%207%20%E2%80%93%20Kabelbaum.pdf");
  });

  it('a PNG may be filed as a document (a photographed paper invoice)', async () => {
    const producer = await as('producer');
    const res = await upload(producer, await png(), 'receipt.png', { kind: 'document', partId: part.id });
    expect(res.status).toBe(201);
    expect(res.body.media.kind).toBe('document');
  });
});

describe('media: refused uploads store nothing', () => {
  async function refused(
    res: { status: number; body: { error?: { message?: string; code?: string } } },
    status: number,
    words: RegExp,
    before: Record<string, number>,
  ) {
    expect(res.status, JSON.stringify(res.body)).toBe(status);
    expect(res.body.error?.message).toMatch(words);
    expect(await counts(...TABLES)).toEqual(before);
    expect(readdirSync(uploadDir)).toEqual([]);
  }

  it('a renamed executable posing as a photo', async () => {
    const before = await counts(...TABLES);
    const res = await upload(await as('installer'), elf(), 'IMG_2041.jpg', { upgradeId: upgrade.id });
    await refused(res, 415, /ELF.*Bayslate accepts/, before);
  });

  it('a shell script named .jpg', async () => {
    const before = await counts(...TABLES);
    const res = await upload(await as('installer'), Buffer.from('#!/bin/sh\nrm -rf /\n'), 'photo.jpg');
    await refused(res, 415, /not a type we can recognise/, before);
  });

  it('an SVG, with a script inside or not', async () => {
    const installer = await as('installer');
    const before = await counts(...TABLES);
    const svg =
      '<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script><rect width="10" height="10"/></svg>';
    await refused(await upload(installer, Buffer.from(svg), 'badge.svg'), 415, /Bayslate accepts/, before);
    await refused(
      await upload(
        installer,
        Buffer.from('<?xml version="1.0"?><svg xmlns="http://www.w3.org/2000/svg"/>'),
        'plain.svg',
      ),
      415,
      /Bayslate accepts/,
      before,
    );
  });

  it('a zero-byte file', async () => {
    const before = await counts(...TABLES);
    await refused(await upload(await as('installer'), Buffer.alloc(0), 'empty.jpg'), 400, /empty/, before);
  });

  it('a photo over the photo limit answers 413 naming the limit', async () => {
    const c = config() as { UPLOAD_MAX_PHOTO_MB: number };
    const saved = c.UPLOAD_MAX_PHOTO_MB;
    c.UPLOAD_MAX_PHOTO_MB = 1;
    try {
      const big = Buffer.concat([await jpeg(), Buffer.alloc(1024 * 1024 + 10, 0)]);
      const before = await counts(...TABLES);
      await refused(
        await upload(await as('installer'), big, 'huge.jpg'),
        413,
        /larger than 1 MB, the limit for photos/,
        before,
      );
    } finally {
      c.UPLOAD_MAX_PHOTO_MB = saved;
    }
  });

  it('a "../" name is kept only as a clean name; the key is ours', async () => {
    const res = await upload(await as('installer'), await png(), '../../etc/passwd.png');
    expect(res.status).toBe(201);
    expect(res.body.media.originalName).toBe('passwd.png');
    const row = (await Media.findByPk(res.body.media.id))!;
    expect(row.objectKey).not.toContain('..');
    expect(row.objectKey).not.toContain('passwd');
  });

  it("a file for another build's upgrade, episode or part", async () => {
    const installer = await as('installer');
    const before = await counts(...TABLES);
    const res = await upload(installer, await png(), 'a.png', { upgradeId: otherUpgrade.id });
    await refused(res, 400, /no such upgrade in this build/, before);
    expect((res.body as { error: { fields: { path: string }[] } }).error.fields[0].path).toBe('upgradeId');
    await refused(await upload(installer, await png(), 'a.png', { episodeId: 999999 }), 400, /no such episode/, before);
    await refused(await upload(installer, await png(), 'a.png', { partId: 999999 }), 400, /no such part/, before);
  });

  it('unknown fields, a bad stage, a kind that does not match the content, no file, JSON instead of a form', async () => {
    const installer = await as('installer');
    const before = await counts(...TABLES);
    await refused(await upload(installer, await png(), 'a.png', { colour: 'red' }), 400, /colour/, before);
    await refused(await upload(installer, await png(), 'a.png', { stage: 'later' }), 400, /stage/i, before);
    await refused(
      await upload(installer, await png(), 'a.png', { kind: 'video' }),
      400,
      /PNG image, so it cannot be stored as a video/,
      before,
    );
    await refused(
      await installer.post(`/api/builds/${build.id}/media`).field('caption', 'no file'),
      400,
      /multipart|field "file"/,
      before,
    );
    await refused(
      await installer.post(`/api/builds/${build.id}/media`).send({ caption: 'json' }),
      400,
      /multipart/,
      before,
    );
  });

  it('an unknown build answers 404', async () => {
    const res = await upload(await as('installer'), await png(), 'a.png', {}, 999999);
    expect(res.status).toBe(404);
  });
});

describe('media: roles', () => {
  it('anonymous gets 401 and marketing may not upload', async () => {
    expect((await anonymous().get(`/api/builds/${build.id}/media`)).status).toBe(401);
    const before = await counts(...TABLES);
    const res = await upload(await as('marketing'), await png(), 'a.png');
    expect(res.status).toBe(403);
    expect(await counts(...TABLES)).toEqual(before);
  });

  it('an installer may not add an invoice', async () => {
    const before = await counts(...TABLES);
    const res = await upload(await as('installer'), pdf(), 'invoice.pdf', { partId: part.id });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/Invoices/);
    expect(await counts(...TABLES)).toEqual(before);
  });

  it('invoices are hidden from installer and marketing in lists, downloads and edits', async () => {
    const owner = await as('owner');
    const inv = (await upload(owner, pdf(), 'supplier-invoice.pdf', { partId: part.id })).body.media;
    const ownerList = (await owner.get(`/api/builds/${build.id}/media?partId=${part.id}`)).body.media.map(
      (m: { id: number }) => m.id,
    );
    expect(ownerList).toContain(inv.id);
    for (const role of ['installer', 'marketing'] as const) {
      const a = await as(role);
      const list = await a.get(`/api/builds/${build.id}/media?pageSize=200`);
      expect(list.status).toBe(200);
      expect(list.body.media.map((m: { id: number }) => m.id)).not.toContain(inv.id);
      expect(
        list.body.media.every(
          (m: { kind: string; partId: number | null }) => !(m.kind === 'document' && m.partId !== null),
        ),
      ).toBe(true);
      expect((await a.get(`/api/builds/${build.id}/media/${inv.id}/download`).redirects(0)).status).toBe(404);
    }
    expect(
      (await (await as('installer')).patch(`/api/builds/${build.id}/media/${inv.id}`).send({ caption: 'x' })).status,
    ).toBe(404);
    expect(
      (await (await as('producer')).get(`/api/builds/${build.id}/media/${inv.id}/download`).redirects(0)).status,
    ).toBe(302);
  });

  it('an invoice stays hidden from installer and marketing after its part is deleted', async () => {
    const owner = await as('owner');
    const spare = await Part.create({
      buildId: build.id,
      upgradeId: part.upgradeId,
      partNumber: 'HT-INV-1',
      description: 'Part with an invoice',
      quantity: 1,
      unitCostCents: 100,
      retailPriceCents: null,
      supplier: null,
      productUrl: null,
      expectedArrival: null,
      orderedOn: null,
      receivedOn: null,
    });
    const inv = (await upload(owner, pdf(), 'invoice-of-a-part.pdf', { partId: spare.id })).body.media;
    expect((await owner.delete(`/api/builds/${build.id}/parts/${spare.id}`)).status).toBe(204);
    for (const role of ['installer', 'marketing'] as const) {
      const a = await as(role);
      const list = await a.get(`/api/builds/${build.id}/media?pageSize=200`);
      expect(list.body.media.map((m: { id: number }) => m.id)).not.toContain(inv.id);
      expect((await a.get(`/api/builds/${build.id}/media/${inv.id}/download`).redirects(0)).status).toBe(404);
    }
    expect((await owner.get(`/api/builds/${build.id}/media/${inv.id}/download`).redirects(0)).status).toBe(302);
  });

  it('marketing reads the list with presigned thumbnail and full URLs', async () => {
    const res = await (await as('marketing')).get(`/api/builds/${build.id}/media?kind=photo&stage=after`);
    expect(res.status).toBe(200);
    expect(res.body.media.length).toBeGreaterThan(0);
    for (const m of res.body.media) {
      expect(m).toMatchObject({ kind: 'photo', stage: 'after' });
      expect(m.thumbUrl).toMatch(/X-Amz-Signature=/);
      expect(m.url).toMatch(/X-Amz-Expires=900/);
    }
    const thumb = await fetchBytes(res.body.media[0].thumbUrl);
    expect(thumb.status).toBe(200);
    expect(thumb.headers.get('content-type')).toBe('image/webp');
  });

  it('filters by upgrade and paginates', async () => {
    const a = await as('producer');
    const all = (await a.get(`/api/builds/${build.id}/media?upgradeId=${upgrade.id}`)).body;
    expect(all.total).toBeGreaterThanOrEqual(2);
    expect(all.media.every((m: { upgradeId: number }) => m.upgradeId === upgrade.id)).toBe(true);
    const p1 = (await a.get(`/api/builds/${build.id}/media?pageSize=1&page=1`)).body;
    const p2 = (await a.get(`/api/builds/${build.id}/media?pageSize=1&page=2`)).body;
    expect(p1.media).toHaveLength(1);
    expect(p2.media[0].id).not.toBe(p1.media[0].id);
    expect((await a.get(`/api/builds/${build.id}/media?stage=soon`)).status).toBe(400);
    expect((await a.get(`/api/builds/${build.id}/media?colour=red`)).status).toBe(400);
  });

  it('PATCH: the uploader (installer) edits their own, not others; producer edits any; activity recorded', async () => {
    const installer = await as('installer');
    const producer = await as('producer');
    const own = (await upload(installer, await png(), 'mine.png', { stage: 'before' })).body.media;
    const theirs = (await upload(producer, await png(), 'theirs.png')).body.media;
    const res = await installer
      .patch(`/api/builds/${build.id}/media/${own.id}`)
      .send({ caption: 'Clamp detail', stage: 'after' });
    expect(res.status).toBe(200);
    expect(res.body.media).toMatchObject({ caption: 'Clamp detail', stage: 'after' });
    expect((await installer.patch(`/api/builds/${build.id}/media/${theirs.id}`).send({ caption: 'no' })).status).toBe(
      403,
    );
    expect((await producer.patch(`/api/builds/${build.id}/media/${own.id}`).send({ stage: 'soon' })).status).toBe(400);
    expect((await producer.patch(`/api/builds/${build.id}/media/${own.id}`).send({ sha256: 'x' })).status).toBe(400);
    expect((await producer.patch(`/api/builds/${other.id}/media/${own.id}`).send({ caption: 'idor' })).status).toBe(
      404,
    );
    expect(
      (await (await as('marketing')).patch(`/api/builds/${build.id}/media/${own.id}`).send({ caption: 'x' })).status,
    ).toBe(403);
    expect((await Media.findByPk(own.id))!.caption).toBe('Clamp detail');
  });

  it('DELETE removes the row and both objects; installers only their own of the day; other build 404', async () => {
    const installer = await as('installer');
    const producer = await as('producer');
    const own = (await upload(installer, await jpeg(), 'del.jpg')).body.media;
    const theirs = (await upload(producer, await jpeg(), 'keep.jpg')).body.media;
    const row = (await Media.findByPk(own.id))!;
    expect((await installer.delete(`/api/builds/${build.id}/media/${theirs.id}`)).status).toBe(403);
    expect((await producer.delete(`/api/builds/${other.id}/media/${own.id}`)).status).toBe(404);
    expect((await (await as('marketing')).delete(`/api/builds/${build.id}/media/${own.id}`)).status).toBe(403);
    // Yesterday's upload: the installer asks the producer.
    await Media.update(
      { createdAt: new Date(Date.now() - 2 * 24 * 3600_000) },
      { where: { id: theirs.id }, silent: true },
    );
    const res = await installer.delete(`/api/builds/${build.id}/media/${own.id}`);
    expect(res.status).toBe(204);
    expect(await Media.findByPk(own.id)).toBeNull();
    expect((await fetchBytes(own.url)).status).toBe(404);
    expect((await fetchBytes(own.thumbUrl)).status).toBe(404);
    const keys: string[] = [];
    for await (const o of listKeys(`builds/${build.id}/`)) keys.push(o.key);
    expect(keys).not.toContain(row.objectKey);
    expect(keys).not.toContain(row.thumbKey);
    expect((await producer.delete(`/api/builds/${build.id}/media/${theirs.id}`)).status).toBe(204);
  });
});

describe('media: storage down, and leftovers', () => {
  let own: FakeS3;
  let dir: string;
  const saved = { endpoint: '' };
  beforeAll(async () => {
    dir = mkdtempSync(path.join(os.tmpdir(), 'bayslate-media-own-s3-'));
    own = await startFakeS3({ directory: dir, bucket: storageSettings().bucket });
    saved.endpoint = storageSettings().endpoint!;
    configureStorage({ endpoint: own.endpoint });
  });
  afterAll(async () => {
    configureStorage({ endpoint: saved.endpoint });
    await own.stop().catch(() => undefined);
    rmSync(dir, { recursive: true, force: true });
  });

  it('the sweep lists and removes objects no row names, and keeps the rest', async () => {
    const installer = await as('installer');
    const kept = (await upload(installer, await png(), 'kept.png')).body.media;
    const keptRow = (await Media.findByPk(kept.id))!;
    // Refused after the bytes began streaming into storage: what was stored is removed again.
    const c = config() as { UPLOAD_MAX_PHOTO_MB: number };
    const saved = c.UPLOAD_MAX_PHOTO_MB;
    c.UPLOAD_MAX_PHOTO_MB = 1;
    try {
      const big = Buffer.concat([await jpeg(), Buffer.alloc(12 * 1024 * 1024, 7)]);
      expect((await upload(installer, big, 'too-big.jpg')).status).toBe(413);
    } finally {
      c.UPLOAD_MAX_PHOTO_MB = saved;
    }
    const late = await installer
      .post(`/api/builds/${build.id}/media`)
      .attach('file', mp4(9 * 1024 * 1024), 'late.mp4')
      .field('upgradeId', String(otherUpgrade.id));
    expect(late.status).toBe(400);
    const stored: string[] = [];
    for await (const o of listKeys('builds/')) stored.push(o.key);
    expect(stored.sort()).toEqual([keptRow.objectKey, keptRow.thumbKey].sort());

    await putBuffer(`builds/${build.id}/2026-01/orphan.jpg`, await jpeg(), 'image/jpeg');
    const dry = await sweepOrphans({ graceMs: 0 });
    expect(dry.orphans.map((o) => o.key)).toEqual([`builds/${build.id}/2026-01/orphan.jpg`]);
    // Fresh objects (an upload in progress) are left alone by default.
    expect((await sweepOrphans()).orphans).toEqual([]);
    const wet = await sweepOrphans({ graceMs: 0, remove: true });
    expect(wet.removed).toBe(1);
    const left: string[] = [];
    for await (const o of listKeys('builds/')) left.push(o.key);
    expect(left.sort()).toEqual([keptRow.objectKey, keptRow.thumbKey].sort());
  });

  it('storage stopped mid-way: a clear 503, no row, no temp file, the server keeps serving', async () => {
    const installer = await as('installer');
    expect((await anonymous().get('/api/health')).body.storage).toBe(true);
    await own.stop();
    const before = await counts(...TABLES);
    const res = await upload(installer, await jpeg(), 'while-down.jpg', { upgradeId: upgrade.id });
    expect(res.status).toBe(503);
    expect(res.body.error).toMatchObject({ code: 'storage_unavailable' });
    expect(res.body.error.message).toMatch(/cannot be reached.*nothing was saved/);
    expect(await counts(...TABLES)).toEqual(before);
    expect(readdirSync(uploadDir)).toEqual([]);
    // Other requests still answer, and health says what is wrong.
    expect((await installer.get('/api/auth/me')).status).toBe(200);
    const health = await anonymous().get('/api/health');
    expect(health.body).toMatchObject({ db: true, storage: false, ok: false });
    // The store comes back on the same port: uploads work again.
    own = await startFakeS3({ directory: dir, bucket: storageSettings().bucket, port: own.port });
    configureStorage({ endpoint: own.endpoint });
    expect((await upload(installer, await png(), 'back.png')).status).toBe(201);
  });
});
