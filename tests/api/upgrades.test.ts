// Upgrades API (routes/upgrades.ts): backlog list with filters, detail, create, update by role,
// optimistic locking, prerequisites without cycles, delete with dependants, history.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, agentsByRole, type DemoRole } from '../helpers/api';
import { counts } from '../helpers/db';
import { Build, Upgrade } from '../../server/models';
import { everyAnswerHasAContract } from '../helpers/contract';

everyAnswerHasAContract();

let tern: number;
let other: number;
let as: Awaited<ReturnType<typeof agentsByRole>>;
const url = (suffix = '') => `/api/builds/${tern}/upgrades${suffix}`;
const TABLES = ['upgrades', 'upgrade_prerequisites', 'activities'];

async function byTitle(title: string) {
  return (await Upgrade.findOne({ where: { buildId: tern, title } }))!;
}
async function create(agent: DemoRole, body: Record<string, unknown>) {
  const res = await as[agent].post(url()).send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.upgrade;
}

beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  other = (
    await Build.create({
      slug: 'upgrades-other',
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
    })
  ).id;
  as = await agentsByRole();
});

describe('GET /upgrades', () => {
  it('anonymous gets 401', async () => {
    expect((await anonymous().get(url())).status).toBe(401);
  });
  it('lists the backlog with total and paging', async () => {
    const res = await as.producer.get(url('?pageSize=10&page=2&sort=title'));
    expect(res.status).toBe(200);
    expect(res.body.total).toBeGreaterThanOrEqual(24);
    expect(res.body.upgrades).toHaveLength(10);
    expect(res.body).toMatchObject({ page: 2, pageSize: 10 });
    const all = await as.producer.get(url('?pageSize=500&sort=title'));
    expect(res.body.upgrades.map((u: { id: number }) => u.id)).toEqual(
      all.body.upgrades.slice(10, 20).map((u: { id: number }) => u.id),
    );
    const byPriority = (await as.producer.get(url('?pageSize=500&sort=priority'))).body.upgrades.map(
      (u: { priority: number }) => u.priority,
    );
    expect(byPriority).toEqual([...byPriority].sort((a: number, b: number) => a - b));
    expect(res.body.upgrades[0]).toHaveProperty('valueAddedCents');
    expect(res.body.upgrades[0]).toHaveProperty('prerequisiteIds');
  });
  it('filters by area, install state, safety flag, text and "no episode"', async () => {
    const rear = await as.producer.get(url('?area=rear&pageSize=500'));
    expect(rear.body.upgrades.length).toBeGreaterThan(0);
    expect(rear.body.upgrades.every((u: { area: string }) => u.area === 'rear')).toBe(true);
    const inBay = await as.producer.get(url('?installState=in_bay'));
    expect(inBay.body.upgrades.map((u: { title: string }) => u.title).sort()).toEqual([
      'Heated steering wheel',
      'Trailer wiring, 7-pin',
    ]);
    const srs = await as.producer.get(url('?safetyFlag=srs_airbag'));
    expect(srs.body.upgrades.every((u: { safetyFlags: string[] }) => u.safetyFlags.includes('srs_airbag'))).toBe(true);
    expect(srs.body.total).toBeGreaterThanOrEqual(3);
    const q = await as.producer.get(url('?q=liftgate'));
    expect(q.body.upgrades.map((u: { title: string }) => u.title)).toEqual(['Power liftgate']);
    const none = await as.producer.get(url('?episodeId=none&pageSize=1'));
    expect(none.status).toBe(200);
  });
  it('sorts by episode (number, then position), upgrades in no episode last', async () => {
    const res = await as.producer.get(url('?sort=episode&pageSize=500'));
    expect(res.status).toBe(200);
    const { Episode } = await import('../../server/models');
    const numbers = new Map((await Episode.findAll({ where: { buildId: tern } })).map((e) => [e.id, e.number]));
    const keys = res.body.upgrades.map((u: { episodeId: number | null; episodePosition: number | null }) => [
      u.episodeId === null ? Infinity : numbers.get(u.episodeId)!,
      u.episodePosition ?? Infinity,
    ]);
    const sorted = [...keys].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
    expect(keys).toEqual(sorted);
  });
  it('sorts by estimated hours descending', async () => {
    const res = await as.producer.get(url('?sort=estimatedHours&dir=desc&pageSize=500'));
    const hours = res.body.upgrades.map((u: { estimatedHours: number }) => u.estimatedHours);
    expect(hours).toEqual([...hours].sort((a: number, b: number) => b - a));
  });
  it.each([
    ['area', '?area=roof'],
    ['installState', '?installState=done'],
    ['safetyFlag', '?safetyFlag=fire'],
    ['sort', '?sort=cost'],
    ['dir', '?dir=up'],
    ['page', '?page=0'],
    ['pageSize', '?pageSize=9999'],
    ['episodeId', '?episodeId=abc'],
  ])('unknown %s answers 400 naming it', async (field, qs) => {
    const res = await as.producer.get(url(qs));
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(field);
  });
  it('installer and marketing never receive value added', async () => {
    for (const role of ['installer', 'marketing'] as const) {
      const res = await as[role].get(url('?pageSize=500'));
      expect(res.status).toBe(200);
      expect(res.body.upgrades.some((u: object) => 'valueAddedCents' in u)).toBe(false);
    }
  });
});

describe('GET /upgrades/:upgradeId', () => {
  it('answers the upgrade with parts, removed parts, labour and expenses', async () => {
    const u = await byTitle('Projector LED headlamps');
    const res = await as.owner.get(url(`/${u.id}`));
    expect(res.status).toBe(200);
    expect(res.body.upgrade.title).toBe('Projector LED headlamps');
    expect(res.body.parts.length).toBe(3);
    expect(res.body.parts[0].unitCostCents).toBeGreaterThan(0);
    expect(res.body.removedParts[0]).toMatchObject({ disposition: 'sold', actualSaleCents: 18000 });
    expect(res.body.labour.length).toBeGreaterThan(0);
    expect(res.body.expenses.length).toBeGreaterThan(0);
    expect(res.body.cautions.map((c: { flag: string }) => c.flag)).toEqual(['lighting']);
  });
  it('installer sees parts without cost or retail, and no expenses; marketing sees retail but not cost', async () => {
    const u = await byTitle('Projector LED headlamps');
    const i = await as.installer.get(url(`/${u.id}`));
    expect(i.body.parts[0]).not.toHaveProperty('unitCostCents');
    expect(i.body.parts[0]).not.toHaveProperty('retailPriceCents');
    expect(i.body.removedParts[0]).not.toHaveProperty('actualSaleCents');
    expect(i.body).not.toHaveProperty('expenses');
    const m = await as.marketing.get(url(`/${u.id}`));
    expect(m.body.parts[0]).not.toHaveProperty('unitCostCents');
    expect(m.body.parts[0].retailPriceCents).toBeGreaterThan(0);
    expect(m.body.upgrade).not.toHaveProperty('valueAddedCents');
  });
  it('an unknown id or another build’s upgrade answers 404', async () => {
    const o = await Upgrade.create({
      buildId: other,
      title: 'Elsewhere',
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
    expect((await as.owner.get(url('/99999999'))).status).toBe(404);
    expect((await as.owner.get(url(`/${o.id}`))).status).toBe(404);
    expect((await as.owner.patch(url(`/${o.id}`)).send({ version: 0, title: 'Mine now' })).status).toBe(404);
    expect((await as.owner.delete(url(`/${o.id}`))).status).toBe(404);
    expect((await Upgrade.findByPk(o.id))!.title).toBe('Elsewhere');
  });
});

describe('POST /upgrades', () => {
  it('producer adds an upgrade with prerequisites; an activity row is written in the same change', async () => {
    const before = await counts(...TABLES);
    const head = await byTitle('Larger-screen head unit with phone mirroring');
    const u = await create('producer', {
      title: 'Rear-seat screen',
      area: 'cabin',
      estimatedHours: 3,
      valueAddedCents: 50000,
      priority: 4,
      prerequisiteIds: [head.id],
    });
    expect(u).toMatchObject({
      title: 'Rear-seat screen',
      installState: 'queued',
      version: 0,
      prerequisiteIds: [head.id],
    });
    const after = await counts(...TABLES);
    expect(after).toEqual({
      upgrades: before.upgrades + 1,
      upgrade_prerequisites: before.upgrade_prerequisites + 1,
      activities: before.activities + 1,
    });
  });
  it('installer and marketing get 403', async () => {
    for (const role of ['installer', 'marketing'] as const)
      expect((await as[role].post(url()).send({ title: 'x', area: 'front' })).status).toBe(403);
  });
  it.each([
    ['title', { title: '' }],
    ['title', { title: 'x'.repeat(141) }],
    ['area', { area: 'roof' }],
    ['estimatedHours', { estimatedHours: -1 }],
    ['estimatedHours', { estimatedHours: 'three' }],
    ['valueAddedCents', { valueAddedCents: -100 }],
    ['valueAddedCents', { valueAddedCents: 10.5 }],
    ['priority', { priority: 9 }],
    ['safetyFlags', { safetyFlags: ['fire'] }],
    ['installState', { installState: 'done' }],
    ['installedOn', { installedOn: '01/12/2026' }],
    ['tireTo', { tireTo: '20 inch' }],
    ['notes', { notes: 'x'.repeat(4001) }],
    ['version', { version: 3 }],
  ])('bad %s answers 400 naming it, and nothing is written', async (field, over) => {
    const before = await counts(...TABLES);
    const res = await as.producer.post(url()).send({ title: 'Bad input', area: 'front', ...over });
    expect(res.status).toBe(400);
    expect(
      res.body.error.fields.some((f: { path: string }) => f.path === field || f.path.startsWith(`${field}.`)),
    ).toBe(true);
    expect(await counts(...TABLES)).toEqual(before);
  });
  it('a prerequisite of another build answers 400 naming prerequisiteIds', async () => {
    const o = await Upgrade.create({
      buildId: other,
      title: 'Elsewhere 2',
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
    const res = await as.producer.post(url()).send({ title: 'Cross', area: 'front', prerequisiteIds: [o.id] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('prerequisiteIds');
    expect(await counts(...TABLES)).toEqual(before);
  });
  it('a wheel upgrade keeps sizes that parse', async () => {
    const u = await create('producer', {
      title: 'Winter wheels',
      area: 'wheels_chassis',
      safetyFlags: ['wheels_tires', 'wheels_tires'],
      tireFrom: '235/65R18',
      tireTo: 'LT245/75R17',
    });
    expect(u.safetyFlags).toEqual(['wheels_tires']);
    expect(u.tireTo).toBe('LT245/75R17');
  });
});

describe('PATCH /upgrades/:upgradeId', () => {
  it('producer edits any field; the change is in the history with before and after', async () => {
    const u = await create('producer', { title: 'Edit me', area: 'front', priority: 3 });
    const res = await as.producer.patch(url(`/${u.id}`)).send({ version: u.version, priority: 1, notes: 'Moved up' });
    expect(res.status).toBe(200);
    expect(res.body.upgrade).toMatchObject({ priority: 1, notes: 'Moved up', version: u.version + 1 });
    const hist = await as.producer.get(url(`/${u.id}/activity`));
    expect(hist.status).toBe(200);
    expect(hist.body.activity[0]).toMatchObject({ action: 'update', userName: 'Theo Okafor' });
    expect(hist.body.activity[0].changes.priority).toEqual([3, 1]);
  });
  it('the install date follows the install state unless given', async () => {
    const u = await create('producer', { title: 'Dated', area: 'front' });
    const inst = await as.producer.patch(url(`/${u.id}`)).send({ version: 0, installState: 'installed' });
    expect(inst.body.upgrade.installedOn).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    const given = await as.producer.patch(url(`/${u.id}`)).send({ version: 1, installedOn: '2026-11-02' });
    expect(given.body.upgrade.installedOn).toBe('2026-11-02');
    const back = await as.producer.patch(url(`/${u.id}`)).send({ version: 2, installState: 'queued' });
    expect(back.body.upgrade.installedOn).toBeNull();
  });
  it('a stale version answers 409 stale with the current record', async () => {
    const u = await create('producer', { title: 'Contended', area: 'front' });
    await as.producer.patch(url(`/${u.id}`)).send({ version: 0, title: 'First writer' });
    const before = await counts(...TABLES);
    const res = await as.owner.patch(url(`/${u.id}`)).send({ version: 0, title: 'Second writer' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('stale');
    expect(res.body.error.current).toMatchObject({ id: u.id, title: 'First writer', version: 1 });
    expect(await counts(...TABLES)).toEqual(before);
  });
  it('installer may change install and filming state only', async () => {
    const u = await create('producer', { title: 'Installer work', area: 'cabin' });
    const ok = await as.installer
      .patch(url(`/${u.id}`))
      .send({ version: 0, installState: 'in_bay', installSegment: 'shot' });
    expect(ok.status).toBe(200);
    expect(ok.body.upgrade).toMatchObject({ installState: 'in_bay', installSegment: 'shot' });
    expect(ok.body.upgrade).not.toHaveProperty('valueAddedCents');
    for (const body of [{ title: 'Renamed' }, { valueAddedCents: 1 }, { priority: 1 }, { episodeId: null }]) {
      const res = await as.installer.patch(url(`/${u.id}`)).send({ version: 1, ...body });
      expect(res.status).toBe(403);
    }
    expect((await Upgrade.findByPk(u.id))!.title).toBe('Installer work');
  });
  it('installer cannot move an upgrade into the bay while a prerequisite is not installed (409 naming it)', async () => {
    const wiring = await byTitle('Trailer wiring, 7-pin');
    const brake = await byTitle('Trailer brake controller');
    const res = await as.installer.patch(url(`/${brake.id}`)).send({ version: brake.version, installState: 'in_bay' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('prerequisites_not_installed');
    expect(res.body.error.message).toContain(wiring.title);
    // Installing the prerequisite first opens the way.
    expect(
      (await as.installer.patch(url(`/${wiring.id}`)).send({ version: wiring.version, installState: 'installed' }))
        .status,
    ).toBe(200);
    const again = await as.installer
      .patch(url(`/${brake.id}`))
      .send({ version: brake.version, installState: 'in_bay' });
    expect(again.status).toBe(200);
    expect((await Upgrade.findByPk(wiring.id))!.installedOn).toMatch(/^\d{4}-\d{2}-\d{2}$/);
  });
  it.each([
    ['version', {}],
    ['version', { version: 'one' }],
    ['area', { version: 0, area: 'roof' }],
    ['demoSegment', { version: 0, demoSegment: 'filmed' }],
    ['tireFrom', { version: 0, tireFrom: '18 inch' }],
    ['installedOn', { version: 0, installedOn: '2026-12-32' }],
    ['buildId', { version: 0, buildId: 1 }],
  ])('PATCH with bad %s answers 400 naming it, nothing written', async (field, body) => {
    const u = await byTitle('Power liftgate');
    const before = await counts(...TABLES);
    const res = await as.producer.patch(url(`/${u.id}`)).send(body);
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(field);
    expect(await counts(...TABLES)).toEqual(before);
  });
  it('marketing gets 403', async () => {
    const u = await byTitle('Power liftgate');
    expect(
      (await as.marketing.patch(url(`/${u.id}`)).send({ version: u.version, installSegment: 'shot' })).status,
    ).toBe(403);
  });
  it('an episode of another build answers 400 naming episodeId', async () => {
    const u = await create('producer', { title: 'Episode check', area: 'front' });
    const res = await as.producer.patch(url(`/${u.id}`)).send({ version: 0, episodeId: 99999999 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('episodeId');
  });
});

describe('PUT /upgrades/:upgradeId/prerequisites', () => {
  it('sets the prerequisites and refuses a cycle naming its members in order (422)', async () => {
    const a = await create('producer', { title: 'Loop A', area: 'rear' });
    const b = await create('producer', { title: 'Loop B', area: 'rear', prerequisiteIds: [a.id] });
    const c = await create('producer', { title: 'Loop C', area: 'rear', prerequisiteIds: [b.id] });
    const before = await counts(...TABLES);
    const res = await as.producer.put(url(`/${a.id}/prerequisites`)).send({ prerequisiteIds: [c.id] });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('cycle');
    // Each must come before the next: A before B before C (then C before A closes the loop).
    const cyc: string[] = res.body.error.cycle;
    expect(cyc).toHaveLength(3);
    const start = cyc.indexOf('Loop A');
    expect([...cyc.slice(start), ...cyc.slice(0, start)]).toEqual(['Loop A', 'Loop B', 'Loop C']);
    expect(await counts(...TABLES)).toEqual(before);
    const ok = await as.producer.put(url(`/${c.id}/prerequisites`)).send({ prerequisiteIds: [a.id, b.id] });
    expect(ok.status).toBe(200);
    expect(ok.body.upgrade.prerequisiteIds).toEqual([a.id, b.id].sort((x, y) => x - y));
  });
  it('refuses itself and ids of another build with 400', async () => {
    const a = await create('producer', { title: 'Self', area: 'rear' });
    expect((await as.producer.put(url(`/${a.id}/prerequisites`)).send({ prerequisiteIds: [a.id] })).status).toBe(400);
    const o = await Upgrade.create({
      buildId: other,
      title: 'Elsewhere 3',
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
    const res = await as.producer.put(url(`/${a.id}/prerequisites`)).send({ prerequisiteIds: [o.id] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('prerequisiteIds');
    expect((await as.producer.put(url(`/${a.id}/prerequisites`)).send({ prerequisiteIds: ['x'] })).status).toBe(400);
  });
  it('installer gets 403', async () => {
    const u = await byTitle('Power liftgate');
    expect((await as.installer.put(url(`/${u.id}/prerequisites`)).send({ prerequisiteIds: [] })).status).toBe(403);
  });
});

describe('DELETE /upgrades/:upgradeId', () => {
  it('refuses an upgrade others depend on, naming them (409)', async () => {
    const hitch = await byTitle('Class III hitch receiver');
    const before = await counts(...TABLES, 'parts');
    const res = await as.producer.delete(url(`/${hitch.id}`));
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('has_dependants');
    expect(res.body.error.dependants).toEqual(['Trailer wiring, 7-pin']);
    expect(res.body.error.message).toContain('Trailer wiring, 7-pin');
    expect(await counts(...TABLES, 'parts')).toEqual(before);
  });
  it('deletes an upgrade with no dependants, recorded in the activity', async () => {
    const u = await create('producer', { title: 'Delete me', area: 'sides' });
    const before = await counts(...TABLES);
    expect((await as.installer.delete(url(`/${u.id}`))).status).toBe(403);
    expect((await as.producer.delete(url(`/${u.id}`))).status).toBe(204);
    const after = await counts(...TABLES);
    expect(after.upgrades).toBe(before.upgrades - 1);
    expect(after.activities).toBe(before.activities + 1);
  });
});

describe('GET /upgrades/:upgradeId/activity', () => {
  it('removes money from before → after for the installer', async () => {
    const u = await create('producer', { title: 'Money history', area: 'front', valueAddedCents: 100 });
    await as.producer.patch(url(`/${u.id}`)).send({ version: 0, valueAddedCents: 200, notes: 'n' });
    const own = await as.producer.get(url(`/${u.id}/activity`));
    expect(own.body.activity[0].changes.valueAddedCents).toEqual([100, 200]);
    const inst = await as.installer.get(url(`/${u.id}/activity`));
    expect(inst.status).toBe(200);
    expect(inst.body.activity[0].changes).not.toHaveProperty('valueAddedCents');
    expect(inst.body.activity[0].changes.notes).toEqual([null, 'n']);
  });
});
