// Marketing's triage of viewer requests (routes/viewerRequests.ts): list, accept (link or create
// an upgrade), merge (votes move, no double counting), decline with a reason; votes feed the planner.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, signInAs as signInFresh, type DemoRole } from '../helpers/api';
import { counts } from '../helpers/db';
import { Build, Upgrade, ViewerRequest, ViewerVote, Activity } from '../../server/models';
import { votesByUpgrade } from '../../server/services/votes';
import { emailHash, newToken } from '../../server/services/viewerPrivacy';
import { everyAnswerHasAContract } from '../helpers/contract';

everyAnswerHasAContract();

const agents = new Map<DemoRole, Awaited<ReturnType<typeof signInFresh>>>();
async function signInAs(role: DemoRole) {
  if (!agents.has(role)) agents.set(role, await signInFresh(role));
  return agents.get(role)!;
}

let tern: Build;
let other: Build;
const url = (id?: number) => `/api/builds/${tern.id}/viewer-requests${id ? `/${id}` : ''}`;
const TABLES = ['viewer_requests', 'viewer_votes', 'upgrades', 'activities'];

async function requestWithVoters(buildId: number, title: string, emails: string[]) {
  const r = await ViewerRequest.create({ buildId, title, details: null, confirmedAt: new Date() });
  for (const e of emails) {
    await ViewerVote.create({
      requestId: r.id,
      emailHash: emailHash(e),
      emailSealed: null,
      email: e,
      name: null,
      confirmTokenHash: newToken().hash,
      expiresAt: new Date(),
      confirmedAt: new Date(),
    });
  }
  return r;
}
const votesOf = async (id: number) =>
  (await (await signInAs('marketing')).get(url())).body.requests.find((r: { id: number }) => r.id === id)?.votes;

beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
  other = await Build.create({
    slug: 'requests-other',
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
    isPublic: true,
  });
});

describe('GET /viewer-requests', () => {
  it('lists confirmed requests with vote counts, new ones first, and the votes per upgrade', async () => {
    const hidden = await ViewerRequest.create({ buildId: tern.id, title: 'Nobody confirmed this', details: null });
    const res = await (await signInAs('marketing')).get(url());
    expect(res.status).toBe(200);
    const titles = res.body.requests.map((r: { title: string }) => r.title);
    expect(titles).toContain('Puddle lamps in the side mirrors');
    expect(titles).not.toContain(hidden.title);
    const wheel = res.body.requests.find((r: { title: string }) => r.title === 'Heated steering wheel before winter');
    expect(wheel).toMatchObject({ state: 'accepted', votes: 4, upgradeTitle: 'Heated steering wheel' });
    expect(res.body.votesByUpgrade[wheel.upgradeId]).toBe(4);
    expect(res.body.requests[0].state).toBe('new');
    expect(JSON.stringify(res.body)).not.toContain('@viewers.test');
    const onlyNew = await (await signInAs('producer')).get(`${url()}?state=accepted`);
    expect(onlyNew.body.requests.every((r: { state: string }) => r.state === 'accepted')).toBe(true);
  });

  it('answers 401 signed out, 403 for the installer, 400 for an unknown state', async () => {
    expect((await anonymous().get(url())).status).toBe(401);
    expect((await (await signInAs('installer')).get(url())).status).toBe(403);
    expect((await (await signInAs('marketing')).get(`${url()}?state=maybe`)).status).toBe(400);
  });

  it("shows another build's requests only under that build", async () => {
    const r = await requestWithVoters(other.id, 'Only elsewhere', []);
    const res = await (await signInAs('marketing')).get(url());
    expect(res.body.requests.map((x: { id: number }) => x.id)).not.toContain(r.id);
  });
});

describe('PATCH /viewer-requests/:id', () => {
  it('accepts by linking an existing upgrade; its votes then feed the planner', async () => {
    const r = await requestWithVoters(tern.id, 'Parking sensors please', ['a1@viewers.test', 'a2@viewers.test']);
    const sensors = (await Upgrade.findOne({ where: { buildId: tern.id, title: 'Rear parking sensors' } }))!;
    const res = await (
      await signInAs('marketing')
    )
      .patch(url(r.id))
      .send({ action: 'accept', upgradeId: sensors.id, version: r.version });
    expect(res.status).toBe(200);
    expect(res.body.request).toMatchObject({
      state: 'accepted',
      upgradeId: sensors.id,
      upgradeTitle: 'Rear parking sensors',
      votes: 2,
    });
    expect((await votesByUpgrade(tern.id))[sensors.id]).toBe(2);
    expect(await Activity.count({ where: { entity: 'viewer_request', entityId: r.id, action: 'accept' } })).toBe(1);
  });

  it('accepts by creating a new upgrade in the backlog', async () => {
    const r = await requestWithVoters(tern.id, 'Puddle lamps, again', ['b1@viewers.test']);
    const before = await Upgrade.count({ where: { buildId: tern.id } });
    const res = await (await signInAs('marketing')).patch(url(r.id)).send({
      action: 'accept',
      newUpgrade: { title: 'Mirror puddle lamps', area: 'sides', estimatedHours: 2 },
      version: r.version,
    });
    expect(res.status).toBe(200);
    expect(await Upgrade.count({ where: { buildId: tern.id } })).toBe(before + 1);
    const created = (await Upgrade.findByPk(res.body.request.upgradeId))!;
    expect(created).toMatchObject({
      buildId: tern.id,
      title: 'Mirror puddle lamps',
      area: 'sides',
      estimatedHours: 2,
      installState: 'queued',
    });
    expect((await votesByUpgrade(tern.id))[created.id]).toBe(1);
  });

  it('merges a duplicate: votes move and a person who voted for both counts once', async () => {
    const keep = await requestWithVoters(tern.id, 'Kick-open tailgate', ['m1@viewers.test', 'm2@viewers.test']);
    const dup = await requestWithVoters(tern.id, 'Foot-activated liftgate', ['m2@viewers.test', 'm3@viewers.test']);
    const chained = await ViewerRequest.create({
      buildId: tern.id,
      title: 'Older dup',
      details: null,
      confirmedAt: new Date(),
      state: 'merged',
      mergedIntoId: dup.id,
    });
    const res = await (
      await signInAs('marketing')
    )
      .patch(url(dup.id))
      .send({ action: 'merge', intoId: keep.id, version: dup.version });
    expect(res.status).toBe(200);
    expect(res.body.request).toMatchObject({
      state: 'merged',
      mergedIntoId: keep.id,
      mergedIntoTitle: 'Kick-open tailgate',
      votes: 0,
    });
    expect(await votesOf(keep.id)).toBe(3);
    expect(await ViewerVote.count({ where: { requestId: dup.id } })).toBe(0);
    expect((await chained.reload()).mergedIntoId).toBe(keep.id);
    // A merged request is not triaged again.
    const again = await (
      await signInAs('marketing')
    )
      .patch(url(dup.id))
      .send({ action: 'decline', reason: 'dup', version: (await dup.reload()).version });
    expect(again.status).toBe(409);
  });

  it('declines with a reason', async () => {
    const r = await requestWithVoters(tern.id, 'Aftermarket light bar', ['d1@viewers.test']);
    const res = await (
      await signInAs('producer')
    )
      .patch(url(r.id))
      .send({ action: 'decline', reason: 'Not a factory-original part.', version: r.version });
    expect(res.status).toBe(200);
    expect(res.body.request).toMatchObject({ state: 'declined', declineReason: 'Not a factory-original part.' });
  });

  const bad: [
    string,
    (ctx: { other: number; self: number; foreignUpgrade: number }) => Record<string, unknown>,
    string,
  ][] = [
    ['decline without a reason', () => ({ action: 'decline' }), 'reason'],
    ['accept with neither upgrade nor new upgrade', () => ({ action: 'accept' }), 'upgradeId'],
    [
      'accept with an upgrade of another build',
      (c) => ({ action: 'accept', upgradeId: c.foreignUpgrade }),
      'upgradeId',
    ],
    [
      'accept creating an upgrade with an unknown area',
      () => ({ action: 'accept', newUpgrade: { title: 'X', area: 'roof' } }),
      'newUpgrade.area',
    ],
    ['merge without a target', () => ({ action: 'merge' }), 'intoId'],
    ['merge into itself', (c) => ({ action: 'merge', intoId: c.self }), 'intoId'],
    ["merge into another build's request", (c) => ({ action: 'merge', intoId: c.other }), 'intoId'],
    ['an unknown action', () => ({ action: 'delete' }), 'action'],
    ['an over-long reason', () => ({ action: 'decline', reason: 'r'.repeat(501) }), 'reason'],
  ];
  for (const [label, body, field] of bad) {
    it(`refuses ${label} (400 naming ${field}) and writes nothing`, async () => {
      const self = await requestWithVoters(tern.id, `Target of ${label}`.slice(0, 140), []);
      const foreignReq = await requestWithVoters(other.id, 'Foreign request', []);
      const foreignUpgrade = await Upgrade.create({
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
      const before = await counts(...TABLES);
      const res = await (await signInAs('marketing')).patch(url(self.id)).send({
        ...body({ other: foreignReq.id, self: self.id, foreignUpgrade: foreignUpgrade.id }),
        version: self.version,
      });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(field);
      expect(await counts(...TABLES)).toEqual(before);
      expect((await self.reload()).state).toBe('new');
    });
  }

  it("answers 404 for another build's request through this build, and 403 for the installer", async () => {
    const foreign = await requestWithVoters(other.id, 'Foreign, again', []);
    const before = await counts(...TABLES);
    expect(
      (
        await (
          await signInAs('marketing')
        )
          .patch(url(foreign.id))
          .send({ action: 'decline', reason: 'no', version: foreign.version })
      ).status,
    ).toBe(404);
    const mine = await requestWithVoters(tern.id, 'Installer tries', []);
    expect(
      (
        await (
          await signInAs('installer')
        )
          .patch(url(mine.id))
          .send({ action: 'decline', reason: 'no', version: mine.version })
      ).status,
    ).toBe(403);
    expect((await foreign.reload()).state).toBe('new');
    expect((await counts(...TABLES)).activities).toBe(before.activities);
  });
});
