// The producer plans the series in the browser: proposes, accepts, moves an upgrade by keyboard and sees the violation at once.
import { describe, it, expect, beforeEach } from 'vitest';
import { openBrowser, signInQuick, audit, visit } from '../helpers/browser';
import { freshAppPerTest, ternId } from '../helpers/fresh-db';
import { outcomeOf } from '../helpers/outcome';

// Each test runs on a database of its own, cloned from the template as it starts.
const app = freshAppPerTest();
let buildId: number;
beforeEach(async () => {
  buildId = await ternId(app().db);
});

describe('episode planner in the browser', () => {
  it(
    'producer proposes a plan, accepts it, moves an upgrade with the keyboard and sees the violation inline',
    { timeout: 300_000 },
    async () => {
      const s = await openBrowser({ server: app().server });
      const { page } = s;
      try {
        await signInQuick(s, 'producer');
        await visit(s, `/builds/${buildId}/planner`);
        await page.getByRole('heading', { name: 'Episode planner' }).waitFor();
        await page.getByRole('heading', { name: 'No problems in this plan' }).waitFor();
        await page.getByRole('heading', { name: /^Episode 7: Ready to tow/ }).waitFor();
        // The timeline's table alternative.
        await page.getByRole('button', { name: 'Show the dates as a table' }).click();
        await page
          .getByRole('table', { name: 'Shoot and release dates per episode' })
          .getByText('Ready to tow')
          .waitFor();
        await audit(s, 'planner with timeline table');

        // Native drag and drop: an unplanned upgrade dragged onto an episode joins it (not saved yet).
        // The HTML5 drag events, as the browser sends them, with one shared DataTransfer.
        const sensors = page.locator('.unplanned li', { hasText: 'Rear parking sensors' });
        const target = page.locator('[data-test="episode-13"]');
        const dataTransfer = await page.evaluateHandle(() => new DataTransfer());
        // The dragged element itself: after the drop it has left the list, and the browser still
        // ends the drag on it (a locator would wait for an element that is no longer there).
        const source = await sensors.elementHandle();
        await source!.dispatchEvent('dragstart', { dataTransfer });
        await target.dispatchEvent('dragover', { dataTransfer });
        await target.dispatchEvent('drop', { dataTransfer });
        await source!.dispatchEvent('dragend', { dataTransfer });
        await target.locator('.name', { hasText: 'Rear parking sensors' }).waitFor();
        // Over capacity at once (7 h + 3 h in an 8 h episode), said on the episode itself.
        await target.getByRole('note').filter({ hasText: 'over its capacity' }).waitFor();
        await page.getByText('Not in an episode (1)').waitFor();
        await page.getByRole('region', { name: 'Unsaved changes' }).waitFor();
        await page.getByRole('button', { name: 'Discard changes' }).click();
        await page.getByText('Not in an episode (2)').waitFor();

        await outcomeOf(page, () => page.getByRole('button', { name: 'Propose a plan' }).click(), {
          request: { method: 'POST', path: '/plan/proposal' },
        });
        const proposal = page.getByRole('region', { name: 'Proposed plan' });
        await proposal.waitFor();
        // The two unplanned demo upgrades show up as new in the proposal.
        await proposal.getByText('Heated front seats — new in the plan').waitFor();
        await audit(s, 'proposal beside the current plan');
        // What accepting changes is listed first, and applying asks for confirmation.
        await proposal
          .locator('[data-test="proposal-summary"]')
          .getByText(/upgrades? move/)
          .first()
          .waitFor();
        await proposal.getByRole('button', { name: 'Accept proposal' }).click();
        await outcomeOf(page, () => page.getByRole('dialog').getByRole('button', { name: 'Apply the plan' }).click(), {
          request: { method: 'PUT', path: `/api/builds/${buildId}/plan` },
        });
        await proposal.waitFor({ state: 'detached' });
        await page.getByText(/Proposal applied/).waitFor();
        await page.getByRole('heading', { name: 'No problems in this plan' }).waitFor();
        await page.getByText('Not in an episode (0)').waitFor();

        // Keyboard alternative to dragging: the "Move to" list, chosen from the keyboard.
        const picker = page.getByLabel('Move Trailer wiring, 7-pin to');
        // An option's text carries the template's line breaks; its label (what selectOption matches) does not.
        const options = (await picker.locator('option:not([disabled])').allTextContents()).map((o) => o.trim());
        const last = options.filter((o) => o.startsWith('Episode ')).pop()!;
        await picker.focus();
        await picker.selectOption({ label: last });
        const problem = page
          .getByRole('note')
          .filter({ hasText: 'Trailer brake controller' })
          .filter({ hasText: 'prerequisite' });
        await problem.first().waitFor();
        expect(await problem.first().textContent()).toContain('Trailer wiring, 7-pin');
        // The move breaks the prerequisite rule (and, when the proposal filled that episode, its capacity too).
        await page.getByRole('heading', { name: /^[1-9]\d* problems? in this plan/ }).waitFor();
        await audit(s, 'planner with a violation');

        // Discarding from the keyboard restores the saved plan and its clean check.
        // Another move first (any place the list offers; which ones it offers depends on the proposal).
        const back = page.getByLabel('Move Trailer wiring, 7-pin to');
        const offered = (await back.locator('option:not([disabled])').allTextContents())
          .map((o) => o.trim())
          .filter((o) => o.startsWith('Episode ') && o !== last);
        await back.selectOption(offered.length ? { label: offered[0] } : { value: 'none' });
        await page.getByRole('button', { name: 'Discard changes' }).press('Enter');
        await page.getByRole('heading', { name: 'No problems in this plan' }).waitFor();
      } finally {
        await s.close();
      }
    },
  );

  it('producer edits an episode, and a stale save offers to reload', { timeout: 300_000 }, async () => {
    const s = await openBrowser({ server: app().server });
    const { page } = s;
    try {
      await signInQuick(s, 'producer');
      await visit(s, `/builds/${buildId}/planner`);
      await page.getByRole('button', { name: 'Edit episode 8', exact: true }).click();
      const form = page.getByRole('dialog');
      await form.getByLabel('Title').waitFor();
      await audit(s, 'episode edit form');
      // Release before shoot is caught by the shared schema before anything is sent.
      await form.getByLabel('Shoot date').fill('2027-03-10');
      await form.getByLabel('Release date').fill('2027-03-01');
      await form.getByRole('button', { name: 'Save episode' }).click();
      await form.getByText('Release date must be on or after the shoot date').waitFor();
      await form.getByLabel('Release date').fill('2027-03-17');
      // Someone else saves first.
      const [ep] = await app().db.sql<{ id: number }>(
        `UPDATE episodes SET title = 'Renamed elsewhere', version = version + 1, updated_at = now() WHERE build_id = $1 AND number = 8 RETURNING id`,
        [buildId],
      );
      expect(ep, 'episode 8 of the demo build').toBeTruthy();
      await outcomeOf(page, () => form.getByRole('button', { name: 'Save episode' }).click(), {
        request: { method: 'PATCH', path: `/episodes/${ep.id}`, status: 409 },
      });
      await page.getByText('Someone else changed this first').waitFor();
      await audit(s, 'stale episode dialog');
      await page.getByRole('button', { name: 'Reload' }).click();
      await page.getByRole('heading', { name: /^Episode 8: Renamed elsewhere/ }).waitFor();
      const [after] = await app().db.sql<{ shoot: string | null }>(
        `SELECT to_char(shoot_date, 'YYYY-MM-DD') AS shoot FROM episodes WHERE id = $1`,
        [ep.id],
      );
      expect(after.shoot).not.toBe('2027-03-10');
    } finally {
      await s.close();
    }
  });
});
