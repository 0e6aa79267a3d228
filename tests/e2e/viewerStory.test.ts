// The whole viewer story in the browser: a viewer asks for an upgrade on /b/project-tern,
// confirms it by the link in the development inbox (/dev/mail), marketing accepts it into the
// backlog, the producer plans it into an episode, marketing publishes that episode, and the
// viewer's "it is live" mail arrives. The server runs its mail worker, as `npm start` does.
import { describe, it, expect } from 'vitest';
import { openBrowser, signIn, signInQuick, audit, visit, type BrowserSession } from '../helpers/browser';
import { waitForMails, uniqueAddress } from '../helpers/mailbox';
import { freshAppPerTest, ternId } from '../helpers/fresh-db';
import { outcomeOf } from '../helpers/outcome';

// Each test runs on a database of its own, cloned from the template as it starts.
const app = freshAppPerTest({ MAIL_WORKER: '1', MAIL_POLL_MS: '150' });

/** A call to our API from inside the signed-in page (its cookies, our cross-site header). */
async function apiFromPage<T>(
  s: BrowserSession,
  method: string,
  url: string,
  body?: unknown,
): Promise<{ status: number; body: T }> {
  return s.page.evaluate(
    async ([m, u, b]) => {
      const res = await fetch(u as string, {
        method: m as string,
        headers: { 'Content-Type': 'application/json', 'X-Requested-With': 'Bayslate' },
        body: b === undefined ? undefined : JSON.stringify(b),
      });
      return { status: res.status, body: await res.json().catch(() => null) };
    },
    [method, url, body] as const,
  ) as Promise<{ status: number; body: T }>;
}

describe('viewer story', () => {
  it('a viewer request becomes an upgrade, goes into an episode, and the viewer hears when it is live', async () => {
    const db = app().db;
    const tern = { id: await ternId(db) };
    const episodeRow = async () =>
      (
        await db.sql<{ id: number; title: string; state: string; videoUrl: string | null }>(
          `SELECT id, title, state, video_url AS "videoUrl" FROM episodes WHERE build_id = $1 AND number = 10`,
          [tern.id],
        )
      )[0];
    const episode = await episodeRow();
    expect(episode.state).not.toBe('live');
    const email = uniqueAddress('story');
    const wish = `Illuminated cargo sill ${Date.now().toString(36)}`;

    // 1. The viewer, not signed in, asks on the public page.
    // The viewer is on a phone.
    const viewer = await openBrowser({ server: app().server, phone: true });
    try {
      await visit(viewer, '/b/project-tern');
      await viewer.page.getByRole('heading', { name: 'Project Tern' }).waitFor();
      await viewer.page.getByRole('heading', { name: 'Safety notes' }).waitFor();
      await viewer.page.getByLabel('What upgrade should we do?').fill('ab');
      await viewer.page.getByRole('button', { name: 'Send my request' }).click();
      await viewer.page.getByText('Upgrade must be at least 3 characters').waitFor();
      await viewer.page.getByLabel('What upgrade should we do?').fill(wish);
      await viewer.page
        .getByLabel('Details (optional)')
        .fill('Soft light on the cargo sill when the liftgate opens. <b>please</b>');
      const emailBox = viewer.page.locator('#rf-new-email');
      await emailBox.fill('not-an-address');
      await viewer.page.getByRole('button', { name: 'Send my request' }).click();
      await viewer.page.getByText('E-mail must be an e-mail address').waitFor();
      await emailBox.fill(email);
      await outcomeOf(viewer.page, () => viewer.page.getByRole('button', { name: 'Send my request' }).click(), {
        request: { method: 'POST', path: '/api/public/builds/project-tern/requests' },
      });
      await viewer.page.getByRole('status').filter({ hasText: 'confirmation mail is on its way' }).waitFor();
      await audit(viewer, 'public page after a request');

      // 2. The confirmation mail, read in the development inbox; its link confirms the vote.
      await waitForMails(email, 1);
      await visit(viewer, '/dev/mail');
      // The subject is fixed (no viewer text in it): this viewer's mail is the row with their address.
      await viewer.page
        .getByRole('row', { name: new RegExp(email.replace(/[.+]/g, '\\$&')) })
        .getByRole('link', { name: 'Confirm your vote on the Project Tern build' })
        .click();
      await viewer.page.getByRole('heading', { name: 'Confirm your vote on the Project Tern build' }).waitFor();
      await viewer.page.getByText(`“${wish}”`).waitFor();
      await audit(viewer, 'development inbox message');
      await viewer.page.getByRole('link', { name: /\/confirm\// }).click();
      await viewer.page.getByRole('heading', { name: 'Your vote is counted' }).waitFor();
      await viewer.page.getByText(wish).first().waitFor();
      await audit(viewer, 'vote confirmed');
      // The request now shows on the public page, its text shown as text.
      await visit(viewer, '/b/project-tern');
      const item = viewer.page.locator('li', { hasText: wish }).first();
      await item.waitFor();
      expect(await item.innerText()).toContain('<b>please</b>');
    } finally {
      await viewer.close();
    }

    // 3. Marketing accepts it into the backlog as a new upgrade.
    const marketing = await openBrowser({ server: app().server });
    try {
      await signInQuick(marketing, 'marketing');
      await visit(marketing, `/builds/${tern.id}/viewer-requests`);
      await marketing.page.getByRole('heading', { name: 'Viewer requests' }).waitFor();
      await marketing.page.locator('strong', { hasText: wish }).waitFor();
      await marketing.page.getByRole('button', { name: `Accept ${wish}` }).click();
      await marketing.page.getByRole('dialog').getByText('Create a new upgrade').click();
      await marketing.page.getByLabel('Title of the new upgrade').fill('Cargo sill lamp');
      await marketing.page.locator('[aria-labelledby="vr-new-area-l"]').click();
      await marketing.page.locator('.n-base-select-option:visible', { hasText: 'Rear' }).first().click();
      await audit(marketing, 'accept dialog');
      await outcomeOf(
        marketing.page,
        () => marketing.page.getByRole('button', { name: 'Accept into the backlog' }).click(),
        { request: { method: 'PATCH', path: /\/viewer-requests\/\d+$/ } },
      );
      await marketing.page.getByText('Accepted into the backlog as Cargo sill lamp.').waitFor();
      await marketing.page.locator('.filters').getByText('Accepted', { exact: true }).click();
      await marketing.page.getByText('Upgrade: Cargo sill lamp').waitFor();
      await audit(marketing, 'viewer requests after accepting');
    } finally {
      await marketing.close();
    }
    const [upgrade] = await db.sql<{ id: number; area: string; episodeId: number | null; version: number }>(
      `SELECT id, area, episode_id AS "episodeId", version FROM upgrades WHERE build_id = $1 AND title = 'Cargo sill lamp'`,
      [tern.id],
    );
    expect(upgrade).toMatchObject({ area: 'rear', episodeId: null });

    // 4. The producer plans it into an episode (through the API, signed in in the browser).
    const producer = await openBrowser({ server: app().server });
    try {
      await signIn(producer, 'producer');
      const r = await apiFromPage<{ upgrade: { episodeId: number } }>(
        producer,
        'PATCH',
        `/api/builds/${tern.id}/upgrades/${upgrade.id}`,
        { episodeId: episode.id, version: upgrade.version },
      );
      expect(r.status, JSON.stringify(r.body)).toBe(200);
      expect(r.body.upgrade.episodeId).toBe(episode.id);
    } finally {
      await producer.close();
    }

    // The shop finishes every upgrade of the episode (the shop floor's own journeys cover those marks);
    // only a finished episode goes live.
    await db.sql(
      `UPDATE upgrades SET install_state = 'installed', install_segment = 'shot', demo_segment = 'shot' WHERE episode_id = $1`,
      [episode.id],
    );

    // 5. Marketing publishes that episode on the Publish screen.
    const publisher = await openBrowser({ server: app().server });
    try {
      await signInQuick(publisher, 'marketing');
      await visit(publisher, `/builds/${tern.id}/publish?episode=${episode.id}`);
      await publisher.page.getByRole('heading', { name: 'Publish', exact: true }).waitFor();
      const notes = publisher.page.locator('[data-test="show-notes"]');
      await notes.getByText(`Episode 10: ${episode.title}`).waitFor();
      await publisher.page.getByRole('button', { name: 'Add a chapter' }).click();
      await publisher.page.getByLabel('Title of chapter 1').fill('Intro');
      await publisher.page.getByRole('button', { name: 'Add a chapter' }).click();
      await publisher.page.getByLabel('Start of chapter 2').fill('0:00');
      await publisher.page
        .getByText('Chapter 2: Starts at 0:00, which is not after the chapter before it')
        .first()
        .waitFor();
      await publisher.page.getByLabel('Start of chapter 2').fill('2:15');
      await publisher.page.getByLabel('Title of chapter 2').fill('Fitting the sill lamp');
      await notes.getByText('2:15 Fitting the sill lamp').waitFor();
      await audit(publisher, 'publish screen with chapters');
      await publisher.page.getByLabel('Video address').fill('https://video.example/tern-ep10');
      await publisher.page.getByRole('button', { name: 'Publish episode' }).click();
      await outcomeOf(
        publisher.page,
        () => publisher.page.getByRole('dialog').getByRole('button', { name: 'Publish' }).click(),
        { request: { method: 'POST', path: `/episodes/${episode.id}/publish` } },
      );
      await publisher.page.getByText('Episode 10 is live.').waitFor();
      await audit(publisher, 'episode published');
    } finally {
      await publisher.close();
    }
    expect(await episodeRow()).toMatchObject({ state: 'live', videoUrl: 'https://video.example/tern-ep10' });

    // 6. The viewer's "it is live" mail arrives, with an unsubscribe link.
    const mails = await waitForMails(email, 2, 20_000);
    const live = mails.find((m) => m.subject.startsWith('It is live'))!;
    expect(live.subject).toBe('It is live: Cargo sill lamp');
    expect(live.text).toContain('https://video.example/tern-ep10');
    expect(live.text).toMatch(/\/unsubscribe\/[0-9a-f]{64}\.[0-9a-f]{32}/);
  });
});
