// The episode plan on routes/plan.ts: overview, check, proposal (with cycle), apply with all-or-nothing checks.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, signInAs } from '../helpers/api';
import { counts } from '../helpers/db';
import { sequelize, Build, Upgrade, Episode } from '../../server/models';
import { everyAnswerHasAContract } from '../helpers/contract';

// Every JSON answer these tests read is parsed with its route's contract (shared/contracts).
everyAnswerHasAContract();

let buildId: number;
let base: string;
let otherUpgradeId: number;
let otherEpisodeId: number;

type Ep = {
  id: number | null;
  number: number;
  title: string;
  state: string;
  shootDate: string | null;
  releaseDate: string | null;
  upgradeIds: number[];
  locked?: boolean;
};

beforeAll(async () => {
  buildId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  base = `/api/builds/${buildId}/plan`;
  const other = await Build.create({
    slug: 'plan-other',
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
  otherUpgradeId = (
    await Upgrade.create({
      buildId: other.id,
      title: 'Not yours',
      replaces: null,
      becomes: null,
      area: 'front',
      installedOn: null,
      episodeId: null,
      episodePosition: null,
      notes: null,
      tireFrom: null,
      tireTo: null,
    })
  ).id;
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

const upgradeTitles = async () => new Map((await Upgrade.findAll({ where: { buildId } })).map((u) => [u.id, u]));
/** A plan body made from the plan version `basedOn`, accepting the listed date changes of scheduled episodes. */
const asPlan = (eps: Ep[], basedOn: number, acceptDateChanges?: number[]) => ({
  episodes: eps.map((e) => ({
    ...(e.id ? { id: e.id } : { title: e.title }),
    shootDate: e.shootDate,
    releaseDate: e.releaseDate,
    upgradeIds: [...e.upgradeIds],
  })),
  basedOn,
  ...(acceptDateChanges ? { acceptDateChanges } : {}),
});

describe('the episode plan', () => {
  it('the demo plan has no violations, and the overview gives the planner input and critical path', async () => {
    const producer = await signInAs('producer');
    const res = await producer.get(base);
    expect(res.status).toBe(200);
    expect(res.body.violations).toEqual([]);
    expect(res.body.episodes.length).toBe(13);
    expect(res.body.input.upgrades.length).toBe((await upgradeTitles()).size);
    expect(res.body.criticalPath.days).toBeGreaterThan(0);
    expect(res.body.criticalPath.earliestFinish).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect((await producer.get(`${base}/check`)).body.violations).toEqual([]);
    // Parts still to come: the latest expected arrival, and a count of those with no date yet.
    const byTitle = (t: string) => res.body.upgrades.find((u: { title: string }) => u.title === t);
    expect(byTitle('Surround-view camera')).toMatchObject({ partsDueDate: '2026-12-29', partsUndated: 0 });
    expect(byTitle('LED tail lamps')).toMatchObject({ partsDueDate: null, partsUndated: 2 });
    expect(byTitle('Trailer wiring, 7-pin')).toMatchObject({ partsDueDate: null, partsUndated: 0 });
  });

  it('anonymous 401, installer and marketing 403', async () => {
    expect((await anonymous().get(base)).status).toBe(401);
    expect((await (await signInAs('installer')).post(`${base}/proposal`).send({})).status).toBe(403);
    expect((await (await signInAs('marketing')).put(base).send({ episodes: [] })).status).toBe(403);
  });

  it('a proposal respects every prerequisite and parts date, keeps filmed episodes, and lists differences', async () => {
    const producer = await signInAs('producer');
    const before = await counts('episodes', 'activities');
    const res = await producer.post(`${base}/proposal`).send({});
    expect(res.status).toBe(200);
    const { proposal, current, differences } = res.body;
    expect(proposal.violations).toEqual([]);
    expect(current.episodes.length).toBe(13);
    const ups = await upgradeTitles();
    const where = new Map<number, { n: number; p: number; shoot: string }>();
    for (const e of proposal.episodes as Ep[])
      e.upgradeIds.forEach((id, p) => where.set(id, { n: e.number, p, shoot: e.shootDate! }));
    // Every upgrade not done outside the series is placed, once.
    expect(proposal.unplaced).toEqual([]);
    for (const [id, u] of ups)
      if (u.episodeId || u.installState !== 'installed') expect(where.has(id), u.title).toBe(true);
    // Prerequisites first (earlier episode, or earlier in the same one).
    const edges = await sequelize.query<{ upgrade_id: number; prerequisite_id: number }>(
      'SELECT upgrade_id, prerequisite_id FROM upgrade_prerequisites WHERE build_id = :b',
      { replacements: { b: buildId }, type: 'SELECT' as never },
    );
    for (const e of edges) {
      const a = where.get(e.upgrade_id)!;
      const b = where.get(e.prerequisite_id);
      if (!b) continue;
      expect(
        b.n < a.n || (b.n === a.n && b.p < a.p),
        `${ups.get(e.prerequisite_id)!.title} before ${ups.get(e.upgrade_id)!.title}`,
      ).toBe(true);
    }
    // Filmed episodes are kept as they are.
    const filmed = (current.episodes as Ep[]).filter((e) => ['shot', 'in_edit', 'live'].includes(e.state));
    for (const f of filmed)
      expect((proposal.episodes as Ep[]).find((e) => e.id === f.id)!.upgradeIds).toEqual(f.upgradeIds);
    // The two unplanned demo upgrades are added.
    expect(
      differences
        .filter((d: { kind: string }) => d.kind === 'added')
        .map((d: { title: string }) => d.title)
        .sort(),
    ).toEqual(['Heated front seats', 'Rear parking sensors']);
    // Proposing writes nothing.
    expect(await counts('episodes', 'activities')).toEqual(before);
  });

  it('the proposal takes what-if capacity, and 400 names a negative one', async () => {
    const producer = await signInAs('producer');
    const small = await producer.post(`${base}/proposal`).send({ shootHoursPerEpisode: 3 });
    const normal = await producer.post(`${base}/proposal`).send({});
    expect(small.body.proposal.episodes.length).toBeGreaterThan(normal.body.proposal.episodes.length);
    const bad = await producer.post(`${base}/proposal`).send({ shootHoursPerEpisode: -2 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('shootHoursPerEpisode');
    const cadence = await producer.post(`${base}/proposal`).send({ releaseCadenceDays: 0 });
    expect(cadence.body.error.fields[0].path).toBe('releaseCadenceDays');
  });

  it('accepting a proposal applies it in one go; the result checks clean and is recorded', async () => {
    const producer = await signInAs('producer');
    const { proposal, planVersion, summary } = (await producer.post(`${base}/proposal`).send({})).body;
    const res = await producer.put(base).send(
      asPlan(
        proposal.episodes,
        planVersion,
        summary.dateChanges.map((d: { id: number }) => d.id),
      ),
    );
    expect(res.status).toBe(200);
    expect(res.body.violations).toEqual([]);
    const got = res.body.episodes as Ep[];
    expect(got.map((e) => e.number)).toEqual(got.map((_, i) => i + 1));
    expect(got.filter((e) => e.upgradeIds.length).map((e) => e.upgradeIds)).toEqual(
      (proposal.episodes as Ep[]).filter((e) => e.upgradeIds.length).map((e) => e.upgradeIds),
    );
    expect(
      (
        await sequelize.query(
          `SELECT count(*)::int AS n FROM activities WHERE entity = 'plan' AND build_id = ${buildId}`,
          { type: 'SELECT' as never },
        )
      )[0],
    ).toEqual({ n: 1 });
    // A second proposal on the applied plan changes nothing.
    const again = (await producer.post(`${base}/proposal`).send({})).body;
    expect(again.differences).toEqual([]);
  });

  it('a hand-made order with a prerequisite after its dependant is saved and its violation named', async () => {
    const producer = await signInAs('producer');
    const overview = (await producer.get(base)).body;
    const eps = overview.episodes as Ep[];
    const ups = await upgradeTitles();
    const id = (title: string) => [...ups.values()].find((u) => u.title === title)!.id;
    const wiring = id('Trailer wiring, 7-pin');
    const brake = id('Trailer brake controller');
    const plan = asPlan(eps, overview.planVersion);
    for (const e of plan.episodes) e.upgradeIds = e.upgradeIds.filter((u) => u !== wiring && u !== brake);
    const target = plan.episodes.find((_, i) => eps[i].state === 'draft' || eps[i].state === 'scheduled')!;
    target.upgradeIds.unshift(brake, wiring);
    const res = await producer.put(base).send(plan);
    expect(res.status).toBe(200);
    const v = res.body.violations.find((x: { kind: string }) => x.kind === 'prerequisite_order');
    expect(v.message).toContain('Trailer brake controller');
    expect(v.message).toContain('Trailer wiring, 7-pin');
    expect(v.upgradeIds).toEqual([brake, wiring]);
    expect((await producer.get(`${base}/check`)).body.violations.length).toBeGreaterThan(0);
  });

  it("400 names the field for another build's upgrade, unknown ids, duplicates and dates out of order; nothing is written", async () => {
    const producer = await signInAs('producer');
    const overview = (await producer.get(base)).body;
    const eps = overview.episodes as Ep[];
    const before = await counts('episodes', 'activities');
    const assignment = JSON.stringify(
      await sequelize.query(
        `SELECT id, episode_id, episode_position FROM upgrades WHERE build_id = ${buildId} ORDER BY id`,
        { type: 'SELECT' as never },
      ),
    );
    const draftIdx = eps.findIndex((e) => e.state === 'draft');
    const mk = (mutate: (p: ReturnType<typeof asPlan>) => void) => {
      const p = asPlan(eps, overview.planVersion);
      mutate(p);
      return p;
    };
    const cases: [ReturnType<typeof asPlan>, string][] = [
      [
        mk((p) => p.episodes[draftIdx].upgradeIds.push(otherUpgradeId)),
        `episodes.${draftIdx}.upgradeIds.${eps[draftIdx].upgradeIds.length}`,
      ],
      [
        mk((p) => p.episodes[draftIdx].upgradeIds.push(99_999_999)),
        `episodes.${draftIdx}.upgradeIds.${eps[draftIdx].upgradeIds.length}`,
      ],
      [
        mk((p) => (p.episodes[draftIdx] = { ...p.episodes[draftIdx], id: otherEpisodeId } as never)),
        `episodes.${draftIdx}.id`,
      ],
      [
        mk((p) => p.episodes[draftIdx].upgradeIds.push(eps[0].upgradeIds[0])),
        `episodes.${draftIdx}.upgradeIds.${eps[draftIdx].upgradeIds.length}`,
      ],
      [
        mk((p) => Object.assign(p.episodes[draftIdx], { shootDate: '2027-03-10', releaseDate: '2027-03-01' })),
        `episodes.${draftIdx}.releaseDate`,
      ],
      [mk((p) => p.episodes.push({ upgradeIds: [] } as never)), `episodes.${eps.length}.title`],
      [mk((p) => ((p.episodes[0] as Record<string, unknown>).colour = 'red')), `episodes.0`],
    ];
    for (const [body, field] of cases) {
      const res = await producer.put(base).send(body);
      expect(res.status, field).toBe(400);
      expect(
        res.body.error.fields.map((f: { path: string }) => f.path),
        JSON.stringify(res.body),
      ).toContain(field);
    }
    // Moving an upgrade out of a live episode is refused.
    const locked = await producer.put(base).send(mk((p) => (p.episodes[0].upgradeIds = [])));
    expect(locked.status).toBe(409);
    expect(locked.body.error.code).toBe('episode_locked');
    expect(await counts('episodes', 'activities')).toEqual(before);
    expect(
      JSON.stringify(
        await sequelize.query(
          `SELECT id, episode_id, episode_position FROM upgrades WHERE build_id = ${buildId} ORDER BY id`,
          { type: 'SELECT' as never },
        ),
      ),
    ).toBe(assignment);
  });

  it('a prerequisite cycle answers 422 naming it in order, for a proposal and for a plan, and writes nothing', async () => {
    const producer = await signInAs('producer');
    const ups = await upgradeTitles();
    const id = (title: string) => [...ups.values()].find((u) => u.title === title)!.id;
    // The database allows it (the backlog API refuses it); the planner must still answer sensibly.
    const link = (u: string, p: string) =>
      sequelize.query('INSERT INTO upgrade_prerequisites (build_id, upgrade_id, prerequisite_id) VALUES (:b, :u, :p)', {
        replacements: { b: buildId, u: id(u), p: id(p) },
      });
    await link('Remote start', '400 W cargo power outlet');
    await link('400 W cargo power outlet', 'Front skid plate');
    await link('Front skid plate', 'Remote start');
    const before = await counts('episodes', 'activities');
    const res = await producer.post(`${base}/proposal`).send({});
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('cycle');
    const cycle: string[] = res.body.error.cycle;
    expect([...cycle].sort()).toEqual(['400 W cargo power outlet', 'Front skid plate', 'Remote start']);
    // In cycle order: each is a prerequisite of the next.
    const i = cycle.indexOf('Front skid plate');
    expect(cycle[(i + 1) % 3]).toBe('400 W cargo power outlet');
    expect(res.body.error.message).toContain('→');
    const overview = (await producer.get(base)).body;
    const put = await producer.put(base).send(asPlan(overview.episodes as Ep[], overview.planVersion));
    expect(put.status).toBe(422);
    expect(put.body.error.cycle.length).toBe(3);
    expect(await counts('episodes', 'activities')).toEqual(before);
    await sequelize.query('DELETE FROM upgrade_prerequisites WHERE build_id = :b AND upgrade_id = :u', {
      replacements: { b: buildId, u: id('Front skid plate') },
    });
  });

  it("another build's plan routes answer 404 for an unknown build", async () => {
    const producer = await signInAs('producer');
    expect((await producer.get('/api/builds/999999/plan')).status).toBe(404);
    expect((await producer.put('/api/builds/999999/plan').send({ episodes: [], basedOn: 0 })).status).toBe(404);
  });
});
