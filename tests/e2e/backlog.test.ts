// The backlog in the browser as the producer plans it: create, edit, link a prerequisite, see a loop
// refused, import parts from CSV, delete with a question first, expenses and removed parts, a new
// build. The installer's, the owner's and marketing's journeys: backlogRoles.test.ts.
import { describe, it, expect } from 'vitest';
import type { Page } from 'playwright-core';
import { openBrowser, signIn, audit, visit, pickOption } from '../helpers/browser';
import { freshAppPerTest } from '../helpers/fresh-db';
import { outcomeOf } from '../helpers/outcome';
import { apiGet, ternId, upgradeByTitle, drawer, JOURNEY_TIMEOUT } from '../helpers/backlog';

// Each test runs on a database of its own, cloned from the template as it starts.
const app = freshAppPerTest();

/** Picks an option of a naive-ui select inside the given form item. */
async function choose(page: Page, scope: ReturnType<Page['locator']>, option: string) {
  await pickOption(page, scope.locator('.n-base-selection').first(), option);
}

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
});
