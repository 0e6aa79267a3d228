// A week in the shop on the demo build (issue 11), in one journey on this file's own database:
// Monday the producer accepts a proposed plan after reading what it changes, then undoes it in one
// click; Tuesday the supplier pushes the wireless charging pad of "Ready to tow" past its shoot, the
// producer records the new date in the upgrade's drawer, and the planner's slip alert names the
// episode, its new release and the days it is at risk; Wednesday the installer works the bay on a
// phone (390 px), starting with the in-bay wheel of draft episode 8, and films its install segment
// (checked in the database); Thursday marketing tries to publish "Ready to tow" too early and is
// told what is missing; Friday, once the shop has finished the work, it goes live, and only the
// viewers whose upgrades it shows get the "it is live" mail.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { Op } from 'sequelize';
import { openBrowser, signIn, signInQuick, audit, visit, startAppServer, type AppServer } from '../helpers/browser';
import { waitForMails, uniqueAddress } from '../helpers/mailbox';
import { Activity, Build, Episode, MailOutbox, Part, Upgrade, ViewerRequest, ViewerVote } from '../../server/models';
import { outcomeOf } from '../helpers/outcome';
import { addDays } from '../../shared/planner/dates';
import { emailHash, newToken } from '../../server/services/viewerPrivacy';

let server: AppServer;
beforeAll(async () => {
  server = await startAppServer({ MAIL_WORKER: '1', MAIL_POLL_MS: '150' });
});
afterAll(async () => {
  await server?.stop();
});

/** An accepted viewer request for `upgradeId` with one confirmed voter. */
async function voterFor(buildId: number, upgradeId: number, title: string, email: string) {
  const req = await ViewerRequest.create({
    buildId,
    title,
    details: null,
    state: 'accepted',
    upgradeId,
    confirmedAt: new Date(),
  });
  await ViewerVote.create({
    requestId: req.id,
    emailHash: emailHash(email),
    emailSealed: null,
    email,
    name: null,
    confirmTokenHash: newToken().hash,
    expiresAt: new Date(Date.now() + 3_600_000),
    confirmedAt: new Date(),
  });
}

async function planNow(buildId: number) {
  const ups = await Upgrade.findAll({ where: { buildId }, order: [['id', 'ASC']] });
  const eps = await Episode.findAll({ where: { buildId }, order: [['number', 'ASC']] });
  return {
    episodes: eps.map((e) => [e.id, e.number, e.shootDate, e.releaseDate]),
    upgrades: ups.map((u) => [u.id, u.episodeId, u.episodePosition]),
  };
}

describe('a week in the shop', () => {
  it(
    'plan accepted and undone; a late part puts a release at risk; the installer works the bay on a phone; publishing waits for finished work; only the right viewers are told',
    { timeout: 300_000 },
    async () => {
      const tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
      const ep7 = (await Episode.findOne({ where: { buildId: tern.id, number: 7 } }))!;
      expect(ep7).toMatchObject({ title: 'Ready to tow', state: 'scheduled' });
      const wiring = (await Upgrade.findOne({ where: { buildId: tern.id, title: 'Trailer wiring, 7-pin' } }))!;
      const pad = (await Upgrade.findOne({ where: { buildId: tern.id, title: 'Wireless charging pad' } }))!;
      const towVoter = uniqueAddress('tow');
      const padVoter = uniqueAddress('pad');
      await voterFor(tern.id, wiring.id, 'Show the trailer wiring', towVoter);
      await voterFor(tern.id, pad.id, 'Phone charging pad', padVoter);

      // Monday: the producer reads what a proposal changes, applies it, and thinks better of it.
      const before = await planNow(tern.id);
      const producer = await openBrowser({ server });
      try {
        await signInQuick(producer, 'producer');
        await visit(producer, `/builds/${tern.id}/planner`);
        await producer.page.getByRole('heading', { name: 'Episode planner' }).waitFor();
        await producer.page.getByRole('heading', { name: 'No release at risk from parts' }).waitFor();
        await producer.page.getByRole('button', { name: 'Propose a plan' }).click();
        const proposal = producer.page.getByRole('region', { name: 'Proposed plan' });
        await proposal
          .locator('[data-test="proposal-summary"]')
          .getByRole('heading', { name: 'What accepting changes' })
          .waitFor();
        await audit(producer, 'proposal with its summary');
        await proposal.getByRole('button', { name: 'Accept proposal' }).click();
        const ask = producer.page.getByRole('dialog');
        await ask.getByText(/upgrade\(s\) move/).waitFor();
        await ask.getByRole('button', { name: 'Apply the plan' }).click();
        await producer.page.getByText(/Proposal applied/).waitFor();
        expect(await planNow(tern.id)).not.toEqual(before);
        const undo = producer.page.locator('[data-test="plan-undo"]');
        await undo.getByText(/Last plan change: Applied a plan/).waitFor();
        await audit(producer, 'planner with undo');
        await undo.getByRole('button', { name: 'Undo the last plan change' }).click();
        await producer.page.getByText(/Plan change undone/).waitFor();
        await undo.waitFor({ state: 'detached' });
        expect(await planNow(tern.id)).toEqual(before);

        // Tuesday: the charging pad's supplier now promises it six days after episode 7's shoot; the
        // producer records the date on the part, in the upgrade's drawer.
        const padPart = (await Part.findOne({
          where: { buildId: tern.id, upgradeId: pad.id, partNumber: 'HT-WCP-9510' },
        }))!;
        const due = addDays(ep7.shootDate!, 6);
        await visit(producer, `/builds/${tern.id}/backlog?upgrade=${pad.id}`);
        const line = producer.page.locator('.n-drawer').locator('[data-test="part-HT-WCP-9510"]');
        await line.getByRole('button', { name: 'Edit HT-WCP-9510' }).click();
        await line.getByLabel('Expected arrival').fill(due);
        await outcomeOf(producer.page, () => line.getByRole('button', { name: 'Save part' }).click(), {
          request: { method: 'PATCH', path: `/parts/${padPart.id}` },
          toast: 'Part saved.',
        });
        await padPart.reload();
        expect(padPart.expectedArrival).toBe(due);
        // Worked by hand: the episode cannot shoot before the pad is in, so its shoot moves from S to
        // S + 6 and its release by the same six days.
        const newRelease = addDays(ep7.releaseDate!, 6);
        await visit(producer, `/builds/${tern.id}/planner`);
        await producer.page.getByRole('heading', { name: '1 release at risk from late parts' }).waitFor();
        const risk = producer.page.locator(`li[data-episode="${ep7.id}"]`);
        expect((await risk.innerText()).replace(/\s+/g, ' ')).toContain(
          `Episode 7, Ready to tow: release ${ep7.releaseDate} → ${newRelease}, 6 days later. Waiting on HT-WCP-9510 (Wireless charging pad, 15 W) for Wireless charging pad, due ${due}.`,
        );
        await producer.page.getByRole('button', { name: /Notices \(\d+ new\)/ }).click();
        await producer.page
          .locator('#notice-list')
          .getByText(`Episode 7, "Ready to tow": release ${ep7.releaseDate} at risk by 6 days`, { exact: false })
          .waitFor();
        await audit(producer, 'planner with the slip alert');
      } finally {
        await producer.close();
      }

      // Wednesday: the installer works the bay on a phone, first the in-bay wheel of draft episode 8.
      const ep8 = (await Episode.findOne({ where: { buildId: tern.id, number: 8 } }))!;
      const wheel = (await Upgrade.findOne({ where: { buildId: tern.id, title: 'Heated steering wheel' } }))!;
      expect([ep8.state, wheel.episodeId, wheel.installState, wheel.installSegment]).toEqual([
        'draft',
        ep8.id,
        'in_bay',
        'not_shot',
      ]);
      const installer = await openBrowser({ server, phone: true });
      try {
        await signIn(installer, 'installer');
        await installer.page.waitForURL(`**/builds/${tern.id}/shop-floor`);
        const inBay = installer.page.getByRole('region', { name: 'In the bay now' });
        const first = inBay.getByRole('listitem').first();
        await first.getByRole('heading', { name: /Heated steering wheel/ }).waitFor();
        await first.getByText(`Episode 8: ${ep8.title}`).waitFor();
        expect(await installer.page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
        await first.getByRole('button', { name: 'I have read this caution for Heated steering wheel' }).click();
        await first.getByRole('button', { name: 'Read the caution for Heated steering wheel' }).waitFor();
        const marksBefore = await Activity.count({
          where: { buildId: tern.id, entity: 'upgrade', entityId: wheel.id, action: 'update' },
        });
        await outcomeOf(
          installer.page,
          () => first.getByRole('button', { name: 'Install segment shot for Heated steering wheel' }).click(),
          { request: { method: 'PATCH', path: `/upgrades/${wheel.id}` } },
        );
        await installer.page
          .locator('[data-test="undo-bar"]')
          .getByText('Install segment of Heated steering wheel marked shot.')
          .waitFor();
        await first.getByText('In the bay · filmed: install').waitFor();
        await audit(installer, 'shop floor at 390 px after filming the wheel');
        await wheel.reload();
        expect([wheel.episodeId, wheel.installState, wheel.installSegment]).toEqual([ep8.id, 'in_bay', 'shot']);
        expect(
          await Activity.count({
            where: { buildId: tern.id, entity: 'upgrade', entityId: wheel.id, action: 'update' },
          }),
        ).toBe(marksBefore + 1);
      } finally {
        await installer.close();
      }

      // Thursday: marketing opens episode 7 too early and is told what is missing.
      const marketing = await openBrowser({ server });
      try {
        await signInQuick(marketing, 'marketing');
        await visit(marketing, `/builds/${tern.id}/publish?episode=${ep7.id}`);
        await marketing.page.getByRole('heading', { name: 'Publish', exact: true }).waitFor();
        const missing = marketing.page.locator('[data-test="unfinished"]');
        await missing.getByText('Trailer brake controller').waitFor();
        expect(await missing.innerText()).toContain(
          'Wireless charging pad: not installed (Queued), install segment not shot, demo segment not shot',
        );
        await marketing.page.getByLabel('Video address').fill('https://video.example/tern-ep7');
        expect(await marketing.page.getByRole('button', { name: 'Publish episode' }).isDisabled()).toBe(true);
        await audit(marketing, 'publish screen, episode not finished');
      } finally {
        await marketing.close();
      }

      // Friday: the shop has finished the work (the shop floor's own journeys cover those marks).
      await Upgrade.update(
        { installState: 'installed', installSegment: 'shot', demoSegment: 'shot' },
        { where: { buildId: tern.id, episodeId: ep7.id } },
      );
      const publisher = await openBrowser({ server });
      try {
        await signInQuick(publisher, 'marketing');
        await visit(publisher, `/builds/${tern.id}/publish?episode=${ep7.id}`);
        await publisher.page.locator('[data-test="ready"]').waitFor();
        await publisher.page.getByRole('button', { name: 'Add a chapter' }).click();
        await publisher.page.getByLabel('Title of chapter 1').fill('Intro');
        await publisher.page.getByLabel('Video address').fill('https://video.example/tern-ep7');
        await publisher.page.getByRole('button', { name: 'Publish episode' }).click();
        await publisher.page.getByRole('dialog').getByRole('button', { name: 'Publish' }).click();
        await publisher.page.getByText('Episode 7 is live.').waitFor();
        await audit(publisher, 'episode 7 published');
      } finally {
        await publisher.close();
      }

      // Only the viewers of upgrades episode 7 shows are told; the demo's other voters are not.
      const [towMail] = await waitForMails(towVoter, 1, 20_000);
      expect(towMail!.subject).toContain('Trailer wiring, 7-pin');
      await waitForMails(padVoter, 1, 20_000);
      const told = await MailOutbox.findAll({
        where: { kind: 'upgrade_live', dedupeKey: { [Op.like]: `live:${ep7.id}:%` } },
      });
      expect(told.map((m) => m.dedupeKey).sort()).toEqual(
        [`live:${ep7.id}:${emailHash(padVoter)}`, `live:${ep7.id}:${emailHash(towVoter)}`].sort(),
      );
    },
  );
});
