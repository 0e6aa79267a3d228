// Media in the browser: an installer on a phone uploads photos to an upgrade with a progress bar
// per file and sees them; the producer browses the demo photos, previews, edits and deletes;
// marketing reads without an upload button. axe-core audits each screen and dialog.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { openBrowser, audit, visit, BROWSER_WAIT_MS, type BrowserSession } from '../helpers/browser';
import { DEMO_EMAIL, DEMO_PASSWORD, type DemoRole } from '../helpers/api';
import { freshAppPerTest, ternId as ternIdIn } from '../helpers/fresh-db';
import { outcomeOf } from '../helpers/outcome';

let dir: string;
beforeAll(async () => {
  dir = mkdtempSync(path.join(os.tmpdir(), 'bayslate-e2e-media-'));
});
afterAll(async () => {
  rmSync(dir, { recursive: true, force: true });
});
// Each test runs on a database of its own, cloned from the template as it starts.
const app = freshAppPerTest();

async function apiGet<T>(s: BrowserSession, p: string): Promise<T> {
  const res = await s.page.request.get(s.server.url + p, {
    headers: { 'X-Requested-With': 'Bayslate', Accept: 'application/json' },
  });
  expect(res.status(), `${p} answered ${res.status()}`).toBe(200);
  return (await res.json()) as T;
}
const ternId = () => ternIdIn(app().db);
/** Signs in through the form from a deep link, as a person following a link would. */
async function signInTo(s: BrowserSession, role: DemoRole, next: string) {
  await visit(s, `/sign-in?next=${encodeURIComponent(next)}`);
  await s.page.getByLabel('E-mail').fill(DEMO_EMAIL[role]);
  await s.page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await s.page.getByRole('button', { name: 'Sign in' }).click();
  await s.page.waitForURL((u) => u.pathname === next.split('?')[0]);
  await audit(s);
}
/** A photo of noise (does not compress), so its upload takes long enough to watch. */
async function noisyJpeg(name: string) {
  const file = path.join(dir, name);
  await sharp({
    create: {
      width: 1400,
      height: 1000,
      channels: 3,
      background: '#5c616b',
      noise: { type: 'gaussian', mean: 120, sigma: 40 },
    },
  })
    .jpeg({ quality: 95 })
    .toFile(file);
  return file;
}
/** True once every <img> in the locator has loaded pixels (the presigned URL worked). */
async function imagesLoaded(s: BrowserSession, selector: string) {
  await s.page.waitForFunction(
    (sel) => {
      const imgs = Array.from(document.querySelectorAll<HTMLImageElement>(sel));
      return imgs.length > 0 && imgs.every((i) => i.complete && i.naturalWidth > 0);
    },
    selector,
    { timeout: BROWSER_WAIT_MS },
  );
}

describe('media in the browser', () => {
  it('an installer at 390 px uploads photos to an upgrade with progress and sees them', async () => {
    const s = await openBrowser({ server: app().server, phone: true });
    try {
      const buildId = await ternId();
      await signInTo(s, 'installer', `/builds/${buildId}/media`);
      const { upgrades } = await apiGet<{ upgrades: { id: number; title: string }[] }>(
        s,
        `/api/builds/${buildId}/upgrades?pageSize=500`,
      );
      const wiring = upgrades.find((u) => u.title === 'Trailer wiring, 7-pin')!;
      const before = (await apiGet<{ total: number }>(s, `/api/builds/${buildId}/media?upgradeId=${wiring.id}`)).total;

      // From the upgrade's context (the address an upgrade links to).
      await visit(s, `/builds/${buildId}/media?upgradeId=${wiring.id}`);
      await s.page.getByRole('heading', { name: /Add photos or footage to “Trailer wiring, 7-pin”/ }).waitFor();
      const input = s.page.locator('[data-test="media-file-input"]');
      // On a phone the picker offers the camera directly.
      expect(await input.getAttribute('capture')).toBe('environment');
      expect(await input.getAttribute('multiple')).not.toBeNull();
      await s.page.getByText('After', { exact: true }).click();

      // A slow uplink, as in a bay, so the progress is visible while it moves.
      const cdp = await s.context.newCDPSession(s.page);
      await cdp.send('Network.enable');
      await cdp.send('Network.emulateNetworkConditions', {
        offline: false,
        latency: 20,
        downloadThroughput: -1,
        uploadThroughput: 400 * 1024,
      });
      const files = [await noisyJpeg('wiring-loom-1.jpg'), await noisyJpeg('wiring-loom-2.jpg')];
      await input.setInputFiles(files);
      const bars = s.page.locator('[data-test="upload-progress"]');
      await bars.first().waitFor();
      expect(await bars.count()).toBe(2);
      // Part-way: some bytes sent, not all.
      await s.page.waitForFunction(
        () => {
          const b = document.querySelector<HTMLProgressElement>('[data-test="upload-progress"]');
          return !!b && b.value > 0 && b.value < 100;
        },
        null,
        { timeout: BROWSER_WAIT_MS },
      );
      await s.page.getByRole('button', { name: 'Cancel upload of wiring-loom-1.jpg' }).waitFor();
      await audit(s, 'media library, uploads in progress (phone)');
      await cdp.send('Network.emulateNetworkConditions', {
        offline: false,
        latency: 0,
        downloadThroughput: -1,
        uploadThroughput: -1,
      });

      await s.page.waitForFunction(
        () => {
          const st = Array.from(document.querySelectorAll('[data-test="upload-status"]')).map((e) => e.textContent);
          return st.length === 2 && st.every((t) => t === 'Uploaded');
        },
        null,
        { timeout: BROWSER_WAIT_MS },
      );
      expect(
        await s.page
          .locator('[data-test="upload-progress"]')
          .evaluateAll((els) => els.map((e) => (e as HTMLProgressElement).value)),
      ).toEqual([100, 100]);
      // They appear in the upgrade's grid, with thumbnails that load.
      await s.page.locator('.cell', { hasText: 'wiring-loom-1.jpg' }).waitFor();
      await s.page.locator('.cell', { hasText: 'wiring-loom-2.jpg' }).waitFor();
      await imagesLoaded(s, '[data-test="media-grid"] img');
      const after = await apiGet<{
        total: number;
        media: { originalName: string; stage: string; upgradeId: number }[];
      }>(s, `/api/builds/${buildId}/media?upgradeId=${wiring.id}`);
      expect(after.total).toBe(before + 2);
      expect(
        after.media
          .filter((m) => m.originalName.startsWith('wiring-loom'))
          .every((m) => m.stage === 'after' && m.upgradeId === wiring.id),
      ).toBe(true);
      await audit(s, 'media library after upload (phone)');

      // A file that is not a photo is refused with a message, per file.
      const fake = path.join(dir, 'not-a-photo.jpg');
      (await import('node:fs')).writeFileSync(fake, '#!/bin/sh\necho hi\n');
      await input.setInputFiles([fake]);
      await s.page.getByRole('alert').filter({ hasText: 'Bayslate accepts' }).waitFor();
      await audit(s, 'media library, refused file (phone)');
    } finally {
      await s.close();
    }
  });

  it('the producer sees the demo photos, previews one, edits its caption and deletes an upload', async () => {
    const s = await openBrowser({ server: app().server });
    try {
      const buildId = await ternId();
      await signInTo(s, 'producer', `/builds/${buildId}/media`);
      await s.page.getByRole('link', { name: 'Media' }).first().waitFor();
      await s.page.getByText('Stock halogen housings on the bench').waitFor();
      await s.page.getByText('Rails torqued and sealed').waitFor();
      await imagesLoaded(s, '[data-test="media-grid"] img');
      expect(await s.page.locator('[data-test="media-thumb"]').count()).toBeGreaterThanOrEqual(8);
      // The grid loads thumbnails, never the full-size objects.
      const srcs = await s.page
        .locator('[data-test="media-grid"] img')
        .evaluateAll((els) => els.map((e) => (e as HTMLImageElement).src));
      expect(srcs.every((u) => u.includes('.thumb.webp'))).toBe(true);

      // Filter by stage.
      await s.page.locator('[data-test="filter-stage"] .n-base-selection').click();
      await s.page.locator('.n-base-select-option', { hasText: 'Before' }).first().click();
      await s.page.waitForURL(/stage=before/);
      await s.page.getByText('Rails torqued and sealed').waitFor({ state: 'detached' });
      await s.page.getByText('Bare roof, plugs still in').waitFor();
      await audit(s, 'media library filtered by stage');

      await s.page.getByRole('button', { name: 'Open Bare roof, plugs still in' }).click();
      const dialog = s.page.locator('[data-test="media-preview"]');
      await dialog.waitFor();
      await imagesLoaded(s, '[data-test="media-preview"] img');
      await audit(s, 'media preview');
      await dialog.getByLabel('Caption').fill('Bare roof, plugs still in, before the rails');
      await outcomeOf(s.page, () => dialog.getByRole('button', { name: 'Save' }).click(), {
        request: { method: 'PATCH', path: /\/media\/\d+$/ },
        toast: 'Saved.',
      });
      await s.page.keyboard.press('Escape');
      await s.page.getByText('Bare roof, plugs still in, before the rails').waitFor();

      // Delete asks first.
      await s.page.getByRole('button', { name: 'Open Bare roof, plugs still in, before the rails' }).click();
      await dialog.getByRole('button', { name: 'Delete' }).click();
      await s.page.getByText('The file is removed from storage for everyone.').waitFor();
      await audit(s, 'media delete confirmation');
      await s.page.getByRole('button', { name: 'Keep it' }).click();
      await dialog.waitFor();
      await dialog.getByRole('button', { name: 'Delete' }).click();
      await outcomeOf(s.page, () => s.page.locator('.n-dialog').getByRole('button', { name: 'Delete' }).click(), {
        request: { method: 'DELETE', path: /\/media\/\d+$/ },
        toast: 'Deleted.',
      });
      await s.page
        .locator('[data-test="media-grid"]')
        .getByText('Bare roof, plugs still in, before the rails')
        .waitFor({ state: 'detached' });
    } finally {
      await s.close();
    }
  });

  it('marketing browses the library but has no upload button', async () => {
    const s = await openBrowser({ server: app().server });
    try {
      const buildId = await ternId();
      await signInTo(s, 'marketing', `/builds/${buildId}/media`);
      await s.page.getByText('Projectors aimed on the wall chart').waitFor();
      expect(await s.page.locator('[data-test="media-uploader"]').count()).toBe(0);
      await s.page.getByRole('button', { name: 'Open Projectors aimed on the wall chart' }).click();
      await s.page.locator('[data-test="media-preview"]').waitFor();
      expect(await s.page.getByLabel('Caption').count()).toBe(0);
      expect(await s.page.locator('[data-test="media-preview"]').getByRole('button', { name: 'Delete' }).count()).toBe(
        0,
      );
      await audit(s, 'media preview for marketing');
    } finally {
      await s.close();
    }
  });
});
