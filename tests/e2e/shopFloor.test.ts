// The installer works the shop floor on a phone: lands there after sign-in, reads a caution once,
// a double tap that does not skip a state, the ten-second undo, installing with a part not received,
// hours, the photo stage at 320 px, and both colour modes audited with axe.
// SHOP_FLOOR_SCREENS=<folder> also saves screenshots of the shop floor at 390 px in both modes.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import path from 'node:path';
import {
  openBrowser,
  signIn,
  signInQuick,
  audit,
  startAppServer,
  type AppServer,
  type BrowserSession,
} from '../helpers/browser';
import { setColourMode } from '../helpers/theme';
import { Activity, Build, LabourEntry, Upgrade } from '../../server/models';

let server: AppServer;
let buildId: number;
beforeAll(async () => {
  server = await startAppServer();
  buildId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
});
afterAll(async () => {
  await server?.stop();
});

const card = (s: BrowserSession, title: string) =>
  s.page.getByRole('listitem').filter({ has: s.page.getByRole('heading', { name: new RegExp(title) }) });
const screens = process.env.SHOP_FLOOR_SCREENS;

/** The page height and the first action button's top, both in CSS pixels from the top of the page. */
const measure = (s: BrowserSession) =>
  s.page.evaluate(() => {
    const first = document.querySelector('[data-test="next-action"]')!.getBoundingClientRect();
    return {
      pageHeight: document.documentElement.scrollHeight,
      firstButtonTop: Math.round(first.top + window.scrollY),
      firstButtonBottom: Math.round(first.bottom + window.scrollY),
    };
  });

describe('shop floor on a phone', () => {
  it(
    'installer at 390 px: lands on the floor, first button on the first screen, caution once, no skipped state, undo, parts asked, hours',
    { timeout: 180_000 },
    async () => {
      const s = await openBrowser({ server, phone: true });
      const { page } = s;
      try {
        await signIn(s, 'installer');
        await page.waitForURL(`**/builds/${buildId}/shop-floor`);
        await page.getByRole('heading', { name: 'In the bay now' }).waitFor();
        await page.getByRole('heading', { name: 'Episode 7: Ready to tow' }).waitFor();
        // The in-bay wheel of a draft episode is reachable, first.
        await card(s, 'Heated steering wheel')
          .getByText(/^Episode \d+: /)
          .waitFor();
        expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
        const light = await measure(s);
        console.log(`[shop floor 390 light] ${JSON.stringify(light)}`);
        if (screens) await page.screenshot({ path: path.join(screens, 'shop-floor-390-light.png') });
        if (screens)
          await page.screenshot({ path: path.join(screens, 'shop-floor-390-light-full.png'), fullPage: true });
        expect(light.firstButtonBottom).toBeLessThanOrEqual(844);

        // Safety caution: the full text until read, then one line; the reading is recorded.
        const wheel = card(s, 'Heated steering wheel');
        const wheelId = (await Upgrade.findOne({ where: { buildId, title: 'Heated steering wheel' } }))!.id;
        await wheel.getByText(/Cut power and wait the stated time/).waitFor();
        await wheel.getByRole('button', { name: 'I have read this caution for Heated steering wheel' }).click();
        await wheel.getByRole('button', { name: 'Read the caution for Heated steering wheel' }).waitFor();
        expect(await Activity.count({ where: { buildId, entityId: wheelId, action: 'caution_read' } })).toBe(1);

        // A double tap on Start starts the job and nothing more.
        const charger = card(s, 'Wireless charging pad');
        const u = (await Upgrade.findOne({ where: { buildId, title: 'Wireless charging pad' } }))!;
        const updatesBefore = await Activity.count({
          where: { buildId, entityId: u.id, entity: 'upgrade', action: 'update' },
        });
        const action = charger.locator('[data-test="next-action"]');
        const startBox = (await action.boundingBox())!;
        expect(startBox.height).toBeGreaterThanOrEqual(48);
        // Where the action sits inside its card (the page itself scrolls as the person works).
        const startOffset = startBox.y - (await charger.boundingBox())!.y;
        await charger.getByRole('button', { name: 'Start Wireless charging pad' }).dblclick();
        await page.locator('[data-test="undo-bar"]').getByText('Wireless charging pad started.').waitFor();
        await charger.getByText('In the bay · filmed: nothing yet').waitFor();
        await charger
          .getByRole('button', { name: 'Install segment shot for Wireless charging pad' })
          .and(page.locator(':enabled'))
          .waitFor();
        await u.reload();
        expect([u.installState, u.installSegment]).toEqual(['in_bay', 'not_shot']);
        expect(await Activity.count({ where: { buildId, entityId: u.id, entity: 'upgrade', action: 'update' } })).toBe(
          updatesBefore + 1,
        );
        await audit(s, 'shop floor after start (light)', { contrast: true });

        // The undo steps the start back, recorded.
        await page.locator('[data-test="undo-bar"]').getByRole('button', { name: /Undo/ }).click();
        await charger.getByText('Queued · filmed: nothing yet').waitFor();
        expect(await Activity.count({ where: { buildId, entityId: u.id, action: 'step_back' } })).toBe(1);

        // Start, film, installed (asked about the part not received), demo: done, in the same place.
        await charger.getByRole('button', { name: 'Start Wireless charging pad' }).click();
        await charger
          .getByRole('button', { name: 'Install segment shot for Wireless charging pad' })
          .and(page.locator(':enabled'))
          .click();
        await charger
          .getByRole('button', { name: 'Mark installed Wireless charging pad' })
          .and(page.locator(':enabled'))
          .click();
        const dialog = page.getByRole('dialog', { name: 'Parts not received' });
        await dialog.getByText(/Wireless charging pad, 15 W \(Ordered, due 2026-12-02\)/).waitFor();
        await audit(s, 'parts not received dialog');
        await dialog.getByRole('button', { name: 'Mark installed anyway' }).click();
        await charger.getByText('Installed · filmed: install').waitFor();
        await charger
          .getByRole('button', { name: 'Demo segment shot for Wireless charging pad' })
          .and(page.locator(':enabled'))
          .click();
        await charger.getByRole('button', { name: 'Done Wireless charging pad' }).waitFor();
        const doneBox = (await charger.getByRole('button', { name: 'Done Wireless charging pad' }).boundingBox())!;
        expect(Math.abs(doneBox.y - (await charger.boundingBox())!.y - startOffset)).toBeLessThanOrEqual(1);
        await u.reload();
        expect([u.installState, u.installSegment, u.demoSegment]).toEqual(['installed', 'shot', 'shot']);
        expect(await Activity.count({ where: { buildId, entityId: u.id, action: 'update' } })).toBe(updatesBefore + 5);

        // Hours: logged, then shown on the card and in today's total.
        const before = await LabourEntry.count({ where: { upgradeId: u.id } });
        await charger.getByRole('button', { name: 'Hours on Wireless charging pad' }).click();
        const form = page.getByRole('form', { name: 'Log hours on Wireless charging pad' });
        await form.getByLabel('Hours').fill('1.5');
        await audit(s, 'shop floor hours form');
        await form.getByRole('button', { name: 'Save hours' }).click();
        await charger.getByText('Hours: mine 1.5 h · all 1.5 h of 1.5 h').waitFor();
        expect(await LabourEntry.count({ where: { upgradeId: u.id } })).toBe(before + 1);

        // 320 px: the photo stage words stay whole (one line each), nothing scrolls sideways.
        await page.setViewportSize({ width: 320, height: 700 });
        await charger.getByRole('button', { name: 'Photos of Wireless charging pad' }).click();
        const stages = charger.locator('.stage');
        await stages.first().waitFor();
        // A label of one line is 48 px tall (its minimum); a word broken letter by letter made it far taller.
        const heights = await stages.evaluateAll((els) => els.map((e) => e.getBoundingClientRect().height));
        expect(heights).toHaveLength(3);
        for (const h of heights) expect(h).toBeLessThanOrEqual(52);
        expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(320);
        await audit(s, 'shop floor at 320 px with photos open');
        await page.setViewportSize({ width: 390, height: 844 });

        // Dark mode: the top bar, the menu and the floor follow it; axe on all of them.
        await setColourMode(page, 'dark');
        await page.getByRole('heading', { name: 'Episode 7: Ready to tow' }).waitFor();
        const bar = await page.evaluate(() => getComputedStyle(document.querySelector('.topbar')!).backgroundColor);
        expect(bar).toBe('rgb(37, 39, 43)');
        await audit(s, 'shop floor (dark)', { contrast: true });
        const dark = await measure(s);
        console.log(`[shop floor 390 dark] ${JSON.stringify(dark)}`);
        if (screens) await page.screenshot({ path: path.join(screens, 'shop-floor-390-dark.png') });
        if (screens)
          await page.screenshot({ path: path.join(screens, 'shop-floor-390-dark-full.png'), fullPage: true });
        await page.getByRole('button', { name: 'Open the menu' }).click();
        await page.getByRole('navigation', { name: 'Menu' }).waitFor();
        await audit(s, 'phone menu (dark)', { contrast: true });
      } finally {
        await s.close();
      }
    },
  );

  it(
    // The two-second promise is the server's part and is measured in tests/api/events.test.ts; here,
    // on a machine that may be running other suites, the journey waits for the change to arrive and
    // checks that the page was not reloaded (seen: 2.0 s exceeded under a load of 30).
    "a producer's second browser sees the installer's mark live, without reloading",
    { timeout: 120_000 },
    async () => {
      const installer = await openBrowser({ server, phone: true });
      const producer = await openBrowser({ server });
      try {
        await signInQuick(producer, 'producer');
        await producer.page.goto(`${server.url}/builds/${buildId}/shop-floor`);
        const watched = card(producer, 'Trailer wiring, 7-pin');
        await watched.getByText('In the bay · filmed: nothing yet').waitFor();
        await signIn(installer, 'installer');
        await installer.page.waitForURL(`**/builds/${buildId}/shop-floor`);
        await card(installer, 'Trailer wiring, 7-pin')
          .getByRole('button', { name: 'Install segment shot for Trailer wiring, 7-pin' })
          .click();
        await producer.page.evaluate(() => ((window as unknown as { notReloaded: boolean }).notReloaded = true));
        const marked = Date.now();
        await watched.getByText('In the bay · filmed: install').waitFor();
        console.log(`[shop floor live] the producer saw the mark after ${Date.now() - marked} ms`);
        expect(
          await producer.page.evaluate(() => (window as unknown as { notReloaded?: boolean }).notReloaded),
          'the same page, not reloaded',
        ).toBe(true);
        await audit(producer, 'shop floor (producer, live)');
      } finally {
        await installer.close();
        await producer.close();
      }
    },
  );
});
