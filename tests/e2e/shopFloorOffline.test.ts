// The shop floor without the network, at 390 px: the installer opens it online, the Wi-Fi drops, the
// page reloads from the service worker with the copy the phone kept, two upgrades are worked (marks
// with a double tap and an undo, hours, a photo) into the outbox while the producer changes one of
// them; back online everything arrives in order (checked in the database) and the producer's
// conflicting change is shown to the installer, not lost. OFFLINE_SCREENS=<folder> saves screenshots.
import { describe, it, expect } from 'vitest';
import path from 'node:path';
import sharp from 'sharp';
import { request } from 'playwright-core';
import { openBrowser, audit, signIn, BROWSER_WAIT_MS, type BrowserSession } from '../helpers/browser';
import { DEMO_EMAIL, DEMO_PASSWORD } from '../helpers/api';
import { freshAppPerTest, ternId } from '../helpers/fresh-db';
import { setColourMode } from '../helpers/theme';

const app = freshAppPerTest();
const screens = process.env.OFFLINE_SCREENS;

const card = (s: BrowserSession, title: string) =>
  s.page.getByRole('listitem').filter({ has: s.page.getByRole('heading', { name: new RegExp(title) }) });
const waitingCount = (s: BrowserSession, n: number) =>
  s.page
    .locator('[data-test="waiting-count"]', { hasText: `${n} ${n === 1 ? 'change' : 'changes'} waiting to send` })
    .waitFor();

interface UpgradeRow extends Record<string, unknown> {
  id: number;
  version: number;
  install_state: string;
  install_segment: string;
  priority: number;
}

/** The top of the shop floor with the waiting indicator folded, once the toasts have gone. */
async function screenshot(s: BrowserSession, name: string) {
  await s.page.locator('.n-message').first().waitFor({ state: 'detached', timeout: BROWSER_WAIT_MS });
  const hide = s.page.getByRole('button', { name: 'Hide the changes waiting to send' });
  if (await hide.count()) await hide.click();
  await s.page.evaluate(() => window.scrollTo(0, 0));
  await s.page.screenshot({ path: path.join(screens!, name) });
}

describe('shop floor offline', () => {
  it(
    'installer at 390 px works two upgrades offline; everything arrives in order and the conflict is shown',
    { timeout: 240_000 },
    async () => {
      const { server, db } = app();
      const buildId = await ternId(db);
      const row = async (title: string) =>
        (
          await db.sql<UpgradeRow>(
            `SELECT id, version, install_state, install_segment, priority FROM upgrades WHERE build_id = $1 AND title = $2`,
            [buildId, title],
          )
        )[0]!;
      const charger = await row('Wireless charging pad');
      const wiring = await row('Trailer wiring, 7-pin');
      expect([charger.install_state, wiring.install_state, wiring.install_segment]).toEqual([
        'queued',
        'in_bay',
        'not_shot',
      ]);
      const activityBefore = Number(
        (await db.sql<{ n: string }>(`SELECT coalesce(max(id), 0) AS n FROM activities`))[0]!.n,
      );
      const labourBefore = Number(
        (
          await db.sql<{ n: string }>(`SELECT count(*) AS n FROM labour_entries WHERE upgrade_id = ANY($1)`, [
            [charger.id, wiring.id],
          ])
        )[0]!.n,
      );

      const s = await openBrowser({ server, phone: true });
      const { page, context } = s;
      const problems: string[] = [];
      page.on('pageerror', (e) => problems.push(e.message));
      page.on('console', (m) => m.type() === 'error' && problems.push(m.text()));
      try {
        // Online: the shop floor loads (the phone keeps its answer) and the service worker takes the app shell.
        await signIn(s, 'installer');
        await page.waitForURL(`**/builds/${buildId}/shop-floor`);
        await page.getByRole('heading', { name: 'Episode 7: Ready to tow' }).waitFor();
        await page.evaluate(async () => {
          await navigator.serviceWorker.ready;
        });

        // The Wi-Fi drops; a reload opens from the service worker's shell and the phone's copy.
        await context.setOffline(true);
        await page.reload();
        await page.locator('[data-test="offline-note"]', { hasText: "Offline: this phone's copy from" }).waitFor();
        await page.getByRole('heading', { name: 'Episode 7: Ready to tow' }).waitFor();
        // The build's own "cannot be reached" (its header could not load) gives way to the note above.
        await page.locator('.load-error').waitFor({ state: 'attached' });
        expect(await page.locator('.load-error').isVisible()).toBe(false);

        // A double tap on Start, offline: one change waits, the job is started and nothing more.
        const c = card(s, 'Wireless charging pad');
        await c.getByRole('button', { name: 'Start Wireless charging pad' }).dblclick();
        await page
          .locator('[data-test="undo-bar"]')
          .getByText('Wireless charging pad started. Waiting to send.')
          .waitFor();
        await waitingCount(s, 1);
        await c.getByText('In the bay · filmed: nothing yet').waitFor();
        const shot = c
          .getByRole('button', { name: 'Install segment shot for Wireless charging pad' })
          .and(page.locator(':enabled'));
        // The undo of a waiting mark takes it out of the outbox.
        await shot.click();
        await waitingCount(s, 2);
        await page.locator('[data-test="undo-bar"]').getByRole('button', { name: /Undo/ }).click();
        await waitingCount(s, 1);
        await c.getByText('In the bay · filmed: nothing yet').waitFor();
        await shot.click();
        await waitingCount(s, 2);
        await c.getByText('In the bay · filmed: install').waitFor();

        // The other upgrade: its install segment filmed.
        const w = card(s, 'Trailer wiring, 7-pin');
        await w
          .getByRole('button', { name: 'Install segment shot for Trailer wiring, 7-pin' })
          .and(page.locator(':enabled'))
          .click();
        await waitingCount(s, 3);

        // Hours on both, kept on the phone and already counted on the cards.
        for (const [title, hours, n] of [
          ['Wireless charging pad', '1.5', 4],
          ['Trailer wiring, 7-pin', '2', 5],
        ] as const) {
          await card(s, title)
            .getByRole('button', { name: `Hours on ${title}` })
            .click();
          const form = page.getByRole('form', { name: `Log hours on ${title}` });
          await form.getByLabel('Hours').fill(hours);
          await form.getByRole('button', { name: 'Save hours' }).click();
          await waitingCount(s, n);
        }
        await c.getByText(/Hours: mine 1\.5 h/).waitFor();

        // A photo of the charger, kept with its stage.
        await c.getByRole('button', { name: 'Photos of Wireless charging pad' }).click();
        const photo = await sharp({ create: { width: 320, height: 240, channels: 3, background: '#3d5a73' } })
          .jpeg()
          .toBuffer();
        await c
          .locator('[data-test="offline-photo-input"]')
          .setInputFiles({ name: 'charger-offline.jpg', mimeType: 'image/jpeg', buffer: photo });
        await waitingCount(s, 6);
        await page.getByRole('button', { name: 'Show the changes waiting to send' }).click();
        await page.getByRole('progressbar', { name: 'Upload of charger-offline.jpg' }).waitFor();
        expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
        await audit(s, 'shop floor offline, six changes waiting (light)', { contrast: true });
        if (screens) await screenshot(s, 'offline-light.png');

        // Dark mode (this reloads the page, offline again from the service worker); the outbox survives.
        await setColourMode(page, 'dark');
        await waitingCount(s, 6);
        await audit(s, 'shop floor offline, six changes waiting (dark)');
        if (screens) await screenshot(s, 'offline-dark.png');

        // Another screen, offline: the shell opens from the service worker and says the screen needs the network.
        await page.goto(`${server.url}/builds/${buildId}/backlog`);
        await page.locator('[data-test="app-offline"]', { hasText: 'This screen needs the network' }).waitFor();
        await audit(s, 'backlog offline (dark)');
        await page.goto(`${server.url}/builds/${buildId}/shop-floor`);
        await waitingCount(s, 6);

        // Meanwhile the producer changes the trailer wiring: the installer's queued mark is now stale.
        const producer = await request.newContext({
          baseURL: server.url,
          extraHTTPHeaders: { 'X-Requested-With': 'Bayslate', Accept: 'application/json' },
        });
        try {
          expect(
            (
              await producer.post('/api/auth/login', { data: { email: DEMO_EMAIL.producer, password: DEMO_PASSWORD } })
            ).status(),
          ).toBe(200);
          const newPriority = wiring.priority === 1 ? 2 : 1;
          const patched = await producer.patch(`/api/builds/${buildId}/upgrades/${wiring.id}`, {
            data: { priority: newPriority, version: wiring.version },
          });
          expect(patched.status()).toBe(200);
        } finally {
          await producer.dispose();
        }

        // Back online: the outbox goes in order; the stale mark is answered 409 and shown.
        const refused = page.waitForResponse(
          (r) => r.request().method() === 'PATCH' && r.url().endsWith(`/upgrades/${wiring.id}`),
        );
        const uploaded = page.waitForResponse(
          (r) => r.request().method() === 'POST' && new URL(r.url()).pathname === `/api/builds/${buildId}/media`,
        );
        await context.setOffline(false);
        expect((await refused).status()).toBe(409);
        expect((await uploaded).status()).toBe(201);
        const notice = page.locator('[data-test="refusals"] li', { hasText: 'Trailer wiring, 7-pin' });
        await notice.getByText('Install segment shot', { exact: true }).waitFor();
        await notice.getByText('Someone else changed this record since you loaded it.', { exact: false }).waitFor();
        await page.locator('[data-test="outbox"]').waitFor({ state: 'detached' });
        await audit(s, 'shop floor back online with a refused change (dark)');

        // In the database: the charger's two marks in order, both hours, the photo; the wiring keeps the producer's change.
        const c2 = await row('Wireless charging pad');
        expect([c2.install_state, c2.install_segment, c2.version]).toEqual(['in_bay', 'shot', charger.version + 2]);
        const w2 = await row('Trailer wiring, 7-pin');
        expect([w2.install_segment, w2.priority]).toEqual(['not_shot', wiring.priority === 1 ? 2 : 1]);
        const marks = await db.sql<{ changes: Record<string, unknown> }>(
          `SELECT changes FROM activities WHERE entity = 'upgrade' AND entity_id = $1 AND action = 'update' AND id > $2 ORDER BY id`,
          [charger.id, activityBefore],
        );
        expect(
          marks.map((m) =>
            Object.keys(m.changes)
              .filter((k) => k !== 'version')
              .sort(),
          ),
        ).toEqual([['installState'], ['installSegment']]);
        const labour = await db.sql<{ upgrade_id: number; hours: number }>(
          `SELECT upgrade_id, hours FROM labour_entries WHERE upgrade_id = ANY($1) ORDER BY id`,
          [[charger.id, wiring.id]],
        );
        expect(labour.length).toBe(labourBefore + 2);
        expect(labour.slice(-2).map((l) => [l.upgrade_id, l.hours])).toEqual([
          [charger.id, 1.5],
          [wiring.id, 2],
        ]);
        const media = await db.sql<{ stage: string }>(
          `SELECT stage FROM media WHERE upgrade_id = $1 AND original_name = 'charger-offline.jpg'`,
          [charger.id],
        );
        expect(media).toEqual([{ stage: 'during' }]);
        // Each of the six waiting changes went with its own key (a resend would get its first answer back).
        const receipts = await db.sql<{ status: number }>(`SELECT status FROM request_receipts ORDER BY status`);
        expect(receipts.map((r) => r.status)).toEqual([200, 200, 201, 201, 201, 409]);

        // The notice stays until dismissed, across a reload.
        await page.reload();
        await notice.getByText('Install segment shot', { exact: true }).waitFor();
        await notice.getByRole('button', { name: /Dismiss/ }).click();
        await page.locator('[data-test="refusals"]').waitFor({ state: 'detached' });
      } catch (e) {
        if (screens) await page.screenshot({ path: path.join(screens, 'offline-failure.png') });
        throw new Error(`${(e as Error).message}\nbrowser said:\n${problems.join('\n')}`);
      } finally {
        await s.close();
      }
    },
  );
});
