// Plan changes the producer can trust (issue 11, "What was seen" 5 and 6): a proposal lists what
// it changes, a scheduled episode's dates change only when listed and accepted, every apply is a
// revision that can be undone unless something was filmed since, and a change made from an older
// version answers 409 and writes nothing, also when four arrive at once. Viewer-request accepts
// carry their version too: five parallel accepts make one upgrade.
import { describe, it, expect, beforeAll } from 'vitest';
import { signInAs as signInFresh, type DemoRole } from '../helpers/api';
import { counts } from '../helpers/db';
import { sequelize, Build, Episode, Upgrade, ViewerRequest } from '../../server/models';

let buildId: number;
let base: string;
const agents = new Map<DemoRole, Awaited<ReturnType<typeof signInFresh>>>();
async function signInAs(role: DemoRole) {
  if (!agents.has(role)) agents.set(role, await signInFresh(role));
  return agents.get(role)!;
}

type Ep = {
  id: number | null;
  number: number;
  title: string;
  state: string;
  shootDate: string | null;
  releaseDate: string | null;
  upgradeIds: number[];
};
const body = (eps: Ep[], basedOn: number, acceptDateChanges?: number[]) => ({
  episodes: eps.map((e) => ({
    ...(e.id ? { id: e.id } : { title: e.title }),
    shootDate: e.shootDate,
    releaseDate: e.releaseDate,
    upgradeIds: [...e.upgradeIds],
  })),
  basedOn,
  ...(acceptDateChanges ? { acceptDateChanges } : {}),
});
const TABLES = ['episodes', 'activities', 'plan_revisions', 'upgrades'];
/** The plan as the database holds it: episodes in order with dates and upgrades. */
async function planNow() {
  const eps = await Episode.findAll({ where: { buildId }, order: [['number', 'ASC']] });
  const ups = await Upgrade.findAll({
    where: { buildId },
    order: [
      ['episodePosition', 'ASC'],
      ['id', 'ASC'],
    ],
  });
  return eps.map((e) => ({
    id: e.id,
    number: e.number,
    title: e.title,
    shootDate: e.shootDate,
    releaseDate: e.releaseDate,
    upgradeIds: ups.filter((u) => u.episodeId === e.id).map((u) => u.id),
  }));
}

beforeAll(async () => {
  buildId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  base = `/api/builds/${buildId}/plan`;
});

describe('a proposal lists what it changes, and dates of a scheduled episode change only when listed', () => {
  it('lists moved upgrades, episodes whose contents change and date changes; an unlisted scheduled date change is refused', async () => {
    const producer = await signInAs('producer');
    // Give the Scheduled episode 7 a shoot date the proposal will move (it plans from today on).
    const ep7 = (await Episode.findOne({ where: { buildId, number: 7 } }))!;
    expect(ep7.state).toBe('scheduled');
    await ep7.update({ shootDate: '2026-11-01', releaseDate: '2026-11-08' });
    const answer = (await producer.post(`${base}/proposal`).send({})).body;
    expect(answer.planVersion).toBe(0);
    const proposed = (answer.proposal.episodes as Ep[]).find((e) => e.id === ep7.id)!;
    expect(proposed.shootDate).not.toBe('2026-11-01');
    const listed = answer.summary.dateChanges.find((d: { id: number }) => d.id === ep7.id);
    expect(listed).toMatchObject({
      number: 7,
      title: 'Ready to tow',
      state: 'scheduled',
      shootDate: ['2026-11-01', proposed.shootDate],
    });
    // Every upgrade the differences call moved is in the summary, and contents changes flag the episode.
    const movedIds = answer.differences
      .filter((d: { kind: string }) => d.kind !== 'reordered')
      .map((d: { upgradeId: number }) => d.upgradeId)
      .sort();
    expect(answer.summary.moved.map((m: { upgradeId: number }) => m.upgradeId).sort()).toEqual(movedIds);
    for (const e of answer.summary.episodesChanged) expect(e.added.length + e.removed.length).toBeGreaterThan(0);

    const before = await counts(...TABLES);
    const refused = await producer.put(base).send(body(answer.proposal.episodes, 0));
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('unlisted_date_change');
    expect(refused.body.error.message).toContain('episode 7 (Ready to tow, Scheduled): shoot 2026-11-01 →');
    expect(await counts(...TABLES)).toEqual(before);
  });
});

describe('concurrent applies', () => {
  it('four parallel PUTs of one proposal: one applies, three answer 409 and write nothing', async () => {
    const producer = await signInAs('producer');
    const answer = (await producer.post(`${base}/proposal`).send({})).body;
    const plan = body(
      answer.proposal.episodes,
      answer.planVersion,
      answer.summary.dateChanges.map((d: { id: number }) => d.id),
    );
    const episodesBefore = await Episode.count({ where: { buildId } });
    const newEpisodes = (answer.proposal.episodes as Ep[]).filter((e) => e.id === null).length;
    const results = await Promise.all([1, 2, 3, 4].map(() => producer.put(base).send(plan)));
    expect(results.map((r) => r.status).sort()).toEqual([200, 409, 409, 409]);
    for (const r of results.filter((x) => x.status === 409)) expect(r.body.error.code).toBe('plan_changed');
    expect(await Episode.count({ where: { buildId } })).toBe(episodesBefore + newEpisodes);
    const [rev] = await sequelize.query<{ n: number }>(
      `SELECT count(*)::int AS n FROM plan_revisions WHERE build_id = ${buildId}`,
      { type: 'SELECT' as never },
    );
    expect(rev!.n).toBe(1);
    const [act] = await sequelize.query<{ n: number }>(
      `SELECT count(*)::int AS n FROM activities WHERE build_id = ${buildId} AND entity = 'plan'`,
      { type: 'SELECT' as never },
    );
    expect(act!.n).toBe(1);
    expect((await producer.get(base)).body.planVersion).toBe(1);
  });

  it('five parallel accepts of one viewer request create one upgrade', async () => {
    const marketing = await signInAs('marketing');
    const req = await ViewerRequest.create({ buildId, title: 'Bed step', details: null, confirmedAt: new Date() });
    const before = await Upgrade.count({ where: { buildId } });
    const accept = { action: 'accept', newUpgrade: { title: 'Bed step', area: 'rear' }, version: req.version };
    const results = await Promise.all(
      [1, 2, 3, 4, 5].map(() => marketing.patch(`/api/builds/${buildId}/viewer-requests/${req.id}`).send(accept)),
    );
    expect(results.map((r) => r.status).sort(), JSON.stringify(results[0]!.body)).toEqual([200, 409, 409, 409, 409]);
    expect(await Upgrade.count({ where: { buildId } })).toBe(before + 1);
    expect(await Upgrade.count({ where: { buildId, title: 'Bed step' } })).toBe(1);
  });
});

describe('undo the last plan change', () => {
  it('restores the plan before the last apply in one call, removes the episodes it added, and is itself a revision', async () => {
    const producer = await signInAs('producer');
    // Undo the apply of the test above, then apply a fresh proposal and undo that.
    let version = (await producer.get(base)).body.planVersion as number;
    const first = await producer.post(`${base}/undo`).send({ basedOn: version });
    expect(first.status).toBe(200);
    version = first.body.planVersion;
    const before = await planNow();
    const answer = (await producer.post(`${base}/proposal`).send({})).body;
    const applied = await producer.put(base).send(
      body(
        answer.proposal.episodes,
        version,
        answer.summary.dateChanges.map((d: { id: number }) => d.id),
      ),
    );
    expect(applied.status).toBe(200);
    expect(await planNow()).not.toEqual(before);
    const overview = (await producer.get(base)).body;
    expect(overview.undo.summary).toMatch(/^Applied a plan: \d+ upgrades? moved/);
    const undone = await producer.post(`${base}/undo`).send({ basedOn: overview.planVersion });
    expect(undone.status).toBe(200);
    expect(await planNow()).toEqual(before);
    const revisions = (await producer.get(`${base}/revisions`)).body.revisions as { kind: string; undone: boolean }[];
    expect(revisions.slice(0, 2).map((r) => r.kind)).toEqual(['undo', 'apply']);
    expect(revisions[1]!.undone).toBe(true);
    // An undo from an older version is refused.
    const stale = await producer.post(`${base}/undo`).send({ basedOn: overview.planVersion });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('plan_changed');
  });

  it('is refused, naming what blocks it, once an upgrade it moved has been filmed; nothing is written', async () => {
    const producer = await signInAs('producer');
    const version = (await producer.get(base)).body.planVersion as number;
    const answer = (await producer.post(`${base}/proposal`).send({})).body;
    expect(answer.summary.moved.length).toBeGreaterThan(0);
    expect(
      (
        await producer.put(base).send(
          body(
            answer.proposal.episodes,
            version,
            answer.summary.dateChanges.map((d: { id: number }) => d.id),
          ),
        )
      ).status,
    ).toBe(200);
    const moved = answer.summary.moved[0] as { upgradeId: number; title: string };
    await Upgrade.update({ installSegment: 'shot' }, { where: { id: moved.upgradeId } });
    const plan = await planNow();
    const before = await counts(...TABLES);
    const res = await producer.post(`${base}/undo`).send({ basedOn: version + 1 });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('undo_blocked');
    expect(res.body.error.message).toContain(`the install segment of ${moved.title} was shot`);
    expect(await counts(...TABLES)).toEqual(before);
    expect(await planNow()).toEqual(plan);
  });
});
