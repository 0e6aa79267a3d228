// The shop floor's outbox ordering (src/offline/outbox.ts) over the real IndexedDB store module,
// with fake-indexeddb standing in for the browser's IndexedDB: strict order, refusals kept, a lost
// network keeps the rest, undo before sending, never a double send. The browser journey
// (tests/e2e/shopFloorOffline.test.ts) is the proof against the real server.
import 'fake-indexeddb/auto';
import { IDBFactory } from 'fake-indexeddb';
import { describe, it, expect, beforeEach } from 'vitest';
import { reactive } from 'vue';
import { ApiError } from '@/api/http';
import { closeStore, offlineStore, type NewAction, type QueuedAction } from '@/offline/store';
import { createOutbox } from '@/offline/outbox';
import { withWaiting } from '@/offline/apply';
import type { ShopFloor } from '@/api/shopFloor';

beforeEach(async () => {
  await closeStore();
  globalThis.indexedDB = new IDBFactory();
});

const USER = 7;
const mark = (upgradeId: number, version: number, label: string): NewAction => ({
  kind: 'mark',
  userId: USER,
  buildId: 1,
  upgradeId,
  upgradeTitle: `Upgrade ${upgradeId}`,
  version,
  label,
  createdAt: '2026-12-02T08:00:00.000Z',
  mark: 'installState',
  change: { installState: 'in_bay' },
});
const hours = (upgradeId: number, h: number, workedOn = '2026-12-02'): NewAction => ({
  kind: 'hours',
  userId: USER,
  buildId: 1,
  upgradeId,
  upgradeTitle: `Upgrade ${upgradeId}`,
  version: 1,
  label: `${h} h`,
  createdAt: '2026-12-02T08:00:00.000Z',
  hours: h,
  labourKind: 'install',
  workedOn,
});

describe('outbox', () => {
  it('sends strictly in the order made; a refusal is kept with the server words and the rest still go', async () => {
    const sent: string[] = [];
    const outbox = createOutbox(offlineStore, USER, {
      send: async (a: QueuedAction) => {
        if (a.label === 'B') throw new ApiError(409, 'stale', 'Someone else changed this record since you loaded it.');
        sent.push(a.label);
        return { ok: a.label };
      },
    });
    for (const l of ['A', 'B', 'C', 'D']) await outbox.enqueue(mark(1, 3, l));
    expect(await outbox.flush()).toEqual({ sent: 3, refused: 1, stopped: false });
    expect(sent).toEqual(['A', 'C', 'D']);
    expect(await offlineStore.queued(USER)).toEqual([]);
    const refusals = await offlineStore.refusals(USER);
    expect(refusals.map((r) => [r.label, r.status, r.message, r.upgradeTitle])).toEqual([
      ['B', 409, 'Someone else changed this record since you loaded it.', 'Upgrade 1'],
    ]);
  });

  it('a lost network stops the run and keeps that action and the later ones, in order, for the next run', async () => {
    let offline = true;
    const sent: string[] = [];
    const outbox = createOutbox(offlineStore, USER, {
      send: async (a) => {
        if (a.label === 'B' && offline) throw new ApiError(0, 'network', 'The server cannot be reached.');
        sent.push(a.label);
      },
    });
    for (const l of ['A', 'B', 'C']) await outbox.enqueue(mark(1, 1, l));
    expect(await outbox.flush()).toEqual({ sent: 1, refused: 0, stopped: true });
    expect((await offlineStore.queued(USER)).map((a) => a.label)).toEqual(['B', 'C']);
    offline = false;
    expect(await outbox.flush()).toEqual({ sent: 2, refused: 0, stopped: false });
    expect(sent).toEqual(['A', 'B', 'C']);
    expect(await offlineStore.refusals(USER)).toEqual([]);
  });

  it('each action keeps one key from enqueue to its last resend, so the server can tell a resend from a new change', async () => {
    const keysSent: (string | undefined)[] = [];
    let lost = true;
    const outbox = createOutbox(offlineStore, USER, {
      send: async (a) => {
        keysSent.push(a.key);
        // The server saved it, but the answer never arrived: the phone must resend with the same key.
        if (lost) throw new ApiError(0, 'network', 'The server cannot be reached.');
      },
    });
    await outbox.enqueue(hours(1, 1.5));
    await outbox.enqueue(hours(1, 2));
    expect(await outbox.flush()).toEqual({ sent: 0, refused: 0, stopped: true });
    lost = false;
    expect(await outbox.flush()).toEqual({ sent: 2, refused: 0, stopped: false });
    expect(keysSent).toHaveLength(3);
    expect(keysSent[0]).toMatch(/^[A-Za-z0-9_-]{8,100}$/);
    expect(keysSent[1]).toBe(keysSent[0]);
    expect(keysSent[2]).not.toBe(keysSent[0]);
  });

  it('signed out (401) and server trouble (503) are "later", not refusals; a rule (422) is a refusal', async () => {
    const answers = [
      new ApiError(401, 'unauthorized', 'Sign in.'),
      new ApiError(503, 'http_503', 'Down.'),
      new ApiError(422, 'rule', 'Not allowed now.'),
      null,
    ];
    const outbox = createOutbox(offlineStore, USER, {
      send: async () => {
        const a = answers.shift();
        if (a) throw a;
      },
    });
    await outbox.enqueue(mark(1, 1, 'A'));
    await outbox.enqueue(mark(2, 1, 'B'));
    expect((await outbox.flush()).stopped).toBe(true);
    expect((await outbox.flush()).stopped).toBe(true);
    expect(await outbox.flush()).toEqual({ sent: 1, refused: 1, stopped: false });
    expect((await offlineStore.refusals(USER)).map((r) => [r.label, r.status])).toEqual([['A', 422]]);
  });

  it('two flushes at once never send an action twice', async () => {
    const sent: string[] = [];
    const outbox = createOutbox(offlineStore, USER, {
      send: async (a) => {
        await new Promise((r) => setTimeout(r, 5));
        sent.push(a.label);
      },
    });
    for (const l of ['A', 'B', 'C']) await outbox.enqueue(mark(1, 1, l));
    await Promise.all([outbox.flush(), outbox.flush(), outbox.flush()]);
    expect(sent).toEqual(['A', 'B', 'C']);
  });

  it('undo before sending takes the action out; undo of a sent one answers what the server gave back', async () => {
    const sent: string[] = [];
    const outbox = createOutbox(offlineStore, USER, {
      send: async (a) => {
        sent.push(a.label);
        return { upgrade: { id: a.upgradeId, version: a.version + 1 } };
      },
    });
    const a = await outbox.enqueue(mark(1, 4, 'A'));
    const b = await outbox.enqueue(mark(2, 9, 'B'));
    expect(await outbox.cancel(b)).toEqual({ removed: true });
    await outbox.flush();
    expect(sent).toEqual(['A']);
    expect(await outbox.cancel(a)).toEqual({ removed: false, sentResult: { upgrade: { id: 1, version: 5 } } });
  });

  it('undo while the action is being sent waits for the answer instead of racing it', async () => {
    let release!: () => void;
    const outbox = createOutbox(offlineStore, USER, {
      send: () => new Promise((r) => (release = () => r({ upgrade: { id: 1, version: 2 } }))),
    });
    const seq = await outbox.enqueue(mark(1, 1, 'A'));
    const run = outbox.flush();
    await new Promise((r) => setTimeout(r, 20));
    const undo = outbox.cancel(seq);
    release();
    expect(await undo).toEqual({ removed: false, sentResult: { upgrade: { id: 1, version: 2 } } });
    expect(await run).toEqual({ sent: 1, refused: 0, stopped: false });
  });

  it("only this person's actions are sent", async () => {
    const sent: string[] = [];
    const outbox = createOutbox(offlineStore, USER, { send: async (a) => void sent.push(a.label) });
    await offlineStore.enqueue({ ...mark(1, 1, 'theirs'), userId: USER + 1 });
    await outbox.enqueue(mark(1, 1, 'mine'));
    await outbox.flush();
    expect(sent).toEqual(['mine']);
    expect((await offlineStore.queued(USER + 1)).map((a) => a.label)).toEqual(['theirs']);
  });
});

describe('the shop floor with waiting changes applied', () => {
  const upgrade = (id: number, version: number) => ({
    id,
    version,
    installState: 'queued',
    installSegment: 'not_shot',
    demoSegment: 'not_shot',
    title: `U${id}`,
  });
  const floor = {
    episode: null,
    inBay: [],
    upgrades: [
      { upgrade: upgrade(1, 3), parts: [], hours: { mine: 1, everyone: 2.5 } },
      { upgrade: upgrade(2, 8), parts: [], hours: { mine: 0, everyone: 0 } },
    ],
    choices: [],
    today: { date: '2026-12-02', mine: 1, everyone: 2.5 },
  } as unknown as ShopFloor;

  it('marks move the state and the version on; hours add to the card and, for today, to the day', () => {
    const waiting = [
      { ...mark(1, 3, 'Start'), seq: 1 },
      { ...mark(1, 4, 'Shot'), seq: 2, mark: 'installSegment', change: { installSegment: 'shot' } },
      { ...hours(1, 1.5), seq: 3 },
      { ...hours(2, 2, '2026-12-01'), seq: 4 },
    ] as QueuedAction[];
    const out = withWaiting(floor, waiting);
    // Worked by hand: two marks on upgrade 1 from version 3 end at version 5; 1 + 1.5 = 2.5 h mine,
    // 2.5 + 1.5 = 4 h everyone's; the 2 h of yesterday count on upgrade 2's card but not today.
    expect(out.upgrades[0]!.upgrade).toMatchObject({ installState: 'in_bay', installSegment: 'shot', version: 5 });
    expect(out.upgrades[0]!.hours).toEqual({ mine: 2.5, everyone: 4 });
    expect(out.upgrades[1]!.hours).toEqual({ mine: 2, everyone: 2 });
    expect(out.today).toEqual({ date: '2026-12-02', mine: 2.5, everyone: 4 });
    // The server's answer itself is untouched.
    expect(floor.upgrades[0]!.upgrade.version).toBe(3);
    expect(floor.today.mine).toBe(1);
  });

  it("works on the screen's reactive copy of the answer (a structured clone of a Vue proxy threw)", () => {
    const out = withWaiting(reactive(floor) as ShopFloor, [{ ...mark(2, 8, 'Start'), seq: 1 }] as QueuedAction[]);
    expect(out.upgrades[1]!.upgrade).toMatchObject({ installState: 'in_bay', version: 9 });
  });
});
