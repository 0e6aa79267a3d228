// The shop floor on routes/shopFloor.ts: the next episode's checklist with parts, cautions and blocked prerequisites.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, signInAs } from '../helpers/api';
import { Build, Episode } from '../../server/models';
import { everyAnswerHasAContract } from '../helpers/contract';

// Every JSON answer these tests read is parsed with its route's contract (shared/contracts).
everyAnswerHasAContract();

let buildId: number;
let base: string;
let otherEpisodeId: number;

type Item = {
  upgrade: { id: number; title: string; installState: string; version: number; valueAddedCents?: number };
  parts: Record<string, unknown>[];
  prerequisitesMet: boolean;
  blockedBy: string[];
  cautions: { flag: string; caution: string }[];
};

beforeAll(async () => {
  buildId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  base = `/api/builds/${buildId}/shop-floor`;
  const other = await Build.create({
    slug: 'shop-other',
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
  otherEpisodeId = (
    await Episode.create({
      buildId: other.id,
      number: 1,
      title: 'Elsewhere',
      summary: null,
      state: 'scheduled',
      shootDate: '2027-01-01',
      releaseDate: null,
      videoUrl: null,
      runtimeSeconds: null,
      publishedAt: null,
    })
  ).id;
});

describe('the shop floor', () => {
  it('the installer sees the scheduled episode in running order, with parts, cautions and what blocks what', async () => {
    const installer = await signInAs('installer');
    const res = await installer.get(base);
    expect(res.status).toBe(200);
    expect(res.body.episode).toMatchObject({ title: 'Ready to tow', state: 'scheduled' });
    const items = res.body.upgrades as Item[];
    expect(items.map((i) => i.upgrade.title)).toEqual([
      'Trailer wiring, 7-pin',
      'Trailer brake controller',
      'Wireless charging pad',
    ]);
    const [wiring, brake, charger] = items;
    expect(wiring.prerequisitesMet).toBe(true);
    expect(brake.prerequisitesMet).toBe(false);
    expect(brake.blockedBy).toEqual(['Trailer wiring, 7-pin']);
    expect(charger.prerequisitesMet).toBe(true);
    // Safety cautions come from shared/safety.ts: brakes and high-current for the controller.
    expect(brake.cautions.map((c) => c.flag)).toEqual(['brakes', 'high_current']);
    expect(brake.cautions[0].caution).toContain("vehicle maker's service information");
    // Parts with their state, and no money for an installer.
    expect(wiring.parts.map((p) => p.state)).toEqual(['received', 'received']);
    expect(charger.parts[0]).toMatchObject({ state: 'ordered', expectedArrival: '2026-12-02' });
    for (const p of items.flatMap((i) => i.parts)) {
      expect(p).not.toHaveProperty('unitCostCents');
      expect(p).not.toHaveProperty('retailPriceCents');
    }
    expect(wiring.upgrade).not.toHaveProperty('valueAddedCents');
    expect(res.body.choices.map((c: { state: string }) => c.state)).toContain('in_edit');
  });

  it('the producer sees it with money; marketing 403; anonymous 401', async () => {
    const producer = await signInAs('producer');
    const res = await producer.get(base);
    expect(res.status).toBe(200);
    expect((res.body.upgrades as Item[])[0].parts[0]).toHaveProperty('unitCostCents');
    expect((await (await signInAs('marketing')).get(base)).status).toBe(403);
    expect((await anonymous().get(base)).status).toBe(401);
  });

  it('an installer cannot start an upgrade whose prerequisite is not installed; once it is, the floor says so', async () => {
    const installer = await signInAs('installer');
    const items = (await installer.get(base)).body.upgrades as Item[];
    const [wiring, brake] = items;
    const refused = await installer
      .patch(`/api/builds/${buildId}/upgrades/${brake.upgrade.id}`)
      .send({ installState: 'in_bay', version: brake.upgrade.version });
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('prerequisites_not_installed');
    expect(refused.body.error.message).toContain('Trailer wiring, 7-pin');
    const done = await installer
      .patch(`/api/builds/${buildId}/upgrades/${wiring.upgrade.id}`)
      .send({ installState: 'installed', version: wiring.upgrade.version });
    expect(done.status).toBe(200);
    const after = (await installer.get(base)).body.upgrades as Item[];
    expect(after[1].prerequisitesMet).toBe(true);
    expect(after[1].blockedBy).toEqual([]);
    expect(after[0].upgrade.installState).toBe('installed');
  });

  it("picks an episode by id; another build's episode answers 404; a bad id 400", async () => {
    const installer = await signInAs('installer');
    const eps = (await installer.get(`/api/builds/${buildId}/episodes`)).body.episodes;
    const inEdit = eps.find((e: { state: string }) => e.state === 'in_edit');
    const res = await installer.get(`${base}?episodeId=${inEdit.id}`);
    expect(res.status).toBe(200);
    expect(res.body.episode.id).toBe(inEdit.id);
    expect((res.body.upgrades as Item[]).map((i) => i.upgrade.title)).toEqual([
      'Clockspring for heated wheel',
      'Blind-spot radar',
    ]);
    expect((await installer.get(`${base}?episodeId=${otherEpisodeId}`)).status).toBe(404);
    expect((await installer.get(`${base}?episodeId=abc`)).status).toBe(400);
  });
});
