// Labour API (routes/labour.ts): installers log, change and delete their own hours only.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, agentsByRole } from '../helpers/api';
import { counts } from '../helpers/db';
import { Build, LabourEntry, Upgrade, User } from '../../server/models';
import { everyAnswerHasAContract } from '../helpers/contract';

everyAnswerHasAContract();

let tern: number;
let upgradeId: number;
let installerId: number;
let producerId: number;
let as: Awaited<ReturnType<typeof agentsByRole>>;
const url = (s = '') => `/api/builds/${tern}/labour${s}`;

beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  upgradeId = (await Upgrade.findOne({ where: { buildId: tern, title: 'Heated steering wheel' } }))!.id;
  installerId = (await User.findOne({ where: { email: 'installer@cedar-ridge.test' } }))!.id;
  producerId = (await User.findOne({ where: { email: 'producer@cedar-ridge.test' } }))!.id;
  as = await agentsByRole();
});

describe('labour', () => {
  it('anonymous gets 401; every role reads the hours', async () => {
    expect((await anonymous().get(url())).status).toBe(401);
    for (const r of ['owner', 'producer', 'installer', 'marketing'] as const) {
      const res = await as[r].get(url(`?upgradeId=${upgradeId}`));
      expect(res.status).toBe(200);
      expect(res.body.labour.length).toBeGreaterThan(0);
      expect(res.body.labour.every((l: { upgradeId: number }) => l.upgradeId === upgradeId)).toBe(true);
    }
  });
  it('installer logs own hours: the entry is theirs whatever they do not say', async () => {
    const before = await counts('labour_entries', 'activities');
    const res = await as.installer
      .post(url())
      .send({ upgradeId, workedOn: '2026-12-01', hours: 1.5, kind: 'install', note: 'Wheel swap' });
    expect(res.status).toBe(201);
    expect(res.body.labourEntry).toMatchObject({ userId: installerId, personName: 'Ruben Castell', hours: 1.5 });
    expect(await counts('labour_entries', 'activities')).toEqual({
      labour_entries: before.labour_entries + 1,
      activities: before.activities + 1,
    });
  });
  it('installer may not log hours for someone else', async () => {
    const before = await counts('labour_entries');
    expect(
      (await as.installer.post(url()).send({ upgradeId, workedOn: '2026-12-01', hours: 1, userId: producerId })).status,
    ).toBe(403);
    expect(
      (await as.installer.post(url()).send({ upgradeId, workedOn: '2026-12-01', hours: 1, personName: 'Someone' }))
        .status,
    ).toBe(403);
    expect(await counts('labour_entries')).toEqual(before);
  });
  it('producer logs hours for another person', async () => {
    const res = await as.producer
      .post(url())
      .send({ upgradeId, workedOn: '2026-11-30', hours: 2, kind: 'filming', userId: installerId });
    expect(res.status).toBe(201);
    expect(res.body.labourEntry).toMatchObject({ userId: installerId, personName: 'Ruben Castell', kind: 'filming' });
  });
  it('marketing may not log hours', async () => {
    expect((await as.marketing.post(url()).send({ upgradeId, workedOn: '2026-12-01', hours: 1 })).status).toBe(403);
  });
  it('installer changes and deletes own entries only', async () => {
    const mine = (await as.installer.post(url()).send({ upgradeId, workedOn: '2026-12-01', hours: 1 })).body
      .labourEntry;
    const theirs = (await as.producer.post(url()).send({ upgradeId, workedOn: '2026-12-01', hours: 1 })).body
      .labourEntry;
    expect(theirs.userId).toBe(producerId);
    const ok = await as.installer.patch(url(`/${mine.id}`)).send({ hours: 2.25 });
    expect(ok.status).toBe(200);
    expect(ok.body.labourEntry.hours).toBe(2.25);
    expect((await as.installer.patch(url(`/${theirs.id}`)).send({ hours: 3 })).status).toBe(403);
    expect((await as.installer.delete(url(`/${theirs.id}`))).status).toBe(403);
    expect((await as.installer.delete(url(`/${mine.id}`))).status).toBe(204);
    expect(await LabourEntry.findByPk(theirs.id)).not.toBeNull();
    expect((await as.producer.delete(url(`/${theirs.id}`))).status).toBe(204);
  });
  it.each([
    ['hours', { hours: 0 }],
    ['hours', { hours: -2 }],
    ['hours', { hours: 25 }],
    ['hours', { hours: 'two' }],
    ['workedOn', { workedOn: '2026-02-29' }],
    ['kind', { kind: 'lunch' }],
    ['note', { note: 'x'.repeat(501) }],
    ['upgradeId', { upgradeId: -1 }],
  ])('bad %s answers 400 naming it, nothing written', async (field, over) => {
    const before = await counts('labour_entries', 'activities');
    const res = await as.installer.post(url()).send({ upgradeId, workedOn: '2026-12-01', hours: 1, ...over });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(field);
    expect(await counts('labour_entries', 'activities')).toEqual(before);
  });
  it('another build’s entry answers 404; an unknown upgrade answers 400', async () => {
    const other = await Build.create({
      slug: 'labour-other',
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
    const ou = await Upgrade.create({
      buildId: other.id,
      title: 'Other',
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
    const l = await LabourEntry.create({
      buildId: other.id,
      upgradeId: ou.id,
      userId: installerId,
      personName: 'Ruben Castell',
      workedOn: '2026-11-30',
      hours: 1,
      note: null,
    });
    expect((await as.installer.patch(url(`/${l.id}`)).send({ hours: 2 })).status).toBe(404);
    expect((await as.owner.delete(url(`/${l.id}`))).status).toBe(404);
    const res = await as.installer.post(url()).send({ upgradeId: ou.id, workedOn: '2026-12-01', hours: 1 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('upgradeId');
  });
});
