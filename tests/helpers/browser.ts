// Browser-test harness: the real server (built client included) on this file's database,
// Debian's Chromium driven by playwright-core, and axe-core run on every page visited.
//
// Speed without sharing state: the server runs from the esbuild bundle that the e2e project's
// global setup compiles once per run (tests/helpers/server-build.ts) instead of loading every
// source file through tsx at each start, and one Chromium process serves all the journeys of a
// test file, each journey in a fresh browser context (its own cookies, storage and cache).
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import net from 'node:net';
import { createRequire } from 'node:module';
import { afterAll, inject } from 'vitest';
import { chromium, type Browser, type BrowserContext, type Locator, type Page } from 'playwright-core';
import { DEMO_EMAIL, DEMO_PASSWORD, type DemoRole } from './api';
import { buildServer } from './server-process';

const root = path.resolve(import.meta.dirname, '../..');
const require = createRequire(import.meta.url);
const axePath = require.resolve('axe-core/axe.min.js');

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.on('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

export interface AppServer {
  url: string;
  port: number;
  stop: () => Promise<void>;
  output: () => string;
}

/**
 * The compiled server's entry: the bundle the global setup built for this run, or (a helper used
 * outside the e2e project) a copy compiled for this test file.
 */
function serverEntry(): string {
  const built = inject('appServerBuild');
  if (built && existsSync(path.join(built, 'index.js'))) return path.join(built, 'index.js');
  return path.join(buildServer(), 'index.js');
}

/**
 * Starts the server (`server/index.ts`, compiled by esbuild as `npm run build` does) as a child
 * process in test mode, with this file's settings (tests/helpers/per-file-db.ts), and waits until
 * it listens.
 */
export async function startAppServer(extraEnv: Record<string, string> = {}): Promise<AppServer> {
  if (!existsSync(path.join(root, process.env.E2E_DIST ?? 'dist', 'index.html')))
    throw new Error('dist/ is missing: run the tests through `npm test`, which builds the client');
  const entry = serverEntry();
  const port = await freePort();
  let out = '';
  const child: ChildProcess = spawn(process.execPath, ['--enable-source-maps', entry], {
    cwd: root,
    // E2E_DIST lets a developer test a client built into another folder than dist/.
    env: {
      ...process.env,
      PORT: String(port),
      HOST: '127.0.0.1',
      SERVE_CLIENT: '1',
      CLIENT_DIST: process.env.E2E_DIST ?? 'dist',
      NODE_ENV: 'test',
      PUBLIC_URL: `http://127.0.0.1:${port}`,
      ...extraEnv,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (c) => (out += c));
  child.stderr!.on('data', (c) => (out += c));
  await new Promise<void>((resolve, reject) => {
    // Generous: a start takes seconds on a busy 2-core machine; a slow start is not a failure.
    const timer = setTimeout(() => reject(new Error(`server did not start:\n${out}`)), 150_000);
    child.stdout!.on('data', () => out.includes('server listening') && (clearTimeout(timer), resolve()));
    child.once('exit', (code) => (clearTimeout(timer), reject(new Error(`server exited ${code}:\n${out}`))));
  });
  return {
    url: `http://127.0.0.1:${port}`,
    port,
    output: () => out,
    stop: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
        setTimeout(() => child.kill('SIGKILL'), 5000);
      }),
  };
}

function chromiumPath() {
  for (const p of ['/usr/lib/chromium/chromium', '/usr/bin/chromium']) if (existsSync(p)) return p;
  throw new Error('Chromium is missing: `npm test` installs Debian’s chromium package');
}

/** How long a browser wait may take before it fails (each journey still has its own overall limit). */
export const BROWSER_WAIT_MS = 90_000;

export interface BrowserSession {
  browser: Browser;
  context: BrowserContext;
  page: Page;
  server: AppServer;
  /** Pages audited so far, with their serious or critical violations (should stay empty). */
  audited: string[];
  close: () => Promise<void>;
}

// One Chromium per test file (each file runs in a process of its own), launched on first use and
// closed after the file's last test; launched again should it ever crash.
let launched: Promise<Browser> | null = null;
function sharedBrowser(): Promise<Browser> {
  if (!launched) {
    const p = chromium.launch({
      executablePath: chromiumPath(),
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-quic',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
      ],
    });
    launched = p;
    p.then(
      (b) => b.on('disconnected', () => launched === p && (launched = null)),
      () => launched === p && (launched = null),
    );
  }
  return launched;
}
afterAll(async () => {
  const p = launched;
  launched = null;
  if (p) await (await p.catch(() => null))?.close();
});

/**
 * A fresh browser context (no cookies, storage or cache from any other journey) and page on the
 * file's Chromium, against `opts.server` or a server of its own started for it.
 */
export async function openBrowser(
  opts: { phone?: boolean; server?: AppServer; env?: Record<string, string> } = {},
): Promise<BrowserSession> {
  const server = opts.server ?? (await startAppServer(opts.env));
  const browser = await sharedBrowser();
  const context = await browser.newContext(
    // bypassCSP lets the harness inject axe-core; the app's own CSP stays strict.
    opts.phone
      ? { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true, deviceScaleFactor: 2, bypassCSP: true }
      : { viewport: { width: 1366, height: 900 }, bypassCSP: true },
  );
  // Playwright waits 30 s for a page or an element by default; on a busy two-core machine (other
  // suites running) a screen can take longer than that to show what the journey caused. Waiting
  // longer is not retrying: a wait still ends in failure when the outcome never comes.
  context.setDefaultTimeout(BROWSER_WAIT_MS);
  context.setDefaultNavigationTimeout(BROWSER_WAIT_MS);
  const page = await context.newPage();
  const session: BrowserSession = {
    browser,
    context,
    page,
    server,
    audited: [],
    close: async () => {
      await context.close();
      if (!opts.server) await server.stop();
    },
  };
  return session;
}

/**
 * Runs axe-core on the page as it is now; fails on any serious or critical violation. It first
 * lets the page settle (network idle, fades done) unless `settle` is false (a state the test holds
 * on purpose, such as a screen still loading).
 *
 * Colour contrast is checked where a test says `contrast: true`: every screen and overlay in both
 * themes (tests/helpers/themes-audit.ts) and the audits that name their theme. Elsewhere a journey's
 * audit checks names, roles, labels and structure of the states it reaches; contrast, which depends
 * on the theme and the screen, is the costliest rule (about half of axe's time on a large screen).
 */
export async function audit(s: BrowserSession, label?: string, { settle = true, contrast = false } = {}) {
  const { page } = s;
  // Best effort, as before the longer default wait: a page that keeps a request open goes on after 30 s.
  if (settle) await page.waitForLoadState('networkidle', { timeout: 30_000 }).catch(() => undefined);
  // Let fades finish (a table fading in from its loading state is not what a person reads).
  await page
    .waitForFunction(
      () =>
        document
          .getAnimations()
          .every((a) => a.playState !== 'running' || a.effect?.getTiming().iterations === Infinity),
      null,
      { timeout: 3000 },
    )
    .catch(() => undefined);
  const hasAxe = await page.evaluate(() => typeof (window as unknown as { axe?: unknown }).axe !== 'undefined');
  if (!hasAxe) await page.addScriptTag({ path: axePath });
  const violations = await page.evaluate(async (withContrast) => {
    const axe = (
      window as unknown as {
        axe: {
          run: (
            ctx: Document,
            opts: object,
          ) => Promise<{
            violations: {
              id: string;
              impact: string;
              help: string;
              nodes: { target: string[]; html: string; failureSummary?: string }[];
            }[];
          }>;
        };
      }
    ).axe;
    const r = await axe.run(document, {
      resultTypes: ['violations'],
      rules: { 'color-contrast': { enabled: withContrast } },
    });
    return r.violations
      .filter((v) => v.impact === 'serious' || v.impact === 'critical')
      .map(
        (v) =>
          `${v.impact} ${v.id}: ${v.help}\n    ${v.nodes
            .slice(0, 4)
            .map(
              (n) =>
                `${n.target.join(' ')} ${n.html.slice(0, 160)} — ${(n.failureSummary ?? '').replace(/\s+/g, ' ').slice(0, 200)}`,
            )
            .join('\n    ')}`,
      );
  }, contrast);
  const where = label ?? page.url();
  s.audited.push(where);
  if (violations.length) throw new Error(`accessibility violations on ${where}:\n  ${violations.join('\n  ')}`);
}

/**
 * Picks `option` in a naive-ui select as a person does: opens its list with `trigger`, waits until the
 * list has finished opening (seen on a busy machine: a pick made while the list was still growing in
 * was lost and the list stayed open), picks, and waits until the list has closed.
 */
export async function pickOption(page: Page, trigger: Locator, option: string | RegExp) {
  await trigger.click();
  const menu = page.locator('.n-base-select-menu:visible');
  await page.locator('.n-base-select-menu:visible:not([class*="transition-enter"])').first().waitFor();
  await menu.locator('.n-base-select-option', { hasText: option }).first().click();
  await menu.first().waitFor({ state: 'hidden' });
}

/** Goes to a path of the app and audits the page once it has settled. */
export async function visit(s: BrowserSession, pathname: string) {
  await s.page.goto(s.server.url + pathname);
  await audit(s);
}

/**
 * Signs in through the API in the page's own context (the browser keeps the session cookie), for a
 * journey about what comes after; it then goes where it needs to. The form itself, and where each
 * role lands after it, are journeys of their own (signin.test.ts and the journeys that call signIn).
 */
export async function signInQuick(s: BrowserSession, role: DemoRole) {
  const res = await s.page.request.post(`${s.server.url}/api/auth/login`, {
    data: { email: DEMO_EMAIL[role], password: DEMO_PASSWORD },
    headers: { 'X-Requested-With': 'Bayslate' },
  });
  if (res.status() !== 200) throw new Error(`sign-in as ${role} answered ${res.status()}: ${await res.text()}`);
}

/** Signs in through the form, as a person would, and audits the sign-in page and the landing page. */
export async function signIn(s: BrowserSession, role: DemoRole) {
  await visit(s, '/sign-in');
  await s.page.getByLabel('E-mail').fill(DEMO_EMAIL[role]);
  await s.page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await s.page.getByRole('button', { name: 'Sign in' }).click();
  await s.page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
  await audit(s);
}
