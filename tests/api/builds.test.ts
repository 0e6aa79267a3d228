// Builds API (routes/builds.ts) and the Project Tern demo data (seeders/0002-project-tern.ts).
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, agentsByRole, type DemoRole } from '../helpers/api';
import { counts } from '../helpers/db';
import { Build, Upgrade, UpgradePrerequisite, Part, RemovedPart, LabourEntry, Expense } from '../../server/models';
import { checkVin } from '../../shared/vin';
import { AREAS, isUpgradeDone } from '../../shared/domain';
import { everyAnswerHasAContract } from '../helpers/contract';

everyAnswerHasAContract();

let ternId: number;
let as: Record<DemoRole, Awaited<ReturnType<typeof agentsByRole>>[DemoRole]>;
const newBuild = (over: Record<string, unknown> = {}) => ({
  slug: 'skua-build',
  name: 'Skua build',
  year: 2021,
  make: 'Halvorsen',
  model: 'Skua',
  ...over,
});

beforeAll(async () => {
  ternId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  as = await agentsByRole();
});

describe('Project Tern demo data', () => {
  it('is a public 2019 Halvorsen Tern with a VIN that passes its check digit', async () => {
    const b = (await Build.findByPk(ternId))!;
    expect(b).toMatchObject({
      isPublic: true,
      year: 2019,
      make: 'Halvorsen',
      model: 'Tern',
      budgetCents: 3_800_000,
      labourRateCents: 9_500,
      shopHoursPerWeek: 24,
      campaign: 'project-tern',
    });
    const v = checkVin(b.vin!);
    expect(v.valid).toBe(true);
    expect(v.modelYears).toContain(2019);
  });
  it('has at least 24 upgrades across every area, about a third done, prerequisite chains and money records', async () => {
    const ups = await Upgrade.findAll({ where: { buildId: ternId } });
    expect(ups.length).toBeGreaterThanOrEqual(24);
    expect(new Set(ups.map((u) => u.area))).toEqual(new Set(AREAS));
    const done = ups.filter((u) => isUpgradeDone(u)).length;
    expect(done / ups.length).toBeGreaterThan(0.25);
    expect(done / ups.length).toBeLessThan(0.45);
    expect(ups.filter((u) => u.installState === 'in_bay').length).toBeGreaterThanOrEqual(2);
    expect(await UpgradePrerequisite.count({ where: { buildId: ternId } })).toBeGreaterThanOrEqual(8);
    const wheels = ups.find((u) => u.tireTo === '255/50R20')!;
    expect(wheels.safetyFlags).toEqual(expect.arrayContaining(['wheels_tires', 'lifting']));
    const parts = await Part.findAll({ where: { buildId: ternId } });
    expect(parts.some((p) => p.condition === 'take_off')).toBe(true);
    expect(parts.filter((p) => p.state === 'backordered').every((p) => p.expectedArrival! > '2026-12-01')).toBe(true);
    const removed = await RemovedPart.findAll({ where: { buildId: ternId } });
    expect(removed.filter((r) => r.disposition === 'sold').every((r) => r.actualSaleCents! > 0 && r.soldOn)).toBe(true);
    expect(removed.some((r) => r.disposition === 'for_sale' && r.expectedSaleCents)).toBe(true);
    expect(await LabourEntry.count({ where: { buildId: ternId } })).toBeGreaterThan(10);
    expect(await Expense.count({ where: { buildId: ternId } })).toBeGreaterThan(5);
  });
  it('never lets a done upgrade depend on one that is not installed', async () => {
    const ups = new Map((await Upgrade.findAll({ where: { buildId: ternId } })).map((u) => [u.id, u]));
    for (const l of await UpgradePrerequisite.findAll({ where: { buildId: ternId } })) {
      if (ups.get(l.upgradeId)!.installState !== 'queued')
        expect(ups.get(l.prerequisiteId)!.installState).toBe('installed');
    }
  });
});

describe('GET /api/builds', () => {
  it('anonymous gets 401', async () => {
    expect((await anonymous().get('/api/builds')).status).toBe(401);
  });
  it('owner sees progress, budget and spend', async () => {
    const res = await as.owner.get('/api/builds');
    expect(res.status).toBe(200);
    const tern = res.body.builds.find((b: { slug: string }) => b.slug === 'project-tern');
    expect(tern.upgradesTotal).toBeGreaterThanOrEqual(24);
    expect(tern.upgradesDone).toBeGreaterThan(0);
    expect(tern.budgetCents).toBe(3_800_000);
    expect(tern.spentCents).toBeGreaterThan(0);
  });
  it('installer and marketing receive no budget, labour rate or spend (absent, not null)', async () => {
    for (const role of ['installer', 'marketing'] as const) {
      const res = await as[role].get('/api/builds');
      const tern = res.body.builds.find((b: { slug: string }) => b.slug === 'project-tern');
      expect(tern).not.toHaveProperty('budgetCents');
      expect(tern).not.toHaveProperty('labourRateCents');
      expect(tern).not.toHaveProperty('spentCents');
      expect(tern.upgradesTotal).toBeGreaterThan(0);
    }
  });
});

describe('POST /api/builds', () => {
  it('producer creates a build (201) and an activity row is written', async () => {
    const before = await counts('builds', 'activities');
    const res = await as.producer.post('/api/builds').send(newBuild());
    expect(res.status).toBe(201);
    expect(res.body.build).toMatchObject({ slug: 'skua-build', version: 0, isPublic: false });
    expect(res.body.build).not.toHaveProperty('calendarToken');
    const after = await counts('builds', 'activities');
    expect(after.builds).toBe(before.builds + 1);
    expect(after.activities).toBe(before.activities + 1);
  });
  it('producer may not set the budget or labour rate (403), the owner may', async () => {
    const producer = as.producer;
    const res = await producer.post('/api/builds').send(newBuild({ slug: 'p-budget', budgetCents: 100 }));
    expect(res.status).toBe(403);
    const owner = as.owner;
    const ok = await owner
      .post('/api/builds')
      .send(newBuild({ slug: 'o-budget', budgetCents: 100, labourRateCents: 8000 }));
    expect(ok.status).toBe(201);
    expect(ok.body.build.budgetCents).toBe(100);
  });
  it('installer and marketing get 403', async () => {
    for (const role of ['installer', 'marketing'] as const) {
      expect((await as[role].post('/api/builds').send(newBuild({ slug: `x-${role}` }))).status).toBe(403);
    }
  });
  it('a wrong VIN check digit answers 400 naming vin, unless vinCheckOverridden is sent', async () => {
    const producer = as.producer;
    const before = await counts('builds', 'activities');
    // 7HVTN2E55KC418206 passes; changing position 9 to 6 breaks the check digit (49 CFR 565 method).
    const bad = await producer.post('/api/builds').send(newBuild({ slug: 'vin-bad', vin: '7HVTN2E56KC418206' }));
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.map((f: { path: string }) => f.path)).toEqual(['vin']);
    expect(await counts('builds', 'activities')).toEqual(before);
    const over = await producer
      .post('/api/builds')
      .send(newBuild({ slug: 'vin-over', vin: '7HVTN2E56KC418206', vinCheckOverridden: true }));
    expect(over.status).toBe(201);
    expect(over.body.build.vinCheckOverridden).toBe(true);
    // The override covers a check digit only: I/O/Q or a wrong length is always refused.
    const wrongLength = await producer
      .post('/api/builds')
      .send(newBuild({ slug: 'vin-len', vin: '7HVTN2E5KC41820', vinCheckOverridden: true }));
    expect(wrongLength.status).toBe(400);
    const letterO = await producer
      .post('/api/builds')
      .send(newBuild({ slug: 'vin-o', vin: '7HVTN2E55KC4182O6', vinCheckOverridden: true }));
    expect(letterO.status).toBe(400);
  });
  it.each([
    ['year', { year: 'twenty' }],
    ['year', { year: 1800 }],
    ['slug', { slug: 'Not A Slug' }],
    ['name', { name: 'x'.repeat(121) }],
    ['budgetCents', { budgetCents: -1 }],
    ['startDate', { startDate: '2026-02-30' }],
    ['releaseCadenceDays', { releaseCadenceDays: 1.5 }],
    ['shopHoursPerWeek', { shopHoursPerWeek: 200 }],
    ['isPublic', { isPublic: 'yes' }],
    ['calendarToken', { calendarToken: 'x' }],
  ])('bad %s answers 400 naming it and writes nothing', async (field, over) => {
    const owner = as.owner;
    const before = await counts('builds', 'activities');
    const res = await owner.post('/api/builds').send(newBuild({ slug: 'bad-input', ...over }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(field);
    expect(await counts('builds', 'activities')).toEqual(before);
  });
  it('a slug already in use answers 409', async () => {
    const res = await as.owner.post('/api/builds').send(newBuild({ slug: 'project-tern' }));
    expect(res.status).toBe(409);
  });
});

describe('GET/PATCH/DELETE /api/builds/:buildId', () => {
  it('any role reads a build; money removed for installer and marketing', async () => {
    const m = await as.marketing.get(`/api/builds/${ternId}`);
    expect(m.status).toBe(200);
    expect(m.body.build.slug).toBe('project-tern');
    expect(m.body.build).not.toHaveProperty('budgetCents');
    const o = await as.owner.get(`/api/builds/${ternId}`);
    expect(o.body.build.budgetCents).toBe(3_800_000);
  });
  it('unknown build answers 404', async () => {
    expect((await as.owner.get('/api/builds/999999')).status).toBe(404);
    expect((await as.owner.patch('/api/builds/999999').send({ version: 0, name: 'x' })).status).toBe(404);
  });
  it('producer renames a build; a stale version answers 409 with the current record', async () => {
    const producer = as.producer;
    const created = (await producer.post('/api/builds').send(newBuild({ slug: 'patch-me' }))).body.build;
    const ok = await producer.patch(`/api/builds/${created.id}`).send({ version: created.version, name: 'Renamed' });
    expect(ok.status).toBe(200);
    expect(ok.body.build).toMatchObject({ name: 'Renamed', version: created.version + 1 });
    const staleRes = await producer.patch(`/api/builds/${created.id}`).send({ version: created.version, name: 'Lost' });
    expect(staleRes.status).toBe(409);
    expect(staleRes.body.error.code).toBe('stale');
    expect(staleRes.body.error.current).toMatchObject({ name: 'Renamed', version: created.version + 1 });
  });
  it('producer may not change the budget; the owner may', async () => {
    const b = (await Build.findByPk(ternId))!;
    const p = await as.producer.patch(`/api/builds/${ternId}`).send({ version: b.version, budgetCents: 1 });
    expect(p.status).toBe(403);
    const o = await as.owner.patch(`/api/builds/${ternId}`).send({ version: b.version, budgetCents: 3_900_000 });
    expect(o.status).toBe(200);
    expect(o.body.build.budgetCents).toBe(3_900_000);
  });
  it('a changed VIN must pass its check digit again', async () => {
    const owner = as.owner;
    const created = (await owner.post('/api/builds').send(newBuild({ slug: 'vin-change', vin: '7HVTN2E55KC418206' })))
      .body.build;
    const bad = await owner
      .patch(`/api/builds/${created.id}`)
      .send({ version: created.version, vin: '7HVTN2E57KC418206' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('vin');
    const over = await owner
      .patch(`/api/builds/${created.id}`)
      .send({ version: created.version, vin: '7HVTN2E57KC418206', vinCheckOverridden: true });
    expect(over.status).toBe(200);
  });
  it('only the owner deletes a build, with its upgrades and prerequisites', async () => {
    const owner = as.owner;
    const created = (await owner.post('/api/builds').send(newBuild({ slug: 'delete-me' }))).body.build;
    const a = (await owner.post(`/api/builds/${created.id}/upgrades`).send({ title: 'A', area: 'front' })).body.upgrade;
    await owner.post(`/api/builds/${created.id}/upgrades`).send({ title: 'B', area: 'front', prerequisiteIds: [a.id] });
    expect((await as.producer.delete(`/api/builds/${created.id}`)).status).toBe(403);
    const res = await owner.delete(`/api/builds/${created.id}`);
    expect(res.status).toBe(204);
    expect(await Build.findByPk(created.id)).toBeNull();
    expect(await Upgrade.count({ where: { buildId: created.id } })).toBe(0);
  });
});
