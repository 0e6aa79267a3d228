// The installer works an upgrade on the shop floor at phone width: blocked start with its reason,
// start another, mark installed and both segments shot, log hours.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { openBrowser, signIn, audit, visit, startAppServer, type AppServer } from '../helpers/browser';
import { Build, LabourEntry, Upgrade } from '../../server/models';

let server: AppServer;
let buildId: number;
beforeAll(async () => {
  server = await startAppServer();
  buildId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
});
afterAll(async () => {
  await server?.stop();
});

describe('shop floor on a phone', () => {
  it('installer at 390px works an upgrade from start to filmed and logs hours', { timeout: 120_000 }, async () => {
    const s = await openBrowser({ server, phone: true });
    const { page } = s;
    try {
      await signIn(s, 'installer');
      await visit(s, `/builds/${buildId}/shop-floor`);
      await page.getByRole('heading', { name: 'Episode 7: Ready to tow' }).waitFor();
      const width = await page.evaluate(() => document.documentElement.scrollWidth);
      expect(width).toBeLessThanOrEqual(390);

      // Blocked by a prerequisite: the start button is disabled and says why.
      const brake = page.getByRole('listitem').filter({ has: page.getByRole('heading', { name: /Trailer brake controller/ }) });
      const startBrake = brake.getByRole('button', { name: 'Start Trailer brake controller' });
      expect(await startBrake.isDisabled()).toBe(true);
      await brake.getByText('Cannot start yet: install Trailer wiring, 7-pin first.').waitFor();
      await brake.getByRole('note', { name: /Safety: Brakes and trailer brakes/ }).waitFor();

      // Another one starts.
      const charger = page.getByRole('listitem').filter({ has: page.getByRole('heading', { name: /Wireless charging pad/ }) });
      const start = charger.getByRole('button', { name: 'Start Wireless charging pad' });
      const box = await start.boundingBox();
      expect(box!.height).toBeGreaterThanOrEqual(48);
      await start.click();
      await charger.getByText('In the bay').waitFor();
      await audit(s, 'shop floor after start');
      await charger.getByRole('button', { name: 'Mark installed Wireless charging pad' }).click();
      await charger.getByText('Installed', { exact: true }).waitFor();
      await charger.getByRole('button', { name: 'Install segment shot for Wireless charging pad' }).click();
      await charger.getByText('Install shot', { exact: true }).waitFor();
      await charger.getByRole('button', { name: 'Demo segment shot for Wireless charging pad' }).click();
      await charger.getByText('Demo shot', { exact: true }).waitFor();
      await page.getByText(/1 of 3 done/).waitFor();
      const u = await Upgrade.findOne({ where: { buildId, title: 'Wireless charging pad' } });
      expect([u!.installState, u!.installSegment, u!.demoSegment]).toEqual(['installed', 'shot', 'shot']);

      // Quick hours.
      const before = await LabourEntry.count({ where: { upgradeId: u!.id } });
      await charger.getByRole('button', { name: 'Log hours on Wireless charging pad' }).click();
      const form = page.getByRole('form', { name: 'Log hours on Wireless charging pad' });
      await form.getByLabel('Hours').fill('1.5');
      await audit(s, 'shop floor hours form');
      await form.getByRole('button', { name: 'Save hours' }).click();
      await page.getByText('1.5 h logged on Wireless charging pad.').waitFor();
      await form.waitFor({ state: 'detached' });
      expect(await LabourEntry.count({ where: { upgradeId: u!.id } })).toBe(before + 1);
      await audit(s, 'shop floor after logging hours');
    } finally {
      await s.close();
    }
  });
});
