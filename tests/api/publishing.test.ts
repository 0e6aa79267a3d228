// Chapters, show notes, publishing, link health and campaign (routes/publishing.ts, linkHealth.ts),
// and the "it is live" mail that publishing queues for viewers who asked (services/notifications.ts).
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, signInAs as signInFresh, type DemoRole } from '../helpers/api';
import { count, counts } from '../helpers/db';
import { mailsTo, linkIn } from '../helpers/mailbox';
import { Build, Episode, EpisodeChapter, Part, Upgrade, MailOutbox, Activity, sequelize } from '../../server/models';
import { processDueMail } from '../../server/mail/worker';
import { config } from '../../server/config';
import { everyAnswerHasAContract } from '../helpers/contract';

// Every JSON answer these tests read is parsed with its route's contract (shared/contracts).
everyAnswerHasAContract();

let tern: Build;
let ep3: Episode;
let ep8: Episode;
let other: Build;
let otherEp: Episode;
// One sign-in per role for the whole file (sign-in itself is rate-limited).
const agents = new Map<DemoRole, Awaited<ReturnType<typeof signInFresh>>>();
async function signInAs(role: DemoRole) {
  if (!agents.has(role)) agents.set(role, await signInFresh(role));
  return agents.get(role)!;
}
const base = () => `/api/builds/${tern.id}`;
const epUrl = (e: Episode, s: string) => `${base()}/episodes/${e.id}/${s}`;

beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
  ep3 = (await Episode.findOne({ where: { buildId: tern.id, number: 3 } }))!;
  ep8 = (await Episode.findOne({ where: { buildId: tern.id, number: 8 } }))!;
  other = await Build.create({
    slug: 'publishing-other',
    name: 'Other',
    year: 2020,
    make: 'Halvorsen',
    model: 'Skua',
    vin: null,
    mileage: null,
    budgetCents: 1,
    labourRateCents: 1,
    campaign: null,
    summary: null,
  });
  otherEp = await Episode.create({
    buildId: other.id,
    number: 1,
    title: 'Elsewhere',
    summary: null,
    shootDate: null,
    releaseDate: null,
    videoUrl: null,
    runtimeSeconds: 600,
    publishedAt: null,
  });
});

/** Every upgrade of the episode installed with both segments shot: only then may it go live. */
async function finishEpisode(ep: Episode) {
  await Upgrade.update(
    { installState: 'installed', installSegment: 'shot', demoSegment: 'shot' },
    { where: { episodeId: ep.id } },
  );
}

const GOOD = [
  { startSeconds: 0, title: 'Intro', upgradeId: null },
  { startSeconds: 75, title: 'Cover off' },
  { startSeconds: 640, title: 'Radar mounts' },
];

describe('chapters', () => {
  it('marketing reads the demo chapters of a live episode', async () => {
    const res = await (await signInAs('marketing')).get(epUrl(ep3, 'chapters'));
    expect(res.status).toBe(200);
    expect(res.body.chapters.map((c: { startSeconds: number }) => c.startSeconds)).toEqual([0, 80, 285, 690, 1090]);
    expect(res.body.runtimeSeconds).toBe(1210);
    expect(res.body.episode).toMatchObject({ id: ep3.id, number: 3, state: 'live' });
  });

  it('saves a good list, replacing the old one, and records it', async () => {
    const m = await signInAs('marketing');
    const ep = (await Episode.findOne({ where: { buildId: tern.id, number: 2 } }))!;
    const bumper = (await Upgrade.findOne({ where: { buildId: tern.id, title: 'Roof rails' } }))!;
    const res = await m
      .put(epUrl(ep, 'chapters'))
      .send({ chapters: GOOD.map((c, i) => ({ ...c, upgradeId: i === 1 ? bumper.id : null })) });
    expect(res.status).toBe(200);
    expect(res.body.chapters).toHaveLength(3);
    expect(res.body.chapters[1]).toMatchObject({ startSeconds: 75, title: 'Cover off', upgradeId: bumper.id });
    expect(await EpisodeChapter.count({ where: { episodeId: ep.id } })).toBe(3);
    expect(await Activity.count({ where: { entity: 'episode', entityId: ep.id, action: 'chapters' } })).toBe(1);
    const again = await m.put(epUrl(ep, 'chapters')).send({ chapters: [GOOD[0]] });
    expect(again.status).toBe(200);
    expect(await EpisodeChapter.count({ where: { episodeId: ep.id } })).toBe(1);
  });

  const bad: [string, unknown[], number | null, string, RegExp][] = [
    [
      'out of order',
      [GOOD[0], { startSeconds: 300, title: 'B' }, { startSeconds: 200, title: 'C' }],
      null,
      'chapters.2.startSeconds',
      /row 3: Starts at 3:20, which is not after the chapter before it \(5:00\)/,
    ],
    [
      'past the runtime',
      [GOOD[0], { startSeconds: 1300, title: 'Too late' }],
      null,
      'chapters.1.startSeconds',
      /row 2: Starts at 21:40, at or past the end of the video \(20:10\)/,
    ],
    [
      'not starting at 0:00',
      [{ startSeconds: 5, title: 'Intro' }],
      null,
      'chapters.0.startSeconds',
      /row 1: The first chapter must start at 0:00, not 0:05/,
    ],
    [
      'past a new runtime given with it',
      [GOOD[0], { startSeconds: 700, title: 'X' }],
      600,
      'chapters.1.startSeconds',
      /row 2: .*10:00/,
    ],
    [
      'with an empty title',
      [{ startSeconds: 0, title: '  ' }],
      null,
      'chapters.0.title',
      /row 1: A chapter title is required/,
    ],
  ];
  for (const [label, chapters, runtime, path, message] of bad) {
    it(`refuses chapters ${label}, naming the row, and writes nothing`, async () => {
      const m = await signInAs('marketing');
      const before = await counts('episode_chapters', 'activities');
      const res = await m
        .put(epUrl(ep3, 'chapters'))
        .send({ chapters, ...(runtime ? { runtimeSeconds: runtime } : {}) });
      expect(res.status).toBe(400);
      expect(res.body.error.message).toMatch(message);
      expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(path);
      expect(await counts('episode_chapters', 'activities')).toEqual(before);
      expect((await ep3.reload()).runtimeSeconds).toBe(1210);
    });
  }

  it("refuses a chapter naming another build's upgrade", async () => {
    const foreign = await Upgrade.create({
      buildId: other.id,
      title: 'Foreign',
      area: 'front',
      replaces: null,
      becomes: null,
      installedOn: null,
      episodeId: null,
      episodePosition: null,
      notes: null,
      tireFrom: null,
      tireTo: null,
    });
    const before = await count('episode_chapters');
    const res = await (
      await signInAs('producer')
    )
      .put(epUrl(ep3, 'chapters'))
      .send({ chapters: [{ startSeconds: 0, title: 'Intro', upgradeId: foreign.id }] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('chapters.0.upgradeId');
    expect(await count('episode_chapters')).toBe(before);
  });

  it("answers 404 for another build's episode, 401 signed out, 403 for the installer", async () => {
    const m = await signInAs('marketing');
    expect((await m.get(epUrl(otherEp, 'chapters'))).status).toBe(404);
    expect((await m.put(epUrl(otherEp, 'chapters')).send({ chapters: [GOOD[0]] })).status).toBe(404);
    expect(await EpisodeChapter.count({ where: { episodeId: otherEp.id } })).toBe(0);
    expect((await anonymous().get(epUrl(ep3, 'chapters'))).status).toBe(401);
    expect((await (await signInAs('installer')).get(epUrl(ep3, 'chapters'))).status).toBe(403);
  });
});

describe('show notes and product links', () => {
  it('builds paste-ready notes: chapters, tagged links, cautions and the public page', async () => {
    const res = await (await signInAs('marketing')).get(epUrl(ep3, 'show-notes'));
    expect(res.status).toBe(200);
    const { text, problems } = res.body;
    expect(text.startsWith(`Episode 3: ${ep3.title}`)).toBe(true);
    expect(text).toContain('Chapters\n0:00 Intro\n1:20 Why the stock cover cannot carry radar');
    expect(text).toContain('18:10 Walkaround and what comes next');
    expect(text).toContain(
      'https://shop.cedar-ridge.test/parts/ht-bmp-8100?utm_source=youtube&utm_medium=video&utm_campaign=project-tern&utm_content=episode-3',
    );
    expect(text).toContain('Lifting the vehicle (Rear bumper cover with sensor mounts)');
    expect(text).toContain(`${config().publicUrl}/b/project-tern`);
    // The paint has no product page: named as a problem, and listed by link health.
    expect(problems).toContain('Part HT-PNT-8101 has no product page link.');
  });

  it('link health lists parts shown in episodes without a product link, and drops one once linked', async () => {
    const m = await signInAs('marketing');
    const res = await m.get(`${base()}/link-health`);
    expect(res.status).toBe(200);
    const paint = res.body.parts.find((p: { partNumber: string }) => p.partNumber === 'HT-PNT-8101');
    expect(paint).toMatchObject({ episodeNumber: 3, upgradeTitle: 'Rear bumper cover with sensor mounts' });
    expect(res.body.parts.every((p: { episodeNumber: number }) => p.episodeNumber > 0)).toBe(true);
    expect(JSON.stringify(res.body)).not.toMatch(/Cents/);
    await Part.update({ productUrl: 'https://shop.cedar-ridge.test/parts/ht-pnt-8101' }, { where: { id: paint.id } });
    const after = await m.get(`${base()}/link-health`);
    expect(after.body.parts.find((p: { id: number }) => p.id === paint.id)).toBeUndefined();
    expect((await (await signInAs('installer')).get(`${base()}/link-health`)).status).toBe(403);
  });

  it('marketing sets the campaign, the notes use it; a bad campaign name is refused', async () => {
    const m = await signInAs('marketing');
    const bad = await m.put(`${base()}/campaign`).send({ campaign: 'Winter Push!' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('campaign');
    expect((await tern.reload()).campaign).toBe('project-tern');
    const ok = await m.put(`${base()}/campaign`).send({ campaign: 'tern-winter' });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ campaign: 'tern-winter', effective: 'tern-winter' });
    const notes = await m.get(epUrl(ep3, 'show-notes'));
    expect(notes.body.text).toContain('utm_campaign=tern-winter&utm_content=episode-3');
    const cleared = await m.put(`${base()}/campaign`).send({ campaign: null });
    expect(cleared.body).toMatchObject({ campaign: null, effective: 'project-tern' });
    await m.put(`${base()}/campaign`).send({ campaign: 'project-tern' });
  });
});

describe('publishing', () => {
  it('refuses a video address that is not http(s), and writes nothing', async () => {
    const m = await signInAs('marketing');
    const before = await counts('mail_outbox', 'activities');
    const res = await m.post(epUrl(ep8, 'publish')).send({ videoUrl: 'javascript:alert(1)' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0]).toMatchObject({ path: 'videoUrl', message: 'must be an http or https address' });
    expect((await ep8.reload()).state).toBe('draft');
    expect(await counts('mail_outbox', 'activities')).toEqual(before);
  });

  it('refuses to publish with a runtime that leaves chapters past the end', async () => {
    const m = await signInAs('marketing');
    const res = await m
      .post(epUrl(ep3, 'publish'))
      .send({ videoUrl: 'https://video.example/tern-ep3', runtimeSeconds: 600 });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/row 4: Starts at 11:30, at or past the end of the video \(10:00\)/);
    expect((await ep3.reload()).runtimeSeconds).toBe(1210);
  });

  it('goes live with the video and date, and tells each viewer who asked, once', async () => {
    const m = await signInAs('marketing');
    await finishEpisode(ep8);
    const res = await m
      .post(epUrl(ep8, 'publish'))
      .send({ videoUrl: 'https://video.example/tern-ep8', runtimeSeconds: 1500 });
    expect(res.status).toBe(200);
    expect(res.body.episode).toMatchObject({
      state: 'live',
      videoUrl: 'https://video.example/tern-ep8',
      runtimeSeconds: 1500,
    });
    expect(Date.now() - Date.parse(res.body.episode.publishedAt)).toBeLessThan(60_000);
    expect(await Activity.count({ where: { entity: 'episode', entityId: ep8.id, action: 'publish' } })).toBe(1);
    // The seeded accepted request "Heated steering wheel before winter" (in episode 8) has four voters.
    const live = await MailOutbox.findAll({ where: { kind: 'upgrade_live' } });
    expect(live.map((l) => l.toAddress).sort()).toEqual([
      'dana.p@viewers.test',
      'ole.k@viewers.test',
      'priya.n@viewers.test',
      'sam.w@viewers.test',
    ]);
    // Publishing again (a corrected link) keeps the first date and sends nothing new.
    const first = res.body.episode.publishedAt;
    const again = await m.post(epUrl(ep8, 'publish')).send({ videoUrl: 'https://video.example/tern-ep8-fixed' });
    expect(again.status).toBe(200);
    expect(again.body.episode.publishedAt).toBe(first);
    expect(await MailOutbox.count({ where: { kind: 'upgrade_live' } })).toBe(4);

    await processDueMail();
    const [mail] = await mailsTo('dana.p@viewers.test');
    expect(mail!.subject).toBe('It is live: Heated steering wheel');
    expect(mail!.text).toContain('https://video.example/tern-ep8');
    // mailparser files List-* headers under 'list'.
    expect(JSON.stringify(mail!.headers.get('list'))).toContain('/unsubscribe/');
    const unsub = linkIn(mail!, '/unsubscribe/');
    const token = unsub.split('/unsubscribe/')[1]!;
    expect((await anonymous().get(`/api/public/unsubscribe/${token}`)).status).toBe(200);
  });

  it('an unsubscribed viewer gets no "it is live" mail', async () => {
    // dana.p unsubscribed in the test above; Sam's request is accepted into an upgrade of episode 9.
    const ep9 = (await Episode.findOne({ where: { buildId: tern.id, number: 9 } }))!;
    const wheels = (await Upgrade.findOne({ where: { buildId: tern.id, episodeId: ep9.id } }))!;
    await sequelize.query(
      `UPDATE viewer_requests SET state = 'accepted', upgrade_id = :u WHERE build_id = :b AND title = 'Cargo management rails in the back'`,
      { replacements: { u: wheels.id, b: tern.id } },
    );
    const m = await signInAs('producer');
    await finishEpisode(ep9);
    expect((await m.post(epUrl(ep9, 'publish')).send({ videoUrl: 'https://video.example/tern-ep9' })).status).toBe(200);
    const to = (
      await MailOutbox.findAll({
        where: { kind: 'upgrade_live', dedupeKey: { [(await import('sequelize')).Op.like]: `live:${ep9.id}:%` } },
      })
    ).map((r) => r.toAddress);
    expect(to).toEqual(['sam.w@viewers.test']);
  });

  it("answers 404 for another build's episode and 403 for the installer", async () => {
    expect(
      (
        await (
          await signInAs('marketing')
        )
          .post(epUrl(otherEp, 'publish'))
          .send({ videoUrl: 'https://video.example/x' })
      ).status,
    ).toBe(404);
    expect((await otherEp.reload()).state).toBe('draft');
    expect(
      (await (await signInAs('installer')).post(epUrl(ep8, 'publish')).send({ videoUrl: 'https://video.example/x' }))
        .status,
    ).toBe(403);
  });
});
