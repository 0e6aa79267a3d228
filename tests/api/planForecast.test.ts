// The forecast finish and critical chain on GET /plan: part arrival dates and shop hours count (issue 11, finding 8).
import { describe, it, expect, beforeAll } from 'vitest';
import { signInAs } from '../helpers/api';
import { sequelize, Build } from '../../server/models';

let buildId: number;
let base: string;
// "Today" in the demo build's own zone (America/Denver), read with the runtime's Intl, not our date module:
// between midnight UTC and midnight in Denver the two calendars differ by a day.
const todayIso = () =>
  new Intl.DateTimeFormat('en-CA', {
    timeZone: 'America/Denver',
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
  }).format(new Date());
const later = (a: string, b: string) => (a > b ? a : b);

beforeAll(async () => {
  buildId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  base = `/api/builds/${buildId}/plan`;
});

describe('the forecast finish', () => {
  it('no earlier than the day the last part of the driving chain is due, plus its work', async () => {
    const producer = await signInAs('producer');
    const res = await producer.get(base);
    expect(res.status).toBe(200);
    const cp = res.body.criticalPath;
    // The demo's surround-view camera (7 h, priority 1) waits on a camera set due 2026-12-29
    // (server/db/seeders/data/project-tern-electrical.ts). It cannot start before then, and 7 h at the
    // shop's 24 h a week is 7 × 7 / 24 ≈ 2.04 calendar days, so it cannot finish before the 31st.
    const due = later(todayIso(), '2026-12-29');
    expect(cp.earliestFinish > due).toBe(true);
    // The planner names the late part that drives the date and the chain through it.
    expect(cp.drivingPart).toMatchObject({
      upgradeTitle: 'Surround-view camera',
      partNumber: 'HT-CAM-7100',
      expectedArrival: '2026-12-29',
    });
    expect(cp.critical.map((c: { title: string }) => c.title)).toContain('Surround-view camera');
  });

  it('counts the shop hours per week: with every part in, all remaining hours must still be worked', async () => {
    const producer = await signInAs('producer');
    await sequelize.query(
      "UPDATE parts SET state = 'received', expected_arrival = NULL WHERE state NOT IN ('received','fitted','returned') AND upgrade_id IN (SELECT id FROM upgrades WHERE build_id = :b)",
      { replacements: { b: buildId } },
    );
    const [{ hours }] = await sequelize.query<{ hours: number }>(
      "SELECT coalesce(sum(estimated_hours), 0)::float AS hours FROM upgrades WHERE build_id = :b AND install_state <> 'installed'",
      { replacements: { b: buildId }, type: 'SELECT' as never },
    );
    const res = await producer.get(base);
    expect(res.status).toBe(200);
    const cp = res.body.criticalPath;
    expect(cp.drivingPart).toBeNull();
    // One bay: the remaining hours at 24 h a week (the demo build's shop hours), in calendar days, rounded up.
    const days = Math.ceil((hours * 7) / 24 - 1e-9);
    const expected = new Date(Date.parse(`${todayIso()}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
    expect(cp.earliestFinish).toBe(expected);
  });
});
