// The common part of the journeys that audit every screen in both themes (themesSignedOutAndPlanning
// and themesProductionAndOverlays in tests/e2e/): one fresh database, one browser at 1280 px starting
// in the mode asked for on the sign-in page, and the tools to audit a view in its mode, flip the mode
// and audit again. Any serious or critical axe violation (contrast included) fails the run; all of
// them are gathered first so one run names every view that fails. At the end the audited views are
// printed and each must have been audited in both modes.
// THEMES_SCREENS=<folder> also saves screenshots of the drawer, the dialog and the picker at
// 1280 and 390 px in both modes.
import { expect } from 'vitest';
import path from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { openBrowser, audit, type BrowserSession } from './browser';
import { freshApp, ternId, type FreshApp } from './fresh-db';
import { DEMO_EMAIL, DEMO_PASSWORD } from './api';
import type { ColourMode } from './theme';

const screens = process.env.THEMES_SCREENS;
// THEMES_ALL_SCREENS=<folder>: a screenshot of every screen in each mode, for a look by eye.
const allScreens = process.env.THEMES_ALL_SCREENS;

export interface ThemesRun {
  app: FreshApp;
  page: Page;
  /** The demo build's path, `/builds/<id>`. */
  b: string;
  mode: () => Promise<ColourMode>;
  /** Audits the view once `ready` shows, in the mode it is in. */
  check: (label: string, ready: Locator) => Promise<void>;
  /** Switches mode as a person would where the menu rail is on screen, else as a returning visitor. */
  flip: (withToggle: boolean) => Promise<void>;
  /** Audits the screen in the mode it is in, flips the mode, audits again (so screens alternate which mode comes first). */
  both: (label: string, ready: () => Locator, withToggle?: boolean) => Promise<void>;
  /** Visits each screen and audits it in both modes. */
  bothAt: (list: [string, string, () => Locator][]) => Promise<void>;
  shoot: (name: string) => Promise<void>;
  h1: (name: string | RegExp) => Locator;
  go: (p: string) => Promise<unknown>;
  /** Signs in as the owner (who may open every screen), through the form. */
  signInAsOwner: () => Promise<void>;
}

/** Runs `journey` on a fresh app, starting on the sign-in page in `startMode`, then checks what it audited. */
export async function auditThemes(startMode: ColourMode, journey: (t: ThemesRun) => Promise<void>) {
  const app = await freshApp();
  const s: BrowserSession = await openBrowser({ server: app.server });
  const { page } = s;
  const failures: string[] = [];
  const modes: Record<string, ColourMode[]> = {};
  try {
    await page.setViewportSize({ width: 1280, height: 900 });
    const buildId = await ternId(app.db);

    const mode = async (): Promise<ColourMode> =>
      (await page.evaluate(() => localStorage.getItem('bayslate.mode'))) === 'dark' ? 'dark' : 'light';
    /** The mode the page draws in, read from the page itself (the root's theme variables). */
    const drawn = async () => page.evaluate(() => document.documentElement.dataset.mode);
    const check = async (label: string, ready: Locator) => {
      try {
        await ready.waitFor();
      } catch (e) {
        // What the page showed instead, so a failure on a loaded machine says more than "time-out".
        const shown = await page
          .evaluate(() => ({ url: location.href, text: document.body.innerText.replace(/\s+/g, ' ').slice(0, 600) }))
          .catch(() => null);
        throw new Error(`${label}: ${(e as Error).message}\nthe page at that moment: ${JSON.stringify(shown)}`);
      }
      const m = await mode();
      expect(await drawn(), `${label} draws in ${m} mode`).toBe(m);
      try {
        await audit(s, `${label} (${m})`, { contrast: true });
      } catch (e) {
        failures.push((e as Error).message);
      }
      (modes[label] ??= []).push(m);
      if (allScreens) await page.screenshot({ path: path.join(allScreens, `${label.replace(/\W+/g, '-')}-${m}.png`) });
    };
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
    const bothAt = async (list: [string, string, () => Locator][]) => {
      for (const [label, p, ready] of list) {
        await go(p);
        await both(label, ready);
      }
    };
    const signInAsOwner = async () => {
      await go('/sign-in');
      await page.getByLabel('E-mail').fill(DEMO_EMAIL.owner);
      await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    };

    await go('/sign-in');
    await page.emulateMedia({ colorScheme: startMode });
    await page.evaluate((m) => localStorage.setItem('bayslate.mode', m), startMode);
    await page.reload();
    const b = `/builds/${buildId}`;
    await journey({ app, page, b, mode, check, flip, both, bothAt, shoot, h1, go, signInAsOwner });

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
}
