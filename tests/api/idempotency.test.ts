// Idempotent changes (issue 14, "lose nothing"): the phone resends a waiting change whose answer the
// network lost. With the same Idempotency-Key the change happens once and the first answer comes
// back; without the key nothing changes from before.
import { describe, it, expect, beforeAll } from 'vitest';
import sharp from 'sharp';
import { signInAs } from '../helpers/api';
import { counts } from '../helpers/db';
import { Build, Upgrade } from '../../server/models';

type Agent = Awaited<ReturnType<typeof signInAs>>;
let buildId: number;
let upgradeId: number;
let installer: Agent;
let producer: Agent;
const labourUrl = () => `/api/builds/${buildId}/labour`;
const hours = { workedOn: '2026-12-01', hours: 1.25, kind: 'install' };

beforeAll(async () => {
  buildId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  upgradeId = (await Upgrade.findOne({ where: { buildId, title: 'Trailer wiring, 7-pin' } }))!.id;
  installer = await signInAs('installer');
  producer = await signInAs('producer');
});

describe('a change resent with the same key happens once', () => {
  it('hours logged twice with one key make one entry; the second answer is the first, marked replayed', async () => {
    const before = await counts('labour_entries', 'activities');
    const first = await installer
      .post(labourUrl())
      .set('Idempotency-Key', 'hours-key-0001')
      .send({ ...hours, upgradeId });
    expect(first.status).toBe(201);
    const again = await installer
      .post(labourUrl())
      .set('Idempotency-Key', 'hours-key-0001')
      .send({ ...hours, upgradeId });
    expect(again.status).toBe(201);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(again.body).toEqual(first.body);
    expect(await counts('labour_entries', 'activities')).toEqual({
      labour_entries: before.labour_entries + 1,
      activities: before.activities + 1,
    });
  });

  it('without a key, or with a new key, the same hours are logged again (nothing changes for other callers)', async () => {
    const before = await counts('labour_entries');
    expect((await installer.post(labourUrl()).send({ ...hours, upgradeId })).status).toBe(201);
    expect(
      (
        await installer
          .post(labourUrl())
          .set('Idempotency-Key', 'hours-key-0002')
          .send({ ...hours, upgradeId })
      ).status,
    ).toBe(201);
    expect((await counts('labour_entries')).labour_entries).toBe(before.labour_entries + 2);
  });

  it('a mark resent after it was saved gets its first answer, not a version conflict', async () => {
    const u = (await Upgrade.findByPk(upgradeId))!;
    const url = `/api/builds/${buildId}/upgrades/${upgradeId}`;
    const body = { installState: 'installed', version: u.version };
    const first = await installer.patch(url).set('Idempotency-Key', 'mark-key-0001').send(body);
    expect(first.status).toBe(200);
    const again = await installer.patch(url).set('Idempotency-Key', 'mark-key-0001').send(body);
    expect(again.status).toBe(200);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect((await Upgrade.findByPk(upgradeId))!.version).toBe(u.version + 1);
    // The same change without the key is what the phone used to send: a stale version, refused.
    expect((await installer.patch(url).send(body)).status).toBe(409);
  });

  it('a photo resent with its key is stored once', async () => {
    const file = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#3d5a73' } })
      .jpeg()
      .toBuffer();
    const before = await counts('media');
    const send = () =>
      installer
        .post(`/api/builds/${buildId}/media`)
        .set('Idempotency-Key', 'photo-key-0001')
        .field('upgradeId', String(upgradeId))
        .attach('file', file, { filename: 'bay.jpg', contentType: 'image/jpeg' });
    const first = await send();
    expect(first.status).toBe(201);
    const again = await send();
    expect(again.status).toBe(201);
    expect(again.body).toEqual(first.body);
    expect((await counts('media')).media).toBe(before.media + 1);
  });
});

describe('keys are checked and kept apart', () => {
  it('a refusal is kept too: the resend gets the same refusal', async () => {
    const before = await counts('labour_entries');
    const first = await installer
      .post(labourUrl())
      .set('Idempotency-Key', 'refused-key-01')
      .send({ ...hours, hours: -2, upgradeId });
    expect(first.status).toBe(400);
    const again = await installer
      .post(labourUrl())
      .set('Idempotency-Key', 'refused-key-01')
      .send({ ...hours, hours: -2, upgradeId });
    expect(again.status).toBe(400);
    expect(again.body).toEqual(first.body);
    expect((await counts('labour_entries')).labour_entries).toBe(before.labour_entries);
  });

  it('one key for two different changes answers 422 naming the first change', async () => {
    expect(
      (
        await installer
          .post(labourUrl())
          .set('Idempotency-Key', 'reused-key-01')
          .send({ ...hours, upgradeId })
      ).status,
    ).toBe(201);
    const other = await installer
      .patch(`/api/builds/${buildId}/upgrades/${upgradeId}`)
      .set('Idempotency-Key', 'reused-key-01')
      .send({ installState: 'in_bay', version: 1 });
    expect(other.status).toBe(422);
    expect(other.body.error.message).toMatch(/already used for POST \/api\/builds\/\d+\/labour/);
  });

  it('another person using the same key makes their own change', async () => {
    const before = await counts('labour_entries');
    expect(
      (
        await installer
          .post(labourUrl())
          .set('Idempotency-Key', 'shared-key-01')
          .send({ ...hours, upgradeId })
      ).status,
    ).toBe(201);
    const theirs = await producer
      .post(labourUrl())
      .set('Idempotency-Key', 'shared-key-01')
      .send({ ...hours, upgradeId });
    expect(theirs.status).toBe(201);
    expect(theirs.headers['idempotent-replayed']).toBeUndefined();
    expect((await counts('labour_entries')).labour_entries).toBe(before.labour_entries + 2);
  });

  it('a malformed key answers 400 naming the header, and nothing is written', async () => {
    const before = await counts('labour_entries');
    const res = await installer
      .post(labourUrl())
      .set('Idempotency-Key', 'bad key!')
      .send({ ...hours, upgradeId });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/Idempotency-Key/);
    expect((await counts('labour_entries')).labour_entries).toBe(before.labour_entries);
  });
});

describe('receipts live a week', () => {
  it('a key whose receipt is older than a week starts a new change instead of replaying the old answer', async () => {
    const { sequelize } = await import('../../server/models');
    const send = () =>
      installer
        .post(labourUrl())
        .set('Idempotency-Key', 'hours-key-old-1')
        .send({ ...hours, upgradeId });
    const before = await counts('labour_entries');
    expect((await send()).status).toBe(201);
    await sequelize.query(
      `UPDATE request_receipts SET created_at = now() - interval '8 days' WHERE key = 'hours-key-old-1'`,
    );
    const later = await send();
    expect(later.status).toBe(201);
    expect(later.headers['idempotent-replayed']).toBeUndefined();
    expect((await counts('labour_entries')).labour_entries).toBe(before.labour_entries + 2);
    // And the renewed receipt replays as usual.
    expect((await send()).headers['idempotent-replayed']).toBe('true');
  });

  it('the sweep forgets receipts older than a week and keeps younger ones', async () => {
    const { sequelize } = await import('../../server/models');
    const { sweepReceipts } = await import('../../server/services/requestReceipts');
    for (const key of ['sweep-key-young', 'sweep-key-old'])
      await installer
        .post(labourUrl())
        .set('Idempotency-Key', key)
        .send({ ...hours, upgradeId });
    await sequelize.query(
      `UPDATE request_receipts SET created_at = now() - interval '8 days' WHERE key = 'sweep-key-old'`,
    );
    expect(await sweepReceipts()).toBeGreaterThanOrEqual(1);
    const [rows] = await sequelize.query(`SELECT key FROM request_receipts WHERE key LIKE 'sweep-key-%' ORDER BY key`);
    expect(rows).toEqual([{ key: 'sweep-key-young' }]);
  });
});

describe('the receipt sweep', () => {
  it('runs on its own timer, outside any request', async () => {
    const { sequelize } = await import('../../server/models');
    const { startReceiptSweeper, stopReceiptSweeper } = await import('../../server/services/requestReceipts');
    await installer
      .post(labourUrl())
      .set('Idempotency-Key', 'timer-key-old')
      .send({ ...hours, upgradeId });
    await sequelize.query(
      `UPDATE request_receipts SET created_at = now() - interval '9 days' WHERE key = 'timer-key-old'`,
    );
    const left = async () =>
      ((await sequelize.query(`SELECT 1 FROM request_receipts WHERE key = 'timer-key-old'`))[0] as unknown[]).length;
    expect(await left()).toBe(1);
    startReceiptSweeper(20);
    try {
      for (let i = 0; i < 100 && (await left()) > 0; i++) await new Promise((r) => setTimeout(r, 50));
      expect(await left()).toBe(0);
    } finally {
      stopReceiptSweeper();
    }
  });
});
