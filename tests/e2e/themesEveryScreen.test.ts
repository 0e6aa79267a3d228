// Dark mode everywhere: one journey on one fresh database visits every screen of the router (the
// public pages signed out, every signed-in screen as the owner, who may open them all), plus the
// upgrade drawer, a dialog and the shop floor's episode picker open, and runs axe on each in light
// AND dark mode. Any serious or critical violation (contrast included) fails the run; all of them
// are gathered first so one run names every screen that fails.
// THEMES_SCREENS=<folder> also saves screenshots of the drawer, the dialog and the picker at
// 1280 and 390 px in both modes.
import { describe, it, expect } from 'vitest';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import type { Locator } from 'playwright-core';
import { openBrowser, audit, type BrowserSession } from '../helpers/browser';
import { freshApp, ternId } from '../helpers/fresh-db';
import { DEMO_EMAIL, DEMO_PASSWORD } from '../helpers/api';
import { tokenHash } from '../../server/services/viewerPrivacy';
import type { ColourMode } from '../helpers/theme';

const screens = process.env.THEMES_SCREENS;
// THEMES_ALL_SCREENS=<folder>: a screenshot of every screen in each mode, for a look by eye.
const allScreens = process.env.THEMES_ALL_SCREENS;

describe('every screen in both themes', () => {
  it('axe finds no serious violation on any screen, drawer, dialog or picker, in light and in dark mode', async () => {
    const app = await freshApp();
    const s: BrowserSession = await openBrowser({ server: app.server });
    const { page } = s;
    const failures: string[] = [];
    const modes: Record<string, ColourMode[]> = {};
    try {
      await page.setViewportSize({ width: 1280, height: 900 });
      const buildId = await ternId(app.db);
      // An invitation of our own for the welcome page (only the token's hash is stored).
      const token = randomBytes(24).toString('base64url');
      const [marketing] = await app.db.sql<{ id: number }>(`SELECT id FROM users WHERE email = $1`, [
        DEMO_EMAIL.marketing,
      ]);
      await app.db.sql(
        `INSERT INTO invitation_links (user_id, token_hash, expires_at) VALUES ($1, $2, now() + interval '1 day')`,
        [marketing!.id, tokenHash(token)],
      );

      const mode = async (): Promise<ColourMode> =>
        (await page.evaluate(() => localStorage.getItem('bayslate.mode'))) === 'dark' ? 'dark' : 'light';
      /** The mode the page draws in, read from the page itself (the root's theme variables). */
      const drawn = async () => page.evaluate(() => document.documentElement.dataset.mode);
      const check = async (label: string, ready: Locator) => {
        await ready.waitFor();
        const m = await mode();
        expect(await drawn(), `${label} draws in ${m} mode`).toBe(m);
        try {
          await audit(s, `${label} (${m})`);
        } catch (e) {
          failures.push((e as Error).message);
        }
        (modes[label] ??= []).push(m);
        if (allScreens)
          await page.screenshot({ path: path.join(allScreens, `${label.replace(/\W+/g, '-')}-${m}.png`) });
      };
      /** Switches mode as a person would where the menu rail is on screen, else as a returning visitor. */
      const flip = async (withToggle: boolean) => {
        const next: ColourMode = (await mode()) === 'dark' ? 'light' : 'dark';
        if (withToggle) await page.getByRole('button', { name: next === 'dark' ? 'Dark mode' : 'Light mode' }).click();
        else {
          await page.emulateMedia({ colorScheme: next });
          await page.evaluate((m) => localStorage.setItem('bayslate.mode', m), next);
          await page.reload();
        }
        await page.waitForFunction((m) => document.documentElement.dataset.mode === m, next);
      };
      /** Audits the screen in the mode it is in, flips the mode, audits again (so screens alternate which mode comes first). */
      const both = async (label: string, ready: () => Locator, withToggle = true) => {
        await check(label, ready());
        await flip(withToggle);
        await check(label, ready());
      };
      const shoot = async (name: string) => {
        if (screens)
          await page.screenshot({
            path: path.join(screens, `themes-${name}-${page.viewportSize()!.width}-${await mode()}.png`),
          });
      };
      const h1 = (name: string | RegExp) => page.getByRole('heading', { level: 1, name });
      const go = (p: string) => page.goto(app.server.url + p);

      // ---- signed out: sign-in, the public build page, an invitation, a page that does not exist ----
      await go('/sign-in');
      await page.evaluate(() => localStorage.setItem('bayslate.mode', 'light'));
      await page.reload();
      await both('sign-in', () => h1('Sign in'), false);
      await go('/b/project-tern');
      await both('public build page', () => page.getByRole('heading', { name: 'Episodes you can watch' }), false);
      await go(`/welcome/${token}`);
      await both('welcome', () => page.getByText('choose the password you will sign in with'), false);
      await go('/confirm/not-a-real-token');
      await both('vote link that did not work', () => h1('This link did not work'), false);
      await go('/no-such-page');
      await both('not found', () => h1('Nothing here'), false);

      // ---- sign in as the owner, through the form ----
      await go('/sign-in');
      await page.getByLabel('E-mail').fill(DEMO_EMAIL.owner);
      await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));

      const b = `/builds/${buildId}`;
      const signedIn: [string, string, () => Locator][] = [
        ['builds', '/builds', () => page.getByRole('link', { name: 'Open the backlog of Project Tern' })],
        ['account', '/account', () => page.getByRole('heading', { name: 'Change password' })],
        ['users', '/users', () => page.getByRole('cell', { name: DEMO_EMAIL.installer })],
        ['overview', `${b}/overview`, () => page.locator('[data-test="figure-net"]')],
        ['build report', `${b}/report`, () => page.getByRole('heading', { name: 'Earned value' })],
        [
          'backlog',
          `${b}/backlog`,
          () => page.locator('[data-test^="open-"]', { hasText: 'Projector LED headlamps' }).first(),
        ],
        ['parts', `${b}/parts`, () => page.locator('[data-test^="part-"]').first()],
        ['media', `${b}/media`, () => page.locator('[data-test="media-thumb"]').first()],
        ['planner', `${b}/planner`, () => page.locator('[data-test="episode-1"]')],
        ['shop floor', `${b}/shop-floor`, () => page.getByRole('heading', { level: 2, name: /^Episode \d+:/ })],
        ['publish', `${b}/publish`, () => page.locator('[data-test="episode-picker"]')],
        ['sales', `${b}/sales`, () => page.locator('[data-test="sales-margin"]')],
        [
          'viewer requests',
          `${b}/viewer-requests`,
          () => page.locator('[data-test="requests-table"] tbody tr').first(),
        ],
        ['build settings', `${b}/settings`, () => page.locator('[data-test="time-zone"]')],
      ];
      for (const [label, p, ready] of signedIn) {
        await go(p);
        await both(label, ready);
      }

      // ---- the upgrade drawer, a dialog and the episode picker, at desktop and phone width ----
      for (const width of [1280, 390]) {
        await page.setViewportSize({ width, height: width > 600 ? 900 : 844 });
        await go(`${b}/backlog`);
        const row = page.locator('[data-test^="open-"]', { hasText: 'Projector LED headlamps' }).first();
        await row.waitFor();
        await row.click();
        const drawerReady = () => page.locator('.n-drawer').getByRole('heading', { name: 'Details' });
        for (let i = 0; i < 2; i++) {
          await check(`upgrade drawer ${width}`, drawerReady());
          await shoot('drawer');
          if (i === 0) {
            // The rail's toggle is behind the drawer's mask; a returning visitor's reload keeps the drawer's URL.
            await flip(false);
            if (!(await page.locator('.n-drawer').isVisible())) await row.click();
          }
        }
        await page.keyboard.press('Escape');
        await page.locator('.n-drawer').waitFor({ state: 'detached' });

        await page.locator('[data-test="new-upgrade"]').click();
        const dialogReady = () =>
          page.getByRole('dialog', { name: 'New upgrade' }).getByRole('button', { name: 'Add to the backlog' });
        await check(`new upgrade dialog ${width}`, dialogReady());
        await shoot('dialog');
        await flip(false);
        await page.locator('[data-test="new-upgrade"]').click();
        await check(`new upgrade dialog ${width}`, dialogReady());
        await shoot('dialog');

        await go(`${b}/shop-floor`);
        const openPicker = async () => {
          await page.getByRole('heading', { level: 2, name: /^Episode \d+:/ }).waitFor();
          await page.locator('.picker .n-base-selection').click();
          return page.locator('.n-base-select-option').first();
        };
        await check(`episode picker ${width}`, await openPicker());
        await shoot('picker');
        await flip(false);
        await check(`episode picker ${width}`, await openPicker());
        await shoot('picker');
      }

      console.log(
        `[themes] audited ${s.audited.length} views: ${Object.entries(modes)
          .map(([k, v]) => `${k} [${v.join(', ')}]`)
          .join('; ')}`,
      );
      expect(failures, failures.join('\n')).toEqual([]);
      for (const [label, ms] of Object.entries(modes))
        expect(new Set(ms), `${label} audited in both modes`).toEqual(new Set(['light', 'dark']));
    } finally {
      await s.close();
      await app.stop();
    }
  });
});
