// Episodes on routes/episodes.ts: list, create with renumbering, state moves, 409s, delete, scoping.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, signInAs } from '../helpers/api';
import { count, counts } from '../helpers/db';
import { Build, Episode, Activity, Upgrade } from '../../server/models';
import { everyAnswerHasAContract } from '../helpers/contract';

// Every JSON answer these tests read is parsed with its route's contract (shared/contracts).
everyAnswerHasAContract();

let buildId: number;
let base: string;
let otherBase: string;
let otherEpisodeId: number;

beforeAll(async () => {
  const tern = await Build.findOne({ where: { slug: 'project-tern' } });
  buildId = tern!.id;
  base = `/api/builds/${buildId}/episodes`;
  const other = await Build.create({
    slug: 'episodes-other',
    name: 'Other',
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
  otherBase = `/api/builds/${other.id}/episodes`;
  otherEpisodeId = (
    await Episode.create({
      buildId: other.id,
      number: 1,
      title: 'Elsewhere',
      summary: null,
      shootDate: null,
      releaseDate: null,
      videoUrl: null,
      runtimeSeconds: null,
      publishedAt: null,
    })
  ).id;
});

const numbers = async () =>
  (await Episode.findAll({ where: { buildId }, order: [['number', 'ASC']] })).map((e) => [e.number, e.title]);

describe('episodes', () => {
  it('any role lists the demo series in order with upgrade ids in running order', async () => {
    const installer = await signInAs('installer');
    const res = await installer.get(base);
    expect(res.status).toBe(200);
    const eps = res.body.episodes;
    expect(eps.length).toBe(13);
    expect(eps.map((e: { number: number }) => e.number)).toEqual([...Array(13).keys()].map((i) => i + 1));
    expect(eps.filter((e: { state: string }) => e.state === 'live').length).toBe(5);
    expect(eps[0].videoUrl).toBe('https://video.example/tern-ep1');
    expect(eps[6].state).toBe('scheduled');
    expect(eps[6].upgradeIds.length).toBe(3);
  });

  it('anonymous gets 401; marketing cannot create (403)', async () => {
    expect((await anonymous().get(base)).status).toBe(401);
    const marketing = await signInAs('marketing');
    expect((await marketing.post(base).send({ title: 'Nope' })).status).toBe(403);
  });

  it('the producer adds an episode at a place in the series and the rest renumber', async () => {
    const producer = await signInAs('producer');
    const res = await producer
      .post(base)
      .send({ title: 'Interlude: tools of the bay', number: 8, shootDate: '2027-02-01', releaseDate: '2027-02-08' });
    expect(res.status).toBe(201);
    expect(res.body.episode).toMatchObject({ number: 8, state: 'draft', upgradeIds: [] });
    const list = await numbers();
    expect(list.length).toBe(14);
    expect(list[7]).toEqual([8, 'Interlude: tools of the bay']);
    expect(list[8][1]).toBe('Warm hands, soft light');
    expect(list.map(([n]) => n)).toEqual([...Array(14).keys()].map((i) => i + 1));
    // Moving it to the end renumbers the ones it passes.
    const moved = await producer
      .patch(`${base}/${res.body.episode.id}`)
      .send({ number: 99, version: res.body.episode.version });
    expect(moved.status).toBe(200);
    expect(moved.body.episode.number).toBe(14);
    expect((await numbers())[7][1]).toBe('Warm hands, soft light');
    // Deleting renumbers too.
    expect((await producer.delete(`${base}/${res.body.episode.id}`)).status).toBe(204);
    expect((await numbers()).length).toBe(13);
  });

  it('400 names the field: release before shoot, unknown fields, bad title; nothing written', async () => {
    const producer = await signInAs('producer');
    const before = await counts('episodes', 'activities');
    const r1 = await producer.post(base).send({ title: 'X', shootDate: '2027-02-10', releaseDate: '2027-02-01' });
    expect(r1.status).toBe(400);
    expect(r1.body.error.fields.map((f: { path: string }) => f.path)).toContain('releaseDate');
    const r2 = await producer.post(base).send({ title: 'X', colour: 'red' });
    expect(r2.status).toBe(400);
    expect(r2.body.error.fields[0].message).toContain('colour');
    const r3 = await producer.post(base).send({ title: '' });
    expect(r3.status).toBe(400);
    expect(r3.body.error.fields[0].path).toBe('title');
    const r4 = await producer.post(base).send({ title: 'X', shootDate: '2027-02-30' });
    expect(r4.status).toBe(400);
    expect(await counts('episodes', 'activities')).toEqual(before);
  });

  it('state moves forward with an activity row each; going live needs a video URL and notifies', async () => {
    const producer = await signInAs('producer');
    const eps = (await producer.get(base)).body.episodes;
    const draft = eps.filter((e: { state: string }) => e.state === 'draft').pop();
    const acts = await Activity.count({ where: { entity: 'episode', entityId: draft.id, action: 'state' } });
    const toShot = await producer.patch(`${base}/${draft.id}`).send({ state: 'shot', version: draft.version });
    // Only a finished episode goes live (issue 11).
    await Upgrade.update(
      { installState: 'installed', installSegment: 'shot', demoSegment: 'shot' },
      { where: { episodeId: draft.id } },
    );
    expect(toShot.status).toBe(200);
    expect(toShot.body.episode.state).toBe('shot');
    const noUrl = await producer
      .patch(`${base}/${draft.id}`)
      .send({ state: 'live', version: toShot.body.episode.version });
    expect(noUrl.status).toBe(400);
    expect(noUrl.body.error.fields[0].path).toBe('videoUrl');
    const live = await producer
      .patch(`${base}/${draft.id}`)
      .send({ state: 'live', videoUrl: 'https://video.example/tern-ep8', version: toShot.body.episode.version });
    expect(live.status).toBe(200);
    expect(live.body.episode.publishedAt).toBeTruthy();
    expect(await Activity.count({ where: { entity: 'episode', entityId: draft.id, action: 'state' } })).toBe(acts + 2);
    // The producer may move it back; that is recorded too.
    const back = await producer
      .patch(`${base}/${draft.id}`)
      .send({ state: 'in_edit', version: live.body.episode.version });
    expect(back.status).toBe(200);
    expect(back.body.episode.publishedAt).toBeNull();
    expect(await Activity.count({ where: { entity: 'episode', entityId: draft.id, action: 'state' } })).toBe(acts + 3);
  });

  it("going live tells the viewers who asked for one of the episode's upgrades, once", async () => {
    const producer = await signInAs('producer');
    const eps = (await producer.get(base)).body.episodes;
    // "Warm hands, soft light" holds the heated steering wheel, a viewer request the demo accepted.
    const ep = eps.find((e: { title: string }) => e.title === 'Warm hands, soft light');
    const before = await count('mail_outbox');
    await Upgrade.update(
      { installState: 'installed', installSegment: 'shot', demoSegment: 'shot' },
      { where: { episodeId: ep.id } },
    );
    const live = await producer
      .patch(`${base}/${ep.id}`)
      .send({ state: 'live', videoUrl: 'https://video.example/tern-ep8', version: ep.version });
    expect(live.status).toBe(200);
    const queued = (await count('mail_outbox')) - before;
    expect(queued).toBeGreaterThan(0);
    // Back and live again: the same people are not told twice.
    const back = await producer
      .patch(`${base}/${ep.id}`)
      .send({ state: 'in_edit', version: live.body.episode.version });
    await producer.patch(`${base}/${ep.id}`).send({ state: 'live', version: back.body.episode.version });
    expect((await count('mail_outbox')) - before).toBe(queued);
  });

  it('an installer may only move a state forward, never back, and may not change other fields', async () => {
    const installer = await signInAs('installer');
    const eps = (await installer.get(base)).body.episodes;
    const scheduled = eps.find((e: { state: string }) => e.state === 'scheduled');
    const inEdit = eps.find((e: { state: string }) => e.state === 'in_edit');
    const back = await installer.patch(`${base}/${inEdit.id}`).send({ state: 'scheduled', version: inEdit.version });
    expect(back.status).toBe(409);
    expect(back.body.error.code).toBe('backward_move');
    const title = await installer
      .patch(`${base}/${scheduled.id}`)
      .send({ title: 'Mine now', version: scheduled.version });
    expect(title.status).toBe(403);
    const fwd = await installer.patch(`${base}/${scheduled.id}`).send({ state: 'shot', version: scheduled.version });
    expect(fwd.status).toBe(200);
    expect(fwd.body.episode.state).toBe('shot');
  });

  it('a stale version answers 409 with the current episode; scheduling needs a shoot date', async () => {
    const producer = await signInAs('producer');
    const created = (await producer.post(base).send({ title: 'Undated' })).body.episode;
    const ok = await producer
      .patch(`${base}/${created.id}`)
      .send({ title: 'Undated, renamed', version: created.version });
    expect(ok.status).toBe(200);
    const stale = await producer.patch(`${base}/${created.id}`).send({ title: 'Old form', version: created.version });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale');
    expect(stale.body.error.current.title).toBe('Undated, renamed');
    const sched = await producer
      .patch(`${base}/${created.id}`)
      .send({ state: 'scheduled', version: ok.body.episode.version });
    expect(sched.status).toBe(400);
    expect(sched.body.error.fields[0].path).toBe('shootDate');
    const order = await producer
      .patch(`${base}/${created.id}`)
      .send({ releaseDate: '2020-01-01', shootDate: '2020-02-01', version: ok.body.episode.version });
    expect(order.status).toBe(400);
  });

  it('a filmed episode cannot be deleted; deleting a draft sends its upgrades back to unplanned', async () => {
    const producer = await signInAs('producer');
    const eps = (await producer.get(base)).body.episodes;
    const live = eps.find((e: { state: string }) => e.state === 'live');
    const refused = await producer.delete(`${base}/${live.id}`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('episode_locked');
    const draft = eps
      .filter((e: { state: string; upgradeIds: number[] }) => e.state === 'draft' && e.upgradeIds.length)
      .pop();
    expect((await producer.delete(`${base}/${draft.id}`)).status).toBe(204);
    const after = (await producer.get(base)).body.episodes;
    expect(after.length).toBe(eps.length - 1);
    expect(after.flatMap((e: { upgradeIds: number[] }) => e.upgradeIds)).not.toContain(draft.upgradeIds[0]);
  });

  it("another build's episode answers 404 through this build's path, and nothing changes", async () => {
    const producer = await signInAs('producer');
    expect((await producer.patch(`${base}/${otherEpisodeId}`).send({ title: 'Taken', version: 0 })).status).toBe(404);
    expect((await producer.delete(`${base}/${otherEpisodeId}`)).status).toBe(404);
    expect((await Episode.findByPk(otherEpisodeId))!.title).toBe('Elsewhere');
    expect((await producer.get(`/api/builds/999999/episodes`)).status).toBe(404);
    expect((await producer.get(otherBase)).body.episodes.length).toBe(1);
  });
});
