// Slips, baselines and notices (routes/slips.ts, the part date hooks in services/parts.ts, migration 0025,
// demo seeder 0007). Dates are worked out by hand in the comments from the demo data.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, signInAs } from '../helpers/api';
import { counts } from '../helpers/db';
import { todayIn } from '../../shared/dates';
import { sequelize, Build, Episode, Part } from '../../server/models';
import { everyAnswerHasAContract } from '../helpers/contract';

// Every JSON answer these tests read is parsed with its route's contract (shared/contracts).
everyAnswerHasAContract();

let buildId: number;
const plus = (iso: string, days: number) =>
  new Date(Date.parse(`${iso}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
// Today on the demo build's clock (America/Denver), as the server counts overdue parts.
const todayIso = () => todayIn('America/Denver');

type Slip = {
  episodeId: number;
  number: number;
  title: string;
  state: string;
  baseline: { shootDate: string | null; releaseDate: string | null };
  planned: { shootDate: string | null; releaseDate: string | null };
  projected: { shootDate: string | null; releaseDate: string | null };
  partsDelayDays: number;
  slipDays: { shoot: number | null; release: number | null };
  releaseAtRisk: boolean;
  cause: { partNumber: string; upgradeTitle: string; expectedArrival: string; overdue: boolean } | null;
};

beforeAll(async () => {
  buildId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
});

const slipsOf = async (agent: Awaited<ReturnType<typeof signInAs>>) => {
  const res = await agent.get(`/api/builds/${buildId}/slips`);
  expect(res.status).toBe(200);
  return res.body as { episodes: Slip[]; atRisk: number[] };
};
const digests = async () =>
  await sequelize.query<{ to_address: string; subject: string; text_body: string }>(
    "SELECT to_address, subject, text_body FROM mail_outbox WHERE kind = 'slip_digest' ORDER BY id",
    { type: 'SELECT' as never },
  );

describe('baselines', () => {
  it('the demo shows "Ready to tow" a week behind its baseline, and the part date changes in the history', async () => {
    const producer = await signInAs('producer');
    const { episodes, atRisk } = await slipsOf(producer);
    const tow = episodes.find((e) => e.title === 'Ready to tow')!;
    // Seeder 0007: the baseline is the plan of a week earlier; the pad is now due before the shoot.
    expect(tow.baseline.shootDate).toBe(plus(tow.planned.shootDate!, -7));
    expect(tow.baseline.releaseDate).toBe(plus(tow.planned.releaseDate!, -7));
    expect(tow.slipDays).toEqual({ shoot: 7, release: 7 });
    expect(tow.partsDelayDays).toBe(0);
    expect(atRisk).toEqual([]);
    // Live episodes keep their baseline as shot; drafts have none yet.
    expect(episodes.find((e) => e.state === 'live')!.slipDays).toEqual({ shoot: 0, release: 0 });
    expect(episodes.find((e) => e.state === 'draft')!.baseline).toEqual({ shootDate: null, releaseDate: null });
    const [row] = await sequelize.query<{ summary: string }>(
      "SELECT summary FROM activities WHERE entity = 'part' AND summary LIKE 'Expected arrival moved%' LIMIT 1",
      { type: 'SELECT' as never },
    );
    expect(row.summary).toMatch(
      /^Expected arrival moved from \d{4}-\d{2}-\d{2} to \d{4}-\d{2}-\d{2} \(8 days later\) for part HT-WCP-9510$/,
    );
  });

  it('an episode takes its baseline when it is scheduled, and keeps it when its dates move', async () => {
    const producer = await signInAs('producer');
    const created = await producer
      .post(`/api/builds/${buildId}/episodes`)
      .send({ title: 'Baseline check', shootDate: '2027-03-01', releaseDate: '2027-03-08' });
    expect(created.status).toBe(201);
    const id = created.body.episode.id;
    const baselineOf = async () => (await slipsOf(producer)).episodes.find((e) => e.episodeId === id)!.baseline;
    expect(await baselineOf()).toEqual({ shootDate: null, releaseDate: null });
    const scheduled = await producer
      .patch(`/api/builds/${buildId}/episodes/${id}`)
      .send({ state: 'scheduled', version: created.body.episode.version });
    expect(scheduled.status).toBe(200);
    expect(await baselineOf()).toEqual({ shootDate: '2027-03-01', releaseDate: '2027-03-08' });
    const moved = await producer
      .patch(`/api/builds/${buildId}/episodes/${id}`)
      .send({ shootDate: '2027-03-04', releaseDate: '2027-03-12', version: scheduled.body.episode.version });
    expect(moved.status).toBe(200);
    expect(await baselineOf()).toEqual({ shootDate: '2027-03-01', releaseDate: '2027-03-08' });
    const slip = (await slipsOf(producer)).episodes.find((e) => e.episodeId === id)!;
    expect(slip.slipDays).toEqual({ shoot: 3, release: 4 });
    await Episode.destroy({ where: { id } });
  });
});

describe('slip alerts', () => {
  it("a part moving past its episode's shoot puts the release at risk, tells producers once a day, and is in the history", async () => {
    const producer = await signInAs('producer');
    const tow = (await slipsOf(producer)).episodes.find((e) => e.title === 'Ready to tow')!;
    const pad = (await Part.findOne({ where: { buildId, partNumber: 'HT-WCP-9510' } }))!;
    const noticesBefore = await counts('notices');
    expect(await digests()).toEqual([]);

    // Five days after the planned shoot: the shoot and the release move 5 days (12 against the baseline).
    const due = plus(tow.planned.shootDate!, 5);
    const res = await producer
      .patch(`/api/builds/${buildId}/parts/${pad.id}`)
      .send({ expectedArrival: due, version: pad.version });
    expect(res.status).toBe(200);
    const after = await slipsOf(producer);
    const now = after.episodes.find((e) => e.title === 'Ready to tow')!;
    expect(now.partsDelayDays).toBe(5);
    expect(now.projected).toEqual({ shootDate: due, releaseDate: plus(tow.planned.releaseDate!, 5) });
    expect(now.slipDays).toEqual({ shoot: 12, release: 12 });
    expect(now.releaseAtRisk).toBe(true);
    expect(now.cause).toMatchObject({
      partNumber: 'HT-WCP-9510',
      upgradeTitle: 'Wireless charging pad',
      expectedArrival: due,
      overdue: false,
    });
    expect(after.atRisk).toEqual([now.episodeId]);

    // History, in words, with the number of days from the pad's seeded date.
    const [act] = await sequelize.query<{ summary: string }>(
      "SELECT summary FROM activities WHERE entity = 'part' AND entity_id = :id ORDER BY id DESC LIMIT 1",
      { replacements: { id: pad.id }, type: 'SELECT' as never },
    );
    const was = pad.expectedArrival!;
    const days = Math.round((Date.parse(due) - Date.parse(was)) / 86_400_000);
    expect(act.summary).toBe(`Expected arrival moved from ${was} to ${due} (${days} days later) for part HT-WCP-9510`);

    // Notices: the part's move and the release at risk.
    const list = await producer.get(`/api/builds/${buildId}/notices`);
    expect(list.status).toBe(200);
    expect((await counts('notices')).notices).toBe(noticesBefore.notices + 2);
    const risk = list.body.notices.find((n: { kind: string }) => n.kind === 'release_at_risk');
    expect(risk.message).toContain('"Ready to tow"');
    expect(risk.message).toContain('at risk by 5 days');
    expect(list.body.unread).toBeGreaterThanOrEqual(2);

    // One digest to each active producer and owner of the demo (one of each).
    const mails = await digests();
    expect(mails.map((m) => m.to_address).sort()).toEqual(['owner@cedar-ridge.test', 'producer@cedar-ridge.test']);
    expect(mails[0].text_body).toContain('Episode 7, Ready to tow');
    expect(mails[0].text_body).toContain('HT-WCP-9510');

    // A second move the same day adds notices but no second digest.
    const again = await producer
      .patch(`/api/builds/${buildId}/parts/${pad.id}`)
      .send({ expectedArrival: plus(due, 3), version: res.body.version });
    expect(again.status).toBe(200);
    expect((await slipsOf(producer)).episodes.find((e) => e.title === 'Ready to tow')!.partsDelayDays).toBe(8);
    expect((await digests()).length).toBe(2);

    // Marking seen clears the badge for this person only.
    const seen = await producer.post(`/api/builds/${buildId}/notices/seen`);
    expect(seen.status).toBe(200);
    expect(seen.body.unread).toBe(0);
    const owner = await signInAs('owner');
    expect((await owner.get(`/api/builds/${buildId}/notices`)).body.unread).toBeGreaterThan(0);

    // The part arriving clears the risk.
    const received = await producer
      .patch(`/api/builds/${buildId}/parts/${pad.id}`)
      .send({ state: 'received', version: again.body.version });
    expect(received.status).toBe(200);
    expect((await slipsOf(producer)).atRisk).toEqual([]);
  });

  it('a part going overdue (the day passes, no write) becomes a notice on the next look', async () => {
    const producer = await signInAs('producer');
    const [part] = await sequelize.query<{ id: number; part_number: string }>(
      "SELECT p.id, p.part_number FROM parts p JOIN upgrades u ON u.id = p.upgrade_id WHERE p.build_id = :b AND p.part_number = 'HT-SVM-7101'",
      { replacements: { b: buildId }, type: 'SELECT' as never },
    );
    const yesterday = plus(todayIso(), -1);
    await sequelize.query('UPDATE parts SET expected_arrival = :d WHERE id = :id', {
      replacements: { d: yesterday, id: part.id },
    });
    const list = await producer.get(`/api/builds/${buildId}/notices`);
    const overdue = list.body.notices.filter(
      (n: { kind: string; data: { partId: number } }) => n.kind === 'part_overdue' && n.data.partId === part.id,
    );
    expect(overdue).toHaveLength(1);
    expect(overdue[0].message).toBe(
      `Part HT-SVM-7101 (Surround-view module) for Surround-view camera was expected ${yesterday} and has not been received.`,
    );
    // Looking again adds nothing.
    const before = await counts('notices');
    await producer.get(`/api/builds/${buildId}/notices`);
    expect(await counts('notices')).toEqual(before);
  });

  it('anonymous 401; installer and marketing 403', async () => {
    expect((await anonymous().get(`/api/builds/${buildId}/slips`)).status).toBe(401);
    for (const role of ['installer', 'marketing'] as const) {
      const agent = await signInAs(role);
      expect((await agent.get(`/api/builds/${buildId}/slips`)).status).toBe(403);
      expect((await agent.get(`/api/builds/${buildId}/notices`)).status).toBe(403);
      expect((await agent.post(`/api/builds/${buildId}/notices/seen`)).status).toBe(403);
    }
  });
});
