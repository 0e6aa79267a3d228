// Kit sales in the browser: the owner imports a small export through the mapping step, reads the
// preview and then the per-episode table with margin; marketing sees revenue but no margin or cost.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { openBrowser, audit, pickOption, signInQuick, startAppServer, type AppServer } from '../helpers/browser';
import { Build, Episode, Part, Upgrade } from '../../server/models';
import { formatCents } from '../../src/theme';

let server: AppServer;
let buildId: number;
let tern: Build;

beforeAll(async () => {
  server = await startAppServer();
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
  // A build with one live episode showing kit E2E-KIT (cost 120.00) and nothing sold yet.
  const b = await Build.create({
    slug: 'sales-e2e',
    name: 'Sales journey',
    year: 2021,
    make: 'Halvorsen',
    model: 'Tern',
    vin: null,
    mileage: null,
    budgetCents: 500_000,
    labourRateCents: 0,
    campaign: 'sales-e2e',
    summary: null,
  });
  buildId = b.id;
  const ep = await Episode.create({
    buildId,
    number: 1,
    title: 'The kit episode',
    state: 'live',
    shootDate: '2026-10-01',
    releaseDate: '2026-10-05',
    summary: null,
    videoUrl: null,
    runtimeSeconds: null,
    publishedAt: null,
  });
  const u = await Upgrade.create({ buildId, title: 'Kit upgrade', area: 'front', episodeId: ep.id } as never);
  await Part.create({
    buildId,
    upgradeId: u.id,
    partNumber: 'E2E-KIT',
    description: 'The kit',
    quantity: 1,
    unitCostCents: 12_000,
    retailPriceCents: 24_900,
    supplier: null,
    productUrl: null,
    expectedArrival: null,
    orderedOn: '2026-09-28',
    receivedOn: null,
    state: 'ordered',
  } as never);
});
afterAll(async () => {
  await server?.stop();
});

// "Placed" is no header word Bayslate guesses, so the person picks it in the mapping step.
const EXPORT = [
  'Order,Line,Placed,SKU,Qty,Total,Currency,Campaign,Content',
  'W1,1,2026-10-06,E2E-KIT,2,498.00,USD,sales-e2e,episode-1',
  'W2,1,2026-10-09,E2E-KIT,1,249.00,USD,,',
  'W3,1,2026-10-10,GIFT-CARD,1,25.00,USD,,',
].join('\n');

describe('sales in the browser', () => {
  it('the owner imports through the mapping step, sees the preview and the table with margin', async () => {
    const s = await openBrowser({ server });
    try {
      await signInQuick(s, 'owner');
      await s.page.goto(`${server.url}/builds/${buildId}/sales`);
      await s.page.getByRole('heading', { name: 'Sales', level: 1 }).waitFor();
      await s.page.getByText('No sales yet.').waitFor();
      await audit(s, 'sales, empty');

      await s.page
        .locator('[data-test="sales-file"]')
        .setInputFiles({ name: 'orders.csv', mimeType: 'text/csv', buffer: Buffer.from(EXPORT) });
      await s.page.getByText('Still to pick: Order date.').waitFor();
      await s.page.getByRole('radio', { name: 'Campaign and content columns' }).check({ force: true });
      // The pick closes the list: the mapping step is audited once its menu has gone, not mid-fade.
      await pickOption(s.page, s.page.locator('[data-test="map-date"]'), 'Placed');
      await s.page.getByText('Still to pick:').waitFor({ state: 'detached' });
      await audit(s, 'sales, mapping');
      await s.page.locator('[data-test="sales-check"]').click();
      const report = s.page.locator('[data-test="sales-report"]');
      await report.getByText('Preview: orders.csv').waitFor();
      expect(await report.locator('[data-test="sales-new-lines"]').textContent()).toBe('3');
      await audit(s, 'sales, preview');

      await s.page.locator('[data-test="sales-import"]').click();
      await s.page.getByText('Imported 3 new line(s) from orders.csv').waitFor();
      const table = s.page.locator('[data-test="sales-episodes"]');
      const row = table.getByRole('row').filter({ hasText: 'The kit episode' });
      await row.waitFor();
      const text = (await row.textContent()) ?? '';
      // Direct: 2 units for 498.00, margin 498 − 2 × 120 = 258.00. Assisted: 1 for 249.00, margin 129.00.
      expect(text).toContain(formatCents(49_800));
      expect(text).toContain(formatCents(25_800));
      expect(text).toContain(formatCents(24_900));
      expect(text).toContain(formatCents(12_900));
      expect(await s.page.locator('[data-test="sales-margin"]').textContent()).toBe(formatCents(38_700));
      // Net cost 120.00 (the one part); margin 387.00 reached it on 10-06.
      expect(await s.page.locator('[data-test="sales-payback"]').textContent()).toBe('2026-10-06');
      await s.page.locator('[data-test="sales-lines"]').getByText('GIFT-CARD').waitFor();
      await audit(s, 'sales, imported');
    } finally {
      await s.close();
    }
  });

  it('marketing sees the demo build’s revenue without margin or cost', async () => {
    const s = await openBrowser({ server });
    try {
      await signInQuick(s, 'marketing');
      await s.page.goto(`${server.url}/builds/${tern.id}/sales`);
      await s.page.locator('[data-test="sales-direct-revenue"]').waitFor();
      expect(await s.page.locator('[data-test="sales-direct-revenue"]').textContent()).toMatch(/^\$[\d,]+\.\d\d$/);
      await s.page
        .locator('[data-test="sales-episodes"]')
        .getByRole('row')
        .filter({ hasText: 'First light' })
        .waitFor();
      expect(await s.page.locator('[data-test="sales-margin"]').count()).toBe(0);
      expect(await s.page.locator('[data-test="sales-net-cost"]').count()).toBe(0);
      const main = (await s.page.locator('main').textContent()) ?? '';
      expect(main).not.toMatch(/Margin|Net build cost|Payback/);
      await audit(s, 'sales, marketing');
    } finally {
      await s.close();
    }
  });
});
