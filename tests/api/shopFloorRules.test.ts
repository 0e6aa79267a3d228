// The shop floor's rules (issue 11, "Shop-floor rules"), enforced in services/upgrades.ts and
// services/shopFloor.ts so every route obeys them: in-bay upgrades always reachable, installing with
// parts not received asks first, segments only on started work, marks stepped back by their maker,
// a double tap never skips a state, and a read caution recorded.
import { describe, it, expect, beforeAll } from 'vitest';
import { signInAs } from '../helpers/api';
import { Activity, Build, Episode, Upgrade, User } from '../../server/models';
import { sequelize } from '../../server/db/sequelize';
import { everyAnswerHasAContract } from '../helpers/contract';

// Every JSON answer these tests read is parsed with its route's contract (shared/contracts).
everyAnswerHasAContract();

let buildId: number;
let base: string;
const byTitle = async (title: string) => (await Upgrade.findOne({ where: { buildId, title } }))!;
const patch = (agent: Awaited<ReturnType<typeof signInAs>>, u: Upgrade, body: Record<string, unknown>) =>
  agent.patch(`/api/builds/${buildId}/upgrades/${u.id}`).send({ version: u.version, ...body });

beforeAll(async () => {
  buildId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  base = `/api/builds/${buildId}/shop-floor`;
});

describe('in-bay upgrades are always on the shop floor', () => {
  it('the in-bay "Heated steering wheel" of a draft episode shows in the "In the bay now" group first', async () => {
    const wheel = await byTitle('Heated steering wheel');
    const ep = await Episode.findByPk(wheel.episodeId!);
    expect(ep!.state).toBe('draft'); // the demo as observed
    const res = await (await signInAs('installer')).get(base);
    expect(res.status).toBe(200);
    const inBay = res.body.inBay as { upgrade: { title: string }; episode: { state: string } | null }[];
    expect(inBay.map((i) => i.upgrade.title)).toContain('Heated steering wheel');
    expect(inBay.find((i) => i.upgrade.title === 'Heated steering wheel')!.episode).toMatchObject({ state: 'draft' });
    // The working episode's own in-bay upgrade stays in its place in the episode, not twice.
    expect(inBay.map((i) => i.upgrade.title)).not.toContain('Trailer wiring, 7-pin');
    expect(res.body.upgrades.map((i: { upgrade: { title: string } }) => i.upgrade.title)).toContain(
      'Trailer wiring, 7-pin',
    );
  });
});

describe('marking installed with parts not received', () => {
  it('answers 409 naming the parts, writes nothing; with confirmation it goes ahead and the history names them', async () => {
    const installer = await signInAs('installer');
    const pad = await byTitle('Wireless charging pad');
    // Prerequisite (console trim) is installed in the demo; start it first.
    const started = await patch(installer, pad, { installState: 'in_bay' });
    expect(started.status).toBe(200);
    await pad.reload();
    const refused = await patch(installer, pad, { installState: 'installed' });
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('parts_not_received');
    expect(refused.body.error.message).toContain('Wireless charging pad, 15 W');
    expect(refused.body.error.parts).toEqual([
      {
        description: 'Wireless charging pad, 15 W',
        partNumber: 'HT-WCP-9510',
        state: 'ordered',
        expectedArrival: '2026-12-02',
      },
    ]);
    await pad.reload();
    expect(pad.installState).toBe('in_bay');

    const ok = await patch(installer, pad, { installState: 'installed', confirmPartsNotReceived: true });
    expect(ok.status).toBe(200);
    expect(ok.body.upgrade.installState).toBe('installed');
    const act = await Activity.findOne({
      where: { buildId, entity: 'upgrade', entityId: pad.id },
      order: [['id', 'DESC']],
    });
    expect(act!.summary).toContain('parts not received: Wireless charging pad, 15 W (HT-WCP-9510, Ordered)');
  });

  it('a confirmation flag on any other change is refused 400 naming the field', async () => {
    const producer = await signInAs('producer');
    const u = await byTitle('Remote start');
    const res = await patch(producer, u, { priority: 2, confirmPartsNotReceived: true });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain('confirmPartsNotReceived');
    expect(res.body.error.message).toMatch(/Confirm parts not received/);
  });
});

describe('segments are shot only on started work', () => {
  it('"install segment shot" on the blocked, never-started brake controller answers 409; the demo segment too', async () => {
    const producer = await signInAs('producer');
    const brake = await byTitle('Trailer brake controller');
    expect(brake.installState).toBe('queued');
    const res = await patch(producer, brake, { installSegment: 'shot' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('not_started');
    const demo = await patch(await signInAs('installer'), brake, { demoSegment: 'shot' });
    expect(demo.status).toBe(409);
    await brake.reload();
    expect([brake.installSegment, brake.demoSegment]).toEqual(['not_shot', 'not_shot']);
  });

  it('on an in-bay upgrade the install segment may be marked shot', async () => {
    const wheel = await byTitle('Heated steering wheel');
    const res = await patch(await signInAs('installer'), wheel, { installSegment: 'shot' });
    expect(res.status).toBe(200);
    expect(res.body.upgrade.installSegment).toBe('shot');
  });
});

describe('a double tap never skips a state', () => {
  it('two identical taps carrying one version: the first starts, the second answers 409 and changes nothing', async () => {
    const installer = await signInAs('installer');
    const remote = await byTitle('Remote start'); // queued, no prerequisites
    const tap = { installState: 'in_bay', version: remote.version };
    const [a, b] = await Promise.all([
      installer.patch(`/api/builds/${buildId}/upgrades/${remote.id}`).send(tap),
      installer.patch(`/api/builds/${buildId}/upgrades/${remote.id}`).send(tap),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    // The reflowed "installed" tap made from the old version is refused too.
    const skip = await installer
      .patch(`/api/builds/${buildId}/upgrades/${remote.id}`)
      .send({ installState: 'installed', version: remote.version });
    expect(skip.status).toBe(409);
    await remote.reload();
    expect(remote.installState).toBe('in_bay');
    expect(remote.version).toBe(tap.version + 1);
  });
});

describe('stepping back a mark', () => {
  it('the maker steps back a fresh mark without a reason; it is recorded', async () => {
    const installer = await signInAs('installer');
    const inv = await byTitle('400 W cargo power outlet');
    expect((await patch(installer, inv, { installState: 'in_bay' })).status).toBe(200);
    await inv.reload();
    const res = await installer
      .post(`${base}/upgrades/${inv.id}/step-back`)
      .send({ mark: 'installState', version: inv.version });
    expect(res.status).toBe(200);
    expect(res.body.upgrade.installState).toBe('queued');
    const act = await Activity.findOne({
      where: { buildId, entity: 'upgrade', entityId: inv.id, action: 'step_back' },
    });
    expect(act!.summary).toBe('Stepped back 400 W cargo power outlet: install state In the bay → Queued');
    expect(act!.changes).toMatchObject({ installState: ['in_bay', 'queued'] });
  });

  it('someone else cannot step back the mark (403); after ten minutes the maker needs a reason (400, then 200)', async () => {
    const installer = await signInAs('installer');
    const lamps = await byTitle('Remote start'); // started above by the installer
    const other = await (
      await signInAs('producer')
    )
      .post(`${base}/upgrades/${lamps.id}/step-back`)
      .send({ mark: 'installState', version: lamps.version });
    expect(other.status).toBe(403);
    // Age the installer's mark by eleven minutes (activities refuse UPDATE, so insert an aged copy).
    const me = await User.findOne({ where: { email: 'installer@cedar-ridge.test' } });
    await sequelize.query(`ALTER TABLE activities DISABLE TRIGGER USER`);
    await sequelize.query(
      `UPDATE activities SET created_at = now() - interval '11 minutes' WHERE entity = 'upgrade' AND entity_id = :id AND user_id = :u`,
      {
        replacements: { id: lamps.id, u: me!.id },
      },
    );
    await sequelize.query(`ALTER TABLE activities ENABLE TRIGGER USER`);
    const noReason = await installer
      .post(`${base}/upgrades/${lamps.id}/step-back`)
      .send({ mark: 'installState', version: lamps.version });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields[0].path).toBe('reason');
    const ok = await installer
      .post(`${base}/upgrades/${lamps.id}/step-back`)
      .send({ mark: 'installState', version: lamps.version, reason: 'Started the wrong job' });
    expect(ok.status).toBe(200);
    const act = await Activity.findOne({ where: { buildId, entityId: lamps.id, action: 'step_back' } });
    expect(act!.summary).toContain('reason: Started the wrong job');
  });

  it('a stale version answers 409; an unknown mark 400', async () => {
    const installer = await signInAs('installer');
    const wheel = await byTitle('Heated steering wheel');
    const stale = await installer
      .post(`${base}/upgrades/${wheel.id}/step-back`)
      .send({ mark: 'installSegment', version: wheel.version - 1 });
    expect(stale.status).toBe(409);
    const bad = await installer
      .post(`${base}/upgrades/${wheel.id}/step-back`)
      .send({ mark: 'colour', version: wheel.version });
    expect(bad.status).toBe(400);
  });
});

describe('reading a safety caution', () => {
  it('is recorded in the upgrade history once and the floor says it was read by this person only', async () => {
    const installer = await signInAs('installer');
    const brake = await byTitle('Trailer brake controller');
    const item = (body: { upgrades: { upgrade: { id: number }; cautionRead: boolean }[] }) =>
      body.upgrades.find((i) => i.upgrade.id === brake.id)!;
    expect(item((await installer.get(base)).body).cautionRead).toBe(false);
    const res = await installer.post(`${base}/upgrades/${brake.id}/caution-read`).send({});
    expect(res.status).toBe(204);
    expect((await installer.post(`${base}/upgrades/${brake.id}/caution-read`).send({})).status).toBe(204);
    const rows = await Activity.findAll({ where: { buildId, entityId: brake.id, action: 'caution_read' } });
    expect(rows).toHaveLength(1);
    expect(rows[0].summary).toBe(
      'Read the safety caution of Trailer brake controller: Brakes and trailer brakes, High-current electrical',
    );
    expect(item((await installer.get(base)).body).cautionRead).toBe(true);
    expect(item((await (await signInAs('producer')).get(base)).body).cautionRead).toBe(false);
    const history = await installer.get(`/api/builds/${buildId}/upgrades/${brake.id}/activity`);
    expect(history.body.activity.map((a: { summary: string }) => a.summary)).toContain(rows[0].summary);
  });
});

describe('hours on the shop floor', () => {
  it('each upgrade shows hours logged by me and by everyone, and today has a total', async () => {
    const installer = await signInAs('installer');
    const wheel = await byTitle('Heated steering wheel');
    // Today on the demo shop's clock (America/Denver), read with the runtime's Intl.
    const today = new Intl.DateTimeFormat('en-CA', {
      timeZone: 'America/Denver',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
    }).format(new Date());
    await installer
      .post(`/api/builds/${buildId}/labour`)
      .send({ upgradeId: wheel.id, hours: 1.25, kind: 'install', workedOn: today });
    await (
      await signInAs('producer')
    )
      .post(`/api/builds/${buildId}/labour`)
      .send({ upgradeId: wheel.id, hours: 0.5, kind: 'filming', workedOn: today });
    const body = (await installer.get(base)).body;
    const w = body.inBay.find((i: { upgrade: { id: number } }) => i.upgrade.id === wheel.id);
    // The demo seeds 1.5 h on the wheel by the installer on 2026-11-27 (seeders/data/project-tern.ts):
    // mine 1.5 + 1.25 = 2.75, everyone 2.75 + 0.5 = 3.25; today mine 1.25, everyone 1.75.
    expect(w.hours).toEqual({ mine: 2.75, everyone: 3.25 });
    expect(body.today).toEqual({ date: today, mine: 1.25, everyone: 1.75 });
  });
});
