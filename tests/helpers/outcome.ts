// Waiting for the outcome an action caused, never for something already on screen: a toast
// that appeared after this click, the answer to this request.
import { expect } from 'vitest';
import type { Page, Response } from 'playwright-core';

const SEEN = 'data-e2e-seen';

export interface Expect {
  /** Text of the toast (naive-ui message) this action shows; only a toast that appears after the action counts. */
  toast?: string | RegExp;
  /** The request this action sends: method and a path pattern (matched against the URL's pathname). */
  request?: { method: string; path: string | RegExp; status?: number };
}

function pathMatches(url: string, p: string | RegExp) {
  const pathname = new URL(url).pathname;
  return typeof p === 'string' ? pathname === p || pathname.endsWith(p) : p.test(pathname);
}

/**
 * Runs `action` (a click, a key press) and waits for what it causes: the answer to its request
 * (whose status is checked) and a toast that was not on screen before.
 */
export async function outcomeOf(
  page: Page,
  action: () => Promise<unknown>,
  want: Expect,
): Promise<Response | undefined> {
  // Every toast on screen now belongs to an earlier step.
  await page.evaluate(
    (attr) => document.querySelectorAll('.n-message').forEach((m) => m.setAttribute(attr, '1')),
    SEEN,
  );
  const response = want.request
    ? page.waitForResponse(
        (r) => r.request().method() === want.request!.method.toUpperCase() && pathMatches(r.url(), want.request!.path),
      )
    : undefined;
  response?.catch(() => undefined);
  await action();
  let res: Response | undefined;
  if (response) {
    res = await response;
    const expected = want.request!.status;
    if (expected !== undefined)
      expect(res.status(), `${want.request!.method} ${res.url()} answered ${res.status()}`).toBe(expected);
    else expect(res.status(), `${want.request!.method} ${res.url()} answered ${res.status()}`).toBeLessThan(400);
  }
  if (want.toast !== undefined) await newToast(page, want.toast).waitFor();
  return res;
}

/** A toast with this text that appeared after the last `outcomeOf` marked the screen. */
export function newToast(page: Page, text: string | RegExp) {
  return page.locator(`.n-message:not([${SEEN}])`, { hasText: text }).first();
}
