// Demo media for "Project Tern": a few small invented pictures generated here with sharp (plain
// shapes and gradients in the Bayslate palette, no text, no real photos), stored in object storage
// with thumbnails and attached to demo upgrades as before/during/after photos. Demo mode only.
import { createHash, randomUUID } from 'node:crypto';
import sharp from 'sharp';
import type { MigrationContext } from '../migrate';
import { Build, Media, Upgrade, User } from '../../models';
import { putBuffer, storageSettings, usesLocalFake } from '../../storage';
import { startLocalS3, stopLocalS3 } from '../../storage/localS3';
import type { MediaStage } from '../../../shared/domain';

interface DemoPhoto {
  upgrade: string; // upgrade title in seeder 0002
  stage: MediaStage;
  caption: string;
  colors: [string, string];
  shape: 'bars' | 'circle' | 'arc' | 'grid';
}

const PHOTOS: DemoPhoto[] = [
  {
    upgrade: 'Projector LED headlamps',
    stage: 'before',
    caption: 'Stock halogen housings on the bench',
    colors: ['#33363c', '#a3a7ae'],
    shape: 'circle',
  },
  {
    upgrade: 'Projector LED headlamps',
    stage: 'during',
    caption: 'Bumper cover off, housings out',
    colors: ['#25272b', '#8a6414'],
    shape: 'grid',
  },
  {
    upgrade: 'Projector LED headlamps',
    stage: 'after',
    caption: 'Projectors aimed on the wall chart',
    colors: ['#3d5a73', '#f1ede4'],
    shape: 'circle',
  },
  {
    upgrade: 'Roof rails',
    stage: 'before',
    caption: 'Bare roof, plugs still in',
    colors: ['#5c616b', '#e4dfd3'],
    shape: 'bars',
  },
  {
    upgrade: 'Roof rails',
    stage: 'after',
    caption: 'Rails torqued and sealed',
    colors: ['#3f6b45', '#faf8f3'],
    shape: 'bars',
  },
  {
    upgrade: 'Trailer wiring, 7-pin',
    stage: 'during',
    caption: 'Harness routed along the frame rail',
    colors: ['#1d1f22', '#b34a14'],
    shape: 'arc',
  },
  {
    upgrade: 'Heated steering wheel',
    stage: 'during',
    caption: 'Wheel off, clockspring in place',
    colors: ['#6a4a78', '#f6dccb'],
    shape: 'circle',
  },
  {
    upgrade: 'Blind-spot radar',
    stage: 'after',
    caption: 'Sensor brackets behind the new cover',
    colors: ['#3d5a73', '#6f93b3'],
    shape: 'grid',
  },
];

function svgFor(p: DemoPhoto, w = 960, h = 640): string {
  const [a, b] = p.colors;
  const shapes: Record<DemoPhoto['shape'], string> = {
    circle: `<circle cx="${w * 0.62}" cy="${h * 0.5}" r="${h * 0.3}" fill="${b}" fill-opacity="0.55"/><circle cx="${w * 0.62}" cy="${h * 0.5}" r="${h * 0.14}" fill="${a}" fill-opacity="0.7"/>`,
    bars: [0, 1, 2]
      .map(
        (i) =>
          `<rect x="${w * 0.12}" y="${h * (0.28 + i * 0.18)}" width="${w * 0.76}" height="${h * 0.06}" rx="8" fill="${b}" fill-opacity="0.6"/>`,
      )
      .join(''),
    arc: `<path d="M ${w * 0.08} ${h * 0.8} Q ${w * 0.5} ${h * 0.05} ${w * 0.92} ${h * 0.7}" stroke="${b}" stroke-width="28" fill="none" stroke-linecap="round"/>`,
    grid: Array.from(
      { length: 12 },
      (_, i) =>
        `<rect x="${w * 0.1 + (i % 4) * w * 0.2}" y="${h * 0.18 + Math.floor(i / 4) * h * 0.24}" width="${w * 0.16}" height="${h * 0.18}" rx="10" fill="${b}" fill-opacity="${0.25 + (i % 3) * 0.2}"/>`,
    ).join(''),
  };
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}"><defs><linearGradient id="g" x1="0" y1="0" x2="1" y2="1"><stop offset="0" stop-color="${a}"/><stop offset="1" stop-color="${b}"/></linearGradient></defs><rect width="100%" height="100%" fill="url(#g)"/>${shapes[p.shape]}</svg>`;
}

export async function up(_: { context: MigrationContext }) {
  const build = await Build.findOne({ where: { slug: 'project-tern' } });
  if (!build || (await Media.count({ where: { buildId: build.id } })) > 0) return;
  const installer = await User.findOne({ where: { email: 'installer@cedar-ridge.test' } });
  // Run on its own (scripts/db-setup.ts without S3_ENDPOINT), start the local fake for the while.
  const startedHere = usesLocalFake() && !storageSettings().endpoint;
  if (startedHere) await startLocalS3();
  try {
    for (const [i, p] of PHOTOS.entries()) {
      const upgrade = await Upgrade.findOne({ where: { buildId: build.id, title: p.upgrade } });
      if (!upgrade) continue;
      const jpeg = await sharp(Buffer.from(svgFor(p)))
        .jpeg({ quality: 82 })
        .toBuffer();
      const thumb = await sharp(jpeg)
        .resize({ width: 400, height: 400, fit: 'inside' })
        .webp({ quality: 72 })
        .toBuffer();
      const base = `builds/${build.id}/demo/${randomUUID()}`;
      await putBuffer(`${base}.jpg`, jpeg, 'image/jpeg');
      await putBuffer(`${base}.thumb.webp`, thumb, 'image/webp');
      await Media.create({
        buildId: build.id,
        upgradeId: upgrade.id,
        episodeId: upgrade.episodeId,
        partId: null,
        kind: 'photo',
        stage: p.stage,
        caption: p.caption,
        objectKey: `${base}.jpg`,
        thumbKey: `${base}.thumb.webp`,
        originalName: `tern-${String(i + 1).padStart(2, '0')}-${p.stage}.jpg`,
        contentType: 'image/jpeg',
        sizeBytes: jpeg.length,
        sha256: createHash('sha256').update(jpeg).digest('hex'),
        uploadedBy: installer?.id ?? null,
      });
    }
  } finally {
    if (startedHere) await stopLocalS3();
  }
}

export async function down() {}
