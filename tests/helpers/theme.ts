// Colour mode for browser tests: sets the app's remembered mode (localStorage, as its toggle does)
// and the system preference, then reloads so every screen draws in that mode.
import type { Page } from 'playwright-core';

export type ColourMode = 'light' | 'dark';

export async function setColourMode(page: Page, mode: ColourMode) {
  await page.emulateMedia({ colorScheme: mode });
  await page.evaluate((m) => localStorage.setItem('bayslate.mode', m), mode);
  await page.reload();
}

/** Runs `check` once in light and once in dark mode, leaving the page in the mode it started in. */
export async function inBothModes(page: Page, check: (mode: ColourMode) => Promise<void>) {
  const start = (await page.evaluate(() => localStorage.getItem('bayslate.mode'))) === 'dark' ? 'dark' : 'light';
  const other: ColourMode = start === 'dark' ? 'light' : 'dark';
  await setColourMode(page, start);
  await check(start);
  await setColourMode(page, other);
  await check(other);
  await setColourMode(page, start);
}
