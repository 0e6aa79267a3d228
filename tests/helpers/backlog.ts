// Helpers of the backlog's browser journeys (backlog.test.ts, backlogRoles.test.ts): reading the API
// with the page's own session, finding the demo build and an upgrade by title, the upgrade drawer.
import { expect } from 'vitest';
import type { Page } from 'playwright-core';
import type { BrowserSession } from './browser';

/** Reads the API with the page's own session, as the client does. */
export async function apiGet<T>(s: BrowserSession, path: string): Promise<T> {
  const res = await s.page.request.get(s.server.url + path, {
    headers: { 'X-Requested-With': 'Bayslate', Accept: 'application/json' },
  });
  expect(res.status(), `${path} answered ${res.status()}`).toBe(200);
  return (await res.json()) as T;
}
export async function ternId(s: BrowserSession): Promise<number> {
  const { builds } = await apiGet<{ builds: { id: number; slug: string }[] }>(s, '/api/builds');
  const b = builds.find((x) => x.slug === 'project-tern');
  expect(b, 'the demo build exists').toBeTruthy();
  return b!.id;
}
export async function upgradeByTitle(s: BrowserSession, buildId: number, title: string) {
  const { upgrades } = await apiGet<{ upgrades: { id: number; title: string; prerequisiteIds: number[] }[] }>(
    s,
    `/api/builds/${buildId}/upgrades?pageSize=500`,
  );
  const u = upgrades.find((x) => x.title === title);
  expect(u, `upgrade "${title}" exists`).toBeTruthy();
  return u!;
}
// A whole journey drives many screens; the shared two-core machine makes some of them slow.
export const JOURNEY_TIMEOUT = 300_000;
export const drawer = (page: Page) => page.locator('.n-drawer');
