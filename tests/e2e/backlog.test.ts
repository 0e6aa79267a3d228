// The backlog in the browser, one journey per role: the producer plans (create, edit, link a
// prerequisite, see a loop refused, import parts from CSV), the installer works from a phone
// (log hours, receive a part), the owner sees spend, marketing sees retail but never cost.
import { describe, it, expect } from 'vitest';
import type { Page } from 'playwright-core';
import { openBrowser, signIn, audit, visit, type BrowserSession } from '../helpers/browser';
import { freshAppPerTest } from '../helpers/fresh-db';
import { outcomeOf } from '../helpers/outcome';
import { compareTires } from '../../shared/tires';
import { SAFETY_CAUTIONS } from '../../shared/safety';

// Each test runs on a database of its own, cloned from the template as it starts.
const app = freshAppPerTest();

/** Reads the API with the page's own session, as the client does. */
async function apiGet<T>(s: BrowserSession, path: string): Promise<T> {
  const res = await s.page.request.get(s.server.url + path, {
    headers: { 'X-Requested-With': 'Bayslate', Accept: 'application/json' },
  });
  expect(res.status(), `${path} answered ${res.status()}`).toBe(200);
  return (await res.json()) as T;
}
async function ternId(s: BrowserSession): Promise<number> {
  const { builds } = await apiGet<{ builds: { id: number; slug: string }[] }>(s, '/api/builds');
  const b = builds.find((x) => x.slug === 'project-tern');
  expect(b, 'the demo build exists').toBeTruthy();
  return b!.id;
}
async function upgradeByTitle(s: BrowserSession, buildId: number, title: string) {
  const { upgrades } = await apiGet<{ upgrades: { id: number; title: string; prerequisiteIds: number[] }[] }>(
    s,
    `/api/builds/${buildId}/upgrades?pageSize=500`,
  );
  const u = upgrades.find((x) => x.title === title);
  expect(u, `upgrade "${title}" exists`).toBeTruthy();
  return u!;
}
/** Picks an option of a naive-ui select inside the given form item. */
async function choose(page: Page, scope: ReturnType<Page['locator']>, option: string) {
  await scope.locator('.n-base-selection').first().click();
  await page.locator('.n-base-select-option:visible', { hasText: option }).first().click();
}
// A whole journey drives many screens; the shared two-core machine makes some of them slow.
const JOURNEY_TIMEOUT = 300_000;
const drawer = (page: Page) => page.locator('.n-drawer');

describe('backlog in the browser', () => {
  it(
    'producer creates an upgrade, edits it, links a prerequisite, sees a loop refused and imports parts',
    async () => {
      const s = await openBrowser({ server: app().server });
      const { page } = s;
      try {
        await signIn(s, 'producer');
        const buildId = await ternId(s);
        await page.getByRole('link', { name: 'Open the backlog of Project Tern' }).click();
        await page.waitForURL(/\/backlog/);
        await page.getByRole('button', { name: 'Projector LED headlamps' }).waitFor();
        await audit(s, 'backlog (producer)');

        // Filter by area: only rear upgrades remain.
        await choose(page, page.locator('[data-test="filter-area"]'), 'Rear');
        await page.getByRole('button', { name: 'Power liftgate' }).waitFor();
        await page.getByRole('button', { name: 'Projector LED headlamps' }).waitFor({ state: 'detached' });
        await page.getByRole('button', { name: 'Clear filters' }).first().click();
        await page.getByRole('button', { name: 'Projector LED headlamps' }).waitFor();

        // Create.
        await page.locator('[data-test="new-upgrade"]').click();
        const modal = page.locator('.n-modal');
        await modal.getByLabel('Title').fill('Puddle lamps in the mirrors');
        await choose(page, modal.locator('.n-form-item', { hasText: 'Area' }), 'Sides');
        await modal.getByLabel('Estimated hours').fill('1.5');
        await audit(s, 'new upgrade form');
        await outcomeOf(page, () => modal.getByRole('button', { name: 'Add to the backlog' }).click(), {
          request: { method: 'POST', path: /\/upgrades$/ },
          toast: 'added to the backlog',
        });
        await drawer(page).getByText('Puddle lamps in the mirrors').first().waitFor();
        await page.waitForURL(/upgrade=\d+/);
        const created = await upgradeByTitle(s, buildId, 'Puddle lamps in the mirrors');
        await audit(s, 'upgrade drawer (producer)');

        // Edit.
        await drawer(page).getByRole('button', { name: 'Edit details' }).click();
        await drawer(page).getByLabel('Estimated hours').fill('2.5');
        await drawer(page).getByLabel('Replaces (stock part)').fill('Plain mirror caps');
        await outcomeOf(page, () => drawer(page).getByRole('button', { name: 'Save changes' }).click(), {
          request: { method: 'PATCH', path: `/upgrades/${created.id}` },
          toast: 'Upgrade saved.',
        });
        await drawer(page).getByText('2.5 h estimated').waitFor();
        await drawer(page).getByText('Plain mirror caps').first().waitFor();

        // Link a prerequisite: the mirrors go in first.
        const mirrors = await upgradeByTitle(s, buildId, 'Power-folding mirrors with turn signals');
        await drawer(page).locator('[data-test="prereq-select"]').click();
        await page.keyboard.type('Power-folding');
        await page
          .locator('.n-base-select-option:visible', { hasText: 'Power-folding mirrors with turn signals' })
          .first()
          .click();
        await drawer(page).locator('#ud-prereq').click(); // closes the option list
        await outcomeOf(page, () => drawer(page).getByRole('button', { name: 'Save prerequisites' }).click(), {
          request: { method: 'PUT', path: `/upgrades/${created.id}/prerequisites` },
          toast: 'Prerequisites saved.',
        });
        expect((await upgradeByTitle(s, buildId, 'Puddle lamps in the mirrors')).prerequisiteIds).toEqual([mirrors.id]);
        // The history records the change.
        await drawer(page).locator('#ud-activity').waitFor();
        await audit(s, 'drawer after edits');

        // A loop is refused and its members named: the mirrors may not wait for the puddle lamps.
        await visit(s, `/builds/${buildId}/backlog?upgrade=${mirrors.id}`);
        await drawer(page).getByText('Power-folding mirrors with turn signals').first().waitFor();
        await drawer(page).locator('[data-test="prereq-select"]').click();
        await page.keyboard.type('Puddle');
        await page.locator('.n-base-select-option:visible', { hasText: 'Puddle lamps in the mirrors' }).first().click();
        await drawer(page).locator('#ud-prereq').click(); // closes the option list
        await outcomeOf(page, () => drawer(page).getByRole('button', { name: 'Save prerequisites' }).click(), {
          request: { method: 'PUT', path: `/upgrades/${mirrors.id}/prerequisites`, status: 422 },
        });
        const cycle = drawer(page).locator('[data-test="cycle"]');
        await cycle.waitFor();
        const cycleText = await cycle.innerText();
        expect(cycleText).toContain('Puddle lamps in the mirrors');
        expect(cycleText).toContain('Power-folding mirrors with turn signals');
        expect(
          (await upgradeByTitle(s, buildId, 'Power-folding mirrors with turn signals')).prerequisiteIds,
        ).not.toContain(created.id);
        await audit(s, 'cycle refused');

        // Import parts from CSV: a file with a bad row is previewed with its line and reason and
        // writes nothing; the corrected file imports.
        await page.keyboard.press('Escape');
        await page.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: 'Parts' }).click();
        await page.waitForURL(/\/parts/);
        await page.locator('[data-test="group-to-order"]').waitFor();
        await audit(s, 'parts (producer)');
        const header = 'upgrade,partNumber,description,quantity,unitCost,retailPrice,supplier,condition,state';
        const bad = [
          header,
          'Puddle lamps in the mirrors,HT-PDL-6320,Puddle lamp pair,2,34.50,59.00,Larkfield Electrical,new,to_order',
          'Puddle lamps in the mirrors,HT-PDL-6321,Puddle lamp harness,-1,12.00,,Larkfield Electrical,new,to_order',
        ].join('\n');
        await page.getByRole('button', { name: 'Import parts CSV' }).click();
        await page
          .locator('[data-test="csv-file"]')
          .setInputFiles({ name: 'puddle-parts.csv', mimeType: 'text/csv', buffer: Buffer.from(bad) });
        const problems = page.locator('[data-test="csv-errors"]');
        await problems.waitFor();
        expect(await problems.innerText()).toMatch(/Line 3/);
        expect(await page.locator('[data-test="csv-import"]').isDisabled()).toBe(true);
        await audit(s, 'csv preview with errors');
        const good = bad.replace(',-1,', ',1,');
        await page
          .locator('[data-test="csv-file"]')
          .setInputFiles({ name: 'puddle-parts.csv', mimeType: 'text/csv', buffer: Buffer.from(good) });
        await page.locator('[data-test="csv-ok"]').waitFor();
        await outcomeOf(page, () => page.locator('[data-test="csv-import"]').click(), {
          request: { method: 'POST', path: '/parts/import' },
          toast: '2 parts imported.',
        });
        await page.locator('[data-test="group-to-order"] [data-test="part-HT-PDL-6320"]').waitFor();
        await page.locator('[data-test="group-to-order"] [data-test="part-HT-PDL-6321"]').waitFor();
        const { parts } = await apiGet<{ parts: { partNumber: string; upgradeId: number }[] }>(
          s,
          `/api/builds/${buildId}/parts?upgradeId=${created.id}`,
        );
        expect(parts.map((p) => p.partNumber).sort()).toEqual(['HT-PDL-6320', 'HT-PDL-6321']);
        await audit(s, 'parts after import');

        // Destructive actions ask first: a part is deleted after confirming; an upgrade others
        // depend on is refused with its dependants named.
        await visit(s, `/builds/${buildId}/backlog?upgrade=${created.id}`);
        const line = drawer(page).locator('[data-test="part-HT-PDL-6321"]');
        await line.getByRole('button', { name: /Delete/ }).click();
        await page.getByRole('dialog', { name: 'Delete part HT-PDL-6321?' }).waitFor();
        await audit(s, 'delete confirmation');
        await outcomeOf(page, () => page.getByRole('button', { name: 'Delete the part' }).click(), {
          request: { method: 'DELETE', path: /\/parts\/\d+$/ },
          toast: 'Part deleted.',
        });
        await line.waitFor({ state: 'detached' });
        await visit(s, `/builds/${buildId}/backlog?upgrade=${mirrors.id}`);
        await drawer(page).getByRole('button', { name: 'Delete', exact: true }).click();
        await outcomeOf(page, () => page.getByRole('button', { name: 'Delete the upgrade' }).click(), {
          request: { method: 'DELETE', path: `/upgrades/${mirrors.id}`, status: 409 },
          toast: 'Puddle lamps in the mirrors',
        });
        await upgradeByTitle(s, buildId, 'Power-folding mirrors with turn signals');

        // Other costs go on the upgrade too.
        await visit(s, `/builds/${buildId}/backlog?upgrade=${created.id}`);
        await drawer(page).getByRole('button', { name: 'Add an expense' }).click();
        await drawer(page).getByLabel('What for').fill('Trim clips and tape');
        await drawer(page).getByLabel('Amount (dollars)').fill('18.40');
        await outcomeOf(page, () => drawer(page).getByRole('button', { name: 'Add expense' }).click(), {
          request: { method: 'POST', path: /\/expenses$/ },
          toast: 'Expense added.',
        });
        const { expenses } = await apiGet<{ expenses: { description: string; amountCents: number }[] }>(
          s,
          `/api/builds/${buildId}/expenses?upgradeId=${created.id}`,
        );
        expect(expenses).toEqual([expect.objectContaining({ description: 'Trim clips and tape', amountCents: 1840 })]);

        // The stock part it takes off is recorded for sale, then sold (the sale offsets cost).
        await drawer(page).getByRole('button', { name: 'Record a removed part' }).click();
        await drawer(page).getByLabel('Description').last().fill('Plain mirror caps');
        await choose(page, drawer(page).locator('.n-form-item', { hasText: 'What happens to it' }), 'For sale');
        await drawer(page).getByLabel('Expected sale (dollars)').fill('30');
        await outcomeOf(page, () => drawer(page).getByRole('button', { name: 'Record it' }).click(), {
          request: { method: 'POST', path: /\/removed-parts$/ },
          toast: 'Removed part recorded.',
        });
        await drawer(page)
          .getByRole('button', { name: /Record sale price/ })
          .click();
        await drawer(page).getByLabel('Sold for (dollars)').fill('25');
        await outcomeOf(page, () => drawer(page).getByRole('button', { name: 'Save sale' }).click(), {
          request: { method: 'PATCH', path: /\/removed-parts\/\d+$/ },
          toast: 'sale recorded.',
        });
        const { removedParts } = await apiGet<{
          removedParts: {
            description: string;
            disposition: string;
            expectedSaleCents: number;
            actualSaleCents: number;
          }[];
        }>(s, `/api/builds/${buildId}/removed-parts?upgradeId=${created.id}`);
        expect(removedParts).toEqual([
          expect.objectContaining({
            description: 'Plain mirror caps',
            disposition: 'sold',
            expectedSaleCents: 3000,
            actualSaleCents: 2500,
          }),
        ]);
        await audit(s, 'removed part sold');

        // A new build starts from the builds list and opens in its settings.
        await page.keyboard.press('Escape');
        await page.getByRole('navigation', { name: 'Main navigation' }).getByRole('link', { name: 'Builds' }).click();
        await page.getByRole('button', { name: 'New build' }).click();
        const nb = page.locator('.n-modal');
        await nb.getByLabel('Name of the build').fill('Project Heron');
        await nb.getByLabel('Make', { exact: true }).fill('Halvorsen');
        await nb.getByLabel('Model', { exact: true }).fill('Heron');
        await audit(s, 'new build form');
        await outcomeOf(page, () => nb.getByRole('button', { name: 'Create the build' }).click(), {
          request: { method: 'POST', path: '/api/builds' },
        });
        await page.waitForURL(/\/builds\/\d+\/settings/);
        await page.locator('[data-test="build-name"]', { hasText: 'Project Heron' }).waitFor();
        const { builds } = await apiGet<{ builds: { slug: string }[] }>(s, '/api/builds');
        expect(builds.map((b) => b.slug)).toContain('project-heron');
      } finally {
        await s.close();
      }
    },
    JOURNEY_TIMEOUT,
  );

  it(
    'installer at phone width logs hours and marks a part received',
    async () => {
      const s = await openBrowser({ server: app().server, phone: true });
      const { page } = s;
      try {
        await signIn(s, 'installer');
        const buildId = await ternId(s);
        await visit(s, `/builds/${buildId}/backlog`);
        const wiring = await upgradeByTitle(s, buildId, 'Trailer wiring, 7-pin');
        await page.locator(`[data-test="open-${wiring.id}"]`).click();
        await drawer(page).getByRole('button', { name: 'Log hours' }).waitFor();
        // No money for installers, and no editing of the upgrade itself.
        expect(await drawer(page).getByRole('button', { name: 'Edit details' }).count()).toBe(0);
        expect(
          await drawer(page)
            .getByText(/Cost \$/)
            .count(),
        ).toBe(0);
        await audit(s, 'drawer (installer, phone)');
        const before = (
          await apiGet<{ labour: { hours: number }[] }>(s, `/api/builds/${buildId}/labour?upgradeId=${wiring.id}`)
        ).labour.length;
        await drawer(page).getByRole('button', { name: 'Log hours' }).click();
        await drawer(page).getByLabel('Hours').fill('1.5');
        await drawer(page).getByLabel('Note').fill('Routed the harness along the frame rail');
        await audit(s, 'log hours form (phone)');
        await outcomeOf(page, () => drawer(page).getByRole('button', { name: 'Save hours' }).click(), {
          request: { method: 'POST', path: /\/labour$/ },
          toast: '1.5 h logged.',
        });
        // The history lists the same note once it refreshes, so look in the hours list itself.
        await drawer(page).locator('.note', { hasText: 'Routed the harness along the frame rail' }).waitFor();
        const after = (
          await apiGet<{ labour: { hours: number; note: string | null }[] }>(
            s,
            `/api/builds/${buildId}/labour?upgradeId=${wiring.id}`,
          )
        ).labour;
        expect(after.length).toBe(before + 1);
        expect(after.some((l) => l.hours === 1.5 && l.note === 'Routed the harness along the frame rail')).toBe(true);

        // Install state: the brake controller waits for the trailer wiring, and says so.
        const brake = await upgradeByTitle(s, buildId, 'Trailer brake controller');
        await visit(s, `/builds/${buildId}/backlog?upgrade=${brake.id}`);
        const states = drawer(page).getByRole('group', { name: 'Install state' });
        await outcomeOf(page, () => states.getByRole('button', { name: 'In the bay' }).click(), {
          request: { method: 'PATCH', path: `/upgrades/${brake.id}`, status: 409 },
          toast: 'Trailer wiring, 7-pin',
        });
        expect(
          (await apiGet<{ upgrade: { installState: string } }>(s, `/api/builds/${buildId}/upgrades/${brake.id}`))
            .upgrade.installState,
        ).toBe('queued');
        await visit(s, `/builds/${buildId}/backlog?upgrade=${wiring.id}`);
        await outcomeOf(
          page,
          () =>
            drawer(page)
              .getByRole('group', { name: 'Install state' })
              .getByRole('button', { name: 'Installed' })
              .click(),
          { request: { method: 'PATCH', path: `/upgrades/${wiring.id}` }, toast: 'Marked installed.' },
        );
        expect(
          (await apiGet<{ upgrade: { installState: string } }>(s, `/api/builds/${buildId}/upgrades/${wiring.id}`))
            .upgrade.installState,
        ).toBe('installed');

        // Receive a part from the parts screen.
        await visit(s, `/builds/${buildId}/parts`);
        const line = page.locator('[data-test="group-on-order"] [data-test="part-HT-LFT-8400"]');
        await line.waitFor();
        const button = line.getByRole('button', { name: /Mark received/ });
        const box = await button.boundingBox();
        expect(box!.height).toBeGreaterThanOrEqual(48);
        await outcomeOf(page, () => button.click(), {
          request: { method: 'PATCH', path: /\/parts\/\d+$/ },
          toast: 'HT-LFT-8400 received.',
        });
        await page.locator('[data-test="group-received"] [data-test="part-HT-LFT-8400"]').waitFor();
        const { parts } = await apiGet<{ parts: { partNumber: string; state: string; unitCostCents?: number }[] }>(
          s,
          `/api/builds/${buildId}/parts?pageSize=500`,
        );
        expect(parts.find((p) => p.partNumber === 'HT-LFT-8400')!.state).toBe('received');
        expect(parts.every((p) => !('unitCostCents' in p))).toBe(true);
        await audit(s, 'parts after receiving (phone)');
      } finally {
        await s.close();
      }
    },
    JOURNEY_TIMEOUT,
  );

  it(
    'owner sees spend against budget on the builds list',
    async () => {
      const s = await openBrowser({ server: app().server });
      const { page } = s;
      try {
        await signIn(s, 'owner');
        const card = page.locator('[data-test="build-project-tern"]');
        await card.waitFor();
        const spend = card.locator('[data-test="spend"]');
        await spend.waitFor();
        const text = await spend.innerText();
        expect(text).toMatch(/\$[\d,]+\.\d\d spent of \$[\d,]+\.\d\d budget/);
        expect(await card.locator('[data-test="progress"]').innerText()).toMatch(/\d+ of \d+ upgrades done/);
        // The figure matches what the API computes.
        const { builds } = await apiGet<{ builds: { slug: string; spentCents: number }[] }>(s, '/api/builds');
        const cents = builds.find((b) => b.slug === 'project-tern')!.spentCents;
        expect(text).toContain(
          new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' }).format(cents / 100),
        );
        await audit(s, 'builds list (owner)');
        await card.getByRole('link', { name: /Settings/ }).click();
        await page.getByLabel('VIN').waitFor();
        await page.getByLabel('Budget (dollars)').waitFor();
        await audit(s, 'build settings (owner)');
        const buildId = await ternId(s);

        // VIN: the regulation's worked example 1M8GDM9AXKP042788 (49 CFR 565.15(c)) has check digit
        // X and year code K (1989 or 2019). With a wrong ninth character the check warns, shows the
        // computed digit, and the VIN is kept only with the explicit override.
        await page.getByLabel('VIN').fill('1M8GDM9A1KP042788');
        await page.locator('[data-test="vin-digit"]').waitFor();
        expect(await page.locator('[data-test="vin-digit"]').innerText()).toBe('X');
        expect(await page.locator('[data-test="vin-years"]').innerText()).toBe('1989 or 2019');
        await audit(s, 'VIN warning');
        await page.getByRole('button', { name: 'Save settings' }).click();
        await page.getByText('Tick “use this VIN anyway”').waitFor();
        await page.locator('[data-test="vin-override"]').click();
        await outcomeOf(page, () => page.getByRole('button', { name: 'Save settings' }).click(), {
          request: { method: 'PATCH', path: `/api/builds/${buildId}` },
          toast: 'Settings saved.',
        });
        const { build } = await apiGet<{
          build: { vin: string; vinCheckOverridden: boolean; version: number; budgetCents: number };
        }>(s, `/api/builds/${buildId}`);
        expect(build.vin).toBe('1M8GDM9A1KP042788');
        expect(build.vinCheckOverridden).toBe(true);

        // Someone else saves while the owner edits: the owner re-applies only their own change.
        await page.getByLabel('Mileage').fill('23456');
        const other = await s.page.request.patch(`${s.server.url}/api/builds/${buildId}`, {
          headers: { 'X-Requested-With': 'Bayslate' },
          data: { summary: 'Changed in another tab', version: build.version },
        });
        expect(other.status()).toBe(200);
        await outcomeOf(page, () => page.getByRole('button', { name: 'Save settings' }).click(), {
          request: { method: 'PATCH', path: `/api/builds/${buildId}`, status: 409 },
        });
        await page.getByText('Someone else changed this first').waitFor();
        await audit(s, 'stale dialog');
        await outcomeOf(page, () => page.getByRole('button', { name: 'Apply my change again' }).click(), {
          request: { method: 'PATCH', path: `/api/builds/${buildId}` },
          toast: 'Settings saved.',
        });
        const after = (await apiGet<{ build: { mileage: number; summary: string } }>(s, `/api/builds/${buildId}`))
          .build;
        expect(after.mileage).toBe(23456);
        expect(after.summary).toBe('Changed in another tab');
      } finally {
        await s.close();
      }
    },
    JOURNEY_TIMEOUT,
  );

  it(
    'marketing sees retail prices but no shop cost',
    async () => {
      const s = await openBrowser({ server: app().server });
      const { page } = s;
      try {
        await signIn(s, 'marketing');
        const card = page.locator('[data-test="build-project-tern"]');
        await card.waitFor();
        expect(await card.locator('[data-test="spend"]').count()).toBe(0);
        expect(await card.innerText()).not.toMatch(/spent|budget/i);
        const buildId = await ternId(s);
        const lamps = await upgradeByTitle(s, buildId, 'Projector LED headlamps');
        await visit(s, `/builds/${buildId}/backlog?upgrade=${lamps.id}`);
        const line = drawer(page).locator('[data-test="part-HT-LMP-4410-L"]');
        await line.waitFor();
        expect(await line.innerText()).toContain('Retail $689.00');
        expect(await drawer(page).innerText()).not.toMatch(/Cost \$|Parts cost|Value added|adds \$/);
        expect(await drawer(page).getByRole('button', { name: 'Log hours' }).count()).toBe(0);
        expect(await drawer(page).getByRole('button', { name: 'Edit details' }).count()).toBe(0);
        await audit(s, 'drawer (marketing)');
        // Marketing keeps product pages current, and nothing else on the part.
        await line.getByRole('button', { name: /Change product page/ }).click();
        await line
          .getByLabel('Product page for HT-LMP-4410-L')
          .fill('https://shop.cedar-ridge.test/parts/ht-lmp-4410-l');
        await outcomeOf(page, () => line.getByRole('button', { name: 'Save link' }).click(), {
          request: { method: 'PATCH', path: /\/parts\/\d+$/ },
          toast: 'Product page saved.',
        });
        const { parts: lampParts } = await apiGet<{
          parts: { partNumber: string; productUrl: string | null; unitCostCents?: number }[];
        }>(s, `/api/builds/${buildId}/parts?upgradeId=${lamps.id}`);
        const left = lampParts.find((p) => p.partNumber === 'HT-LMP-4410-L')!;
        expect(left.productUrl).toBe('https://shop.cedar-ridge.test/parts/ht-lmp-4410-l');
        expect('unitCostCents' in left).toBe(false);
        // The wheel-and-tire panel and the cautions of a flagged upgrade.
        const wheels = await upgradeByTitle(s, buildId, '20-inch alloy wheels');
        await visit(s, `/builds/${buildId}/backlog?upgrade=${wheels.id}`);
        const tires = drawer(page).locator('[data-test="tire-check"]');
        await tires.waitFor();
        const expected = compareTires('235/65R18', '255/50R20');
        if (!expected.ok) throw new Error('demo sizes should parse');
        expect(await tires.locator('[data-test="tire-change"]').innerText()).toBe(expected.display.diameterChange);
        expect(await tires.locator('[data-test="tire-speedo"]').innerText()).toBe(
          `${expected.display.speedometerAtTrue60} mph`,
        );
        expect(await tires.locator('[data-test="tire-warning"]').count()).toBe(expected.warning ? 1 : 0);
        expect(await tires.innerText()).toContain(`${expected.to.display.overallDiameter} in`);
        expect(await drawer(page).locator('[data-test="caution-wheels_tires"]').innerText()).toContain(
          SAFETY_CAUTIONS.wheels_tires.caution,
        );
        expect(await drawer(page).locator('[data-test="caution-lifting"]').count()).toBe(1);
        await audit(s, 'tire check (marketing)');

        await visit(s, `/builds/${buildId}/parts`);
        await page.locator('[data-test="part-HT-LMP-4410-L"] [data-test="retail"]').waitFor();
        expect(await page.locator('main').innerText()).not.toMatch(/Cost \$/);
        expect(await page.getByRole('button', { name: /Mark received/ }).count()).toBe(0);
      } finally {
        await s.close();
      }
    },
    JOURNEY_TIMEOUT,
  );
});
