// The owner's numbers in the browser: the overview of the demo build, a chart's table alternative,
// the click-through to the backlog, the printable report, and a build with nothing to add up yet.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import {
  openBrowser,
  audit,
  signInQuick,
  startAppServer,
  type AppServer,
  type BrowserSession,
} from '../helpers/browser';
import { Build } from '../../server/models';
import { buildOverview } from '../../server/services/overview';
import { formatCents } from '../../src/theme';

let server: AppServer;

let tern: Build;
beforeAll(async () => {
  server = await startAppServer();
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
});
afterAll(async () => {
  await server?.stop();
});

describe('build overview in the browser', () => {
  it('the owner lands on the overview, reads the figures, opens a chart’s table and clicks through to the backlog', async () => {
    const s: BrowserSession = await openBrowser({ server });
    try {
      await signInQuick(s, 'owner');
      await s.page.goto(`${server.url}/builds/${tern.id}`);
      await s.page.waitForURL(/\/overview$/);
      await s.page.getByRole('heading', { name: 'Overview', level: 1 }).waitFor();
      await s.page.locator('[data-test="figure-net"]').waitFor();
      const expected = await buildOverview(tern);
      expect(await s.page.locator('[data-test="figure-net"]').textContent()).toBe(
        formatCents(expected.headline.netCents),
      );
      expect(await s.page.locator('[data-test="figure-remaining"]').textContent()).toBe(
        formatCents(expected.headline.remainingCents),
      );
      expect(await s.page.locator('[data-test="figure-forecast"]').textContent()).toBe(
        formatCents(expected.headline.forecastCents),
      );
      expect(await s.page.locator('[data-test="figure-upgrades"]').textContent()).toBe(
        `${expected.headline.upgradesDone} / ${expected.headline.upgradesTotal}`,
      );
      expect(await s.page.locator('[data-test="figure-episodes"]').textContent()).toBe(
        `${expected.headline.episodesLive} / ${expected.headline.episodesTotal}`,
      );
      expect(await s.page.locator('[data-test="credit-rule"]').textContent()).toContain('0/100');
      // The plan of work, its reserve, actual cost as recognised, and the forecast's own formula.
      expect(await s.page.locator('[data-test="figure-reserve"]').textContent()).toBe(
        formatCents(expected.headline.reserveCents),
      );
      expect(await s.page.locator('[data-test="figure-actual"]').textContent()).toBe(
        formatCents(expected.headline.actualCents),
      );
      const formula = (await s.page.locator('[data-test="formula-forecast"]').textContent()) ?? '';
      expect(formula).toContain(formatCents(expected.headline.actualCents));
      expect(formula).toContain(formatCents(expected.headline.etcCents));
      expect(formula).toContain('$95.00/h');
      const cash = (await s.page.locator('[data-test="cash-view"]').textContent()) ?? '';
      for (const c of [
        expected.headline.cash.paidCents,
        expected.headline.cash.committedCents,
        expected.headline.cash.notOrderedCents,
        expected.headline.netCents,
      ])
        expect(cash).toContain(formatCents(c));
      const estimates = (await s.page.locator('[data-test="index-estimates"]').textContent()) ?? '';
      for (const f of [
        'BAC ÷ CPI',
        'AC + (BAC − EV)',
        'AC + (BAC − EV) ÷ (CPI × SPI)',
        '(BAC − EV) ÷ (BAC − AC)',
        '(BAC − EV) ÷ (forecast − AC)',
      ])
        expect(estimates).toContain(f);
      const text = (await s.page.locator('main').textContent()) ?? '';
      expect(text).not.toMatch(/NaN|Infinity|undefined/);
      expect(await s.page.locator('canvas').count()).toBeGreaterThanOrEqual(4);
      await audit(s, 'overview');

      const costPanel = s.page.getByRole('region', { name: 'Cost per upgrade' });
      await costPanel.getByText('Show the numbers as a table').click();
      const costliest = [...expected.upgrades].sort((a, b) => b.netCents - a.netCents)[0];
      const row = costPanel.getByRole('row').filter({ hasText: costliest.title });
      await row.first().waitFor();
      expect(await row.first().textContent()).toContain(formatCents(costliest.netCents));
      await audit(s, 'overview, cost table open');

      // The CSV export offers a file with every upgrade's row.
      const [download] = await Promise.all([
        s.page.waitForEvent('download'),
        costPanel.getByRole('button', { name: 'Export Cost per upgrade as CSV' }).click(),
      ]);
      expect(download.suggestedFilename()).toBe('cost-per-upgrade.csv');
      const csv = await (await import('node:fs/promises')).readFile((await download.path())!, 'utf8');
      expect(csv.split('\r\n')[0]).toBe('Upgrade,Parts (USD),Labour (USD),Other (USD),Recovered (USD),Net (USD)');
      expect(csv.trim().split('\r\n')).toHaveLength(expected.upgrades.length + 1);
      // The PNG export is the chart's own picture.
      const [png] = await Promise.all([
        s.page.waitForEvent('download'),
        costPanel.getByRole('button', { name: 'Export Cost per upgrade as PNG' }).click(),
      ]);
      expect(png.suggestedFilename()).toBe('cost-per-upgrade.png');
      const bytes = await (await import('node:fs/promises')).readFile((await png.path())!);
      expect(bytes.subarray(1, 4).toString()).toBe('PNG');

      await row.first().getByRole('link', { name: costliest.title }).click();
      await s.page.waitForURL(
        (u) => u.pathname.endsWith('/backlog') && u.searchParams.get('upgrade') === String(costliest.upgradeId),
      );
    } finally {
      await s.close();
    }
  });

  it('the owner opens the printable build report and prints it', async () => {
    const s = await openBrowser({ server });
    try {
      await signInQuick(s, 'owner');
      await s.page.goto(`${server.url}/builds/${tern.id}/overview`);
      await s.page.getByRole('link', { name: 'Build report' }).click();
      await s.page.getByRole('heading', { name: `Build report: ${tern.name}` }).waitFor();
      await s.page.getByRole('table', { name: 'By upgrade' }).waitFor();
      // The burndown and the cost per upgrade are on paper too.
      await s.page.getByRole('region', { name: 'Cost burndown' }).locator('canvas').waitFor();
      await s.page.getByRole('region', { name: 'Cost per upgrade' }).locator('canvas').waitFor();
      await audit(s, 'build report');
      await s.page.evaluate(() => {
        (window as unknown as { printed: number }).printed = 0;
        window.print = () => void ((window as unknown as { printed: number }).printed += 1);
      });
      await s.page.getByRole('button', { name: 'Print / save as PDF' }).click();
      expect(await s.page.evaluate(() => (window as unknown as { printed: number }).printed)).toBe(1);
    } finally {
      await s.close();
    }
  });

  it('a build with no budget, no labour rate and no upgrades says what to do next and shows dashes', async () => {
    const empty = await Build.create({
      slug: 'overview-empty',
      name: 'Empty build',
      year: 2020,
      make: 'Halvorsen',
      model: 'Skua',
      vin: null,
      mileage: null,
      budgetCents: null,
      labourRateCents: null,
      campaign: null,
      summary: null,
    });
    const s = await openBrowser({ server });
    try {
      await signInQuick(s, 'producer');
      await s.page.goto(`${server.url}/builds/${empty.id}/overview`);
      await s.page.getByText('No budget set').waitFor();
      await s.page.getByText('No labour rate').waitFor();
      await s.page.getByText('No upgrades yet', { exact: true }).waitFor();
      expect(await s.page.locator('[data-test="figure-remaining"]').textContent()).toBe('—');
      expect(await s.page.locator('[data-test="figure-forecast"]').textContent()).toBe('—');
      await s.page.getByText(/No burndown yet/).waitFor();
      const text = (await s.page.locator('main').textContent()) ?? '';
      expect(text).not.toMatch(/NaN|Infinity|undefined/);
      await audit(s, 'overview of an empty build');
    } finally {
      await s.close();
    }
  });

  it('follows dark mode: cards and chart panels take the dark surface, and the page still passes the audit', async () => {
    const s = await openBrowser({ server });
    try {
      await s.page.addInitScript(() => localStorage.setItem('bayslate.mode', 'dark'));
      await signInQuick(s, 'owner');
      await s.page.goto(`${server.url}/builds/${tern.id}/overview`);
      await s.page.locator('[data-test="figure-forecast"]').waitFor();
      const bg = (sel: string) =>
        s.page
          .locator(sel)
          .first()
          .evaluate((el) => getComputedStyle(el).backgroundColor);
      // theme.ts palette.graphite800 (#25272b) is the dark panel colour; white would be rgb(255, 255, 255).
      expect(await bg('.card')).toBe('rgb(37, 39, 43)');
      expect(await bg('#chart-burndown-title >> xpath=ancestor::section[1]')).toBe('rgb(37, 39, 43)');
      await audit(s, 'overview in dark mode', { contrast: true });
    } finally {
      await s.close();
    }
  });

  it('the owner sets the shop clock and cost recognition in the build settings, and the overview follows', async () => {
    const b = await Build.create({
      slug: `overview-clock-${Date.now().toString(36)}`,
      name: 'Clock build',
      year: 2021,
      make: 'Halvorsen',
      model: 'Skua',
      vin: null,
      mileage: null,
      budgetCents: 1_000_000,
      labourRateCents: 10_000,
      campaign: null,
      summary: null,
    });
    const s = await openBrowser({ server });
    try {
      await signInQuick(s, 'owner');
      await s.page.goto(`${server.url}/builds/${b.id}/settings`);
      await s.page.getByText('Shop time zone').waitFor();
      await s.page.locator('[data-test="time-zone"]').click();
      await s.page.keyboard.type('America/Denver');
      await s.page.locator('.n-base-select-option', { hasText: /^America\/Denver$/ }).click();
      await s.page.locator('[data-test="recognition-receipt"]').click();
      await audit(s, 'build settings: clock and cost recognition');
      await s.page.getByRole('button', { name: 'Save settings' }).click();
      await s.page.getByText('Settings saved.').waitFor();
      const saved = (await Build.findByPk(b.id))!;
      expect([saved.timeZone, saved.costRecognition]).toEqual(['America/Denver', 'receipt']);
      await s.page.goto(`${server.url}/builds/${b.id}/overview`);
      await s.page.locator('[data-test="figure-actual"]').waitFor();
      expect(await s.page.locator('[data-test="recognised-view"] caption').textContent()).toContain('at receipt');
    } finally {
      await s.close();
    }
  });

  it('reads at phone width: figures and charts one above the other, nothing wider than the screen', async () => {
    const s = await openBrowser({ server, phone: true });
    try {
      await signInQuick(s, 'owner');
      await s.page.goto(`${server.url}/builds/${tern.id}/overview`);
      await s.page.locator('[data-test="figure-net"]').waitFor();
      const overflow = await s.page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow).toBeLessThanOrEqual(1);
      await audit(s, 'overview at phone width');
    } finally {
      await s.close();
    }
  });

  it('an installer is not offered the overview and is sent away from it', async () => {
    const s = await openBrowser({ server });
    try {
      await signInQuick(s, 'installer');
      await s.page.goto(`${server.url}/builds/${tern.id}/overview`);
      await s.page.waitForURL((u) => !u.pathname.endsWith('/overview'));
      expect(await s.page.getByRole('link', { name: 'Overview' }).count()).toBe(0);
    } finally {
      await s.close();
    }
  });
});
