// The publishing rules (issue 11, "What was seen" 1 and 2): an episode goes live only when every
// upgrade in it is done, through either route, only for marketing, producers and the owner; the
// "it is live" mail goes only to voters of upgrades done and shown; the public page says "coming
// soon" until the episode is out.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, signInAs as signInFresh, type DemoRole } from '../helpers/api';
import { counts } from '../helpers/db';
import { Activity, Build, Episode, MailOutbox, Upgrade, ViewerRequest, ViewerVote } from '../../server/models';
import { emailHash, newToken } from '../../server/services/viewerPrivacy';

let tern: Build;
const agents = new Map<DemoRole, Awaited<ReturnType<typeof signInFresh>>>();
async function signInAs(role: DemoRole) {
  if (!agents.has(role)) agents.set(role, await signInFresh(role));
  return agents.get(role)!;
}
const epUrl = (e: Episode, s = '') => `/api/builds/${tern.id}/episodes/${e.id}${s}`;
const episode = async (n: number) => (await Episode.findOne({ where: { buildId: tern.id, number: n } }))!;
const upgrade = async (title: string) => (await Upgrade.findOne({ where: { buildId: tern.id, title } }))!;
const done = { installState: 'installed', installSegment: 'shot', demoSegment: 'shot' } as const;
const WRITES = ['mail_outbox', 'activities'] as const;

beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
});

describe('an unfinished episode does not go live', () => {
  it('publishing a Scheduled episode with queued upgrades answers 409 naming each and what it lacks, and writes nothing', async () => {
    const ep7 = await episode(7);
    expect(ep7.state).toBe('scheduled');
    const before = await counts(...WRITES);
    const res = await (
      await signInAs('marketing')
    )
      .post(epUrl(ep7, '/publish'))
      .send({ videoUrl: 'https://video.example/tern-ep7' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('episode_unfinished');
    // The demo: trailer wiring is in the bay, the brake controller and the charging pad are queued.
    expect(res.body.error.unfinished).toEqual([
      {
        id: (await upgrade('Trailer wiring, 7-pin')).id,
        title: 'Trailer wiring, 7-pin',
        lacks: ['not installed (In the bay)', 'install segment not shot', 'demo segment not shot'],
      },
      {
        id: (await upgrade('Trailer brake controller')).id,
        title: 'Trailer brake controller',
        lacks: ['not installed (Queued)', 'install segment not shot', 'demo segment not shot'],
      },
      {
        id: (await upgrade('Wireless charging pad')).id,
        title: 'Wireless charging pad',
        lacks: ['not installed (Queued)', 'install segment not shot', 'demo segment not shot'],
      },
    ]);
    expect(res.body.error.message).toMatch(/Trailer brake controller: not installed \(Queued\)/);
    expect((await ep7.reload()).state).toBe('scheduled');
    expect(await counts(...WRITES)).toEqual(before);
  });

  it('an episode with one demo segment not filmed is refused too, through the PATCH route as well', async () => {
    const ep6 = await episode(6);
    const before = await counts(...WRITES);
    const res = await (
      await signInAs('producer')
    )
      .patch(epUrl(ep6))
      .send({ state: 'live', videoUrl: 'https://video.example/tern-ep6', version: ep6.version });
    expect(res.status).toBe(409);
    expect(res.body.error.unfinished).toEqual([
      { id: (await upgrade('Blind-spot radar')).id, title: 'Blind-spot radar', lacks: ['demo segment not shot'] },
    ]);
    expect((await ep6.reload()).state).toBe('in_edit');
    expect(await counts(...WRITES)).toEqual(before);
  });

  it('the publish screen reads the same list before the button', async () => {
    const ep6 = await episode(6);
    const res = await (await signInAs('marketing')).get(epUrl(ep6, '/readiness'));
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      ready: false,
      unfinished: [
        { id: (await upgrade('Blind-spot radar')).id, title: 'Blind-spot radar', lacks: ['demo segment not shot'] },
      ],
    });
    expect((await (await signInAs('installer')).get(epUrl(ep6, '/readiness'))).status).toBe(403);
  });
});

describe('who may take an episode live', () => {
  it('an installer cannot take a finished episode live through PATCH, and no mail is queued', async () => {
    const ep6 = await episode(6);
    await Upgrade.update(done, { where: { episodeId: ep6.id } });
    const before = await counts(...WRITES);
    const res = await (await signInAs('installer')).patch(epUrl(ep6)).send({ state: 'live', version: ep6.version });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/marketing, a producer or the owner/);
    expect((await ep6.reload()).state).toBe('in_edit');
    expect(await counts(...WRITES)).toEqual(before);
    // The installer still moves states forward short of live.
    const ep7 = await episode(7);
    expect(
      (await (await signInAs('installer')).patch(epUrl(ep7)).send({ state: 'shot', version: ep7.version })).status,
    ).toBe(200);
  });

  it('a producer takes the finished episode live through PATCH; the readiness list is then empty', async () => {
    const ep6 = await episode(6);
    expect((await (await signInAs('marketing')).get(epUrl(ep6, '/readiness'))).body).toEqual({
      ready: true,
      unfinished: [],
    });
    const res = await (
      await signInAs('producer')
    )
      .patch(epUrl(ep6))
      .send({ state: 'live', videoUrl: 'https://video.example/tern-ep6', version: ep6.version });
    expect(res.status).toBe(200);
    expect(res.body.episode.state).toBe('live');
  });
});

describe('publish anyway, and who is told', () => {
  it('needs a reason, records it, and mails only voters whose upgrade is done and shown', async () => {
    const ep8 = await episode(8);
    const wheel = await upgrade('Heated steering wheel'); // in the bay; four confirmed voters in the demo
    const ambient = await upgrade('Ambient lighting');
    expect(wheel.episodeId).toBe(ep8.id);
    await ambient.update(done);
    // One viewer asked for the ambient lighting, which is done.
    const req = await ViewerRequest.create({
      buildId: tern.id,
      title: 'Ambient light colours',
      details: null,
      state: 'accepted',
      upgradeId: ambient.id,
      confirmedAt: new Date(),
    });
    await ViewerVote.create({
      requestId: req.id,
      emailHash: emailHash('lee.a@viewers.test'),
      emailSealed: null,
      email: 'lee.a@viewers.test',
      name: null,
      confirmTokenHash: newToken().hash,
      expiresAt: new Date(Date.now() + 3_600_000),
      confirmedAt: new Date(),
    });

    const m = await signInAs('marketing');
    const empty = await m
      .post(epUrl(ep8, '/publish'))
      .send({ videoUrl: 'https://video.example/tern-ep8', overrideReason: '   ' });
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields.map((f: { path: string }) => f.path)).toContain('overrideReason');

    const res = await m.post(epUrl(ep8, '/publish')).send({
      videoUrl: 'https://video.example/tern-ep8',
      overrideReason: 'Sponsor deadline; the wheel gets its own short next week',
    });
    expect(res.status).toBe(200);
    const anyway = await Activity.findAll({ where: { entity: 'episode', entityId: ep8.id, action: 'publish_anyway' } });
    expect(anyway).toHaveLength(1);
    expect(anyway[0]!.summary).toContain('Heated steering wheel');
    expect(anyway[0]!.summary).toContain('Sponsor deadline; the wheel gets its own short next week');
    const to = (await MailOutbox.findAll({ where: { kind: 'upgrade_live' } }))
      .filter((r) => r.dedupeKey?.startsWith(`live:${ep8.id}:`))
      .map((r) => r.toAddress);
    expect(to).toEqual(['lee.a@viewers.test']);
  });
});

describe('the public page', () => {
  it('shows an installed upgrade as "coming soon", without what it becomes, until an episode showing it is live', async () => {
    const ep9 = await episode(9);
    const u = (await Upgrade.findOne({ where: { buildId: tern.id, episodeId: ep9.id } }))!;
    await u.update({ ...done, becomes: 'Secret new look' });
    await tern.update({ isPublic: true });
    const find = (body: { areas: { upgrades: { id: number; status: string; becomes: string | null }[] }[] }) =>
      body.areas.flatMap((a) => a.upgrades).find((x) => x.id === u.id)!;
    const before = await anonymous().get(`/api/public/builds/${tern.slug}`);
    expect(before.status).toBe(200);
    expect(find(before.body)).toMatchObject({ status: 'coming_soon', becomes: null });
    expect(JSON.stringify(before.body)).not.toContain('Secret new look');

    await Upgrade.update(done, { where: { episodeId: ep9.id } });
    expect(
      (
        await (
          await signInAs('producer')
        )
          .post(epUrl(ep9, '/publish'))
          .send({ videoUrl: 'https://video.example/tern-ep9' })
      ).status,
    ).toBe(200);
    const after = await anonymous().get(`/api/public/builds/${tern.slug}`);
    expect(find(after.body)).toMatchObject({ status: 'done', becomes: 'Secret new look' });
  });
});
