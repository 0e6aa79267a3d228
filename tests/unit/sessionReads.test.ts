// The session-read cache's own rules, on a store that answers when the test says (services/sessionReads.ts).
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cacheSessionReads, forgetSessionReads, type SessionStoreLike } from '../../server/services/sessionReads';

/** A store whose rows are in a Map; its answers wait until `flush()` when `held` is on. */
function testStore() {
  const rows = new Map<string, object>();
  const waiting: (() => void)[] = [];
  const s = {
    rows,
    reads: 0,
    held: false,
    flush: () => waiting.splice(0).forEach((f) => f()),
    get(sid: string, cb: (err: unknown, sess?: object | null) => void) {
      s.reads += 1;
      const row = rows.get(sid);
      const copy = row ? JSON.parse(JSON.stringify(row)) : null;
      if (s.held) waiting.push(() => cb(null, copy));
      else cb(null, copy);
    },
    set(sid: string, sess: object, cb?: (err?: unknown) => void) {
      rows.set(sid, sess);
      cb?.();
    },
    destroy(sid: string, cb?: (err?: unknown) => void) {
      rows.delete(sid);
      cb?.();
    },
  };
  return s;
}

const read = (store: SessionStoreLike, sid: string) =>
  new Promise<object | null | undefined>((resolve, reject) =>
    store.get(sid, (err, sess) => (err ? reject(err) : resolve(sess))),
  );
const later = (minutes: number) => new Date(Date.now() + minutes * 60_000).toISOString();

afterEach(() => vi.useRealTimers());

describe('kept session reads', () => {
  it('reads the row again once the cache time has passed', async () => {
    vi.useFakeTimers({ now: new Date('2026-03-02T10:00:00Z'), toFake: ['Date'] });
    const store = testStore();
    store.rows.set('a', { cookie: { expires: later(60) }, passport: { user: 1 } });
    cacheSessionReads(store, 2000, () => true);
    await read(store, 'a');
    vi.setSystemTime(new Date('2026-03-02T10:00:01.900Z'));
    expect(await read(store, 'a')).toEqual(store.rows.get('a'));
    expect(store.reads).toBe(1);
    vi.setSystemTime(new Date('2026-03-02T10:00:02.001Z'));
    await read(store, 'a');
    expect(store.reads).toBe(2);
  });

  it('hands out a copy: a request changing its session does not change the kept one', async () => {
    const store = testStore();
    store.rows.set('a', { cookie: { expires: later(60) }, passport: { user: 1 } });
    cacheSessionReads(store, 2000, () => true);
    const first = (await read(store, 'a')) as { passport: { user?: number } };
    delete first.passport.user;
    expect(await read(store, 'a')).toEqual({ cookie: { expires: expect.any(String) }, passport: { user: 1 } });
  });

  it('keeps a session whose row was touched past the expiry written inside it', async () => {
    // What the store holds after the idle time of a person working all day: its touches move only the
    // row's expiry column, so the expiry inside the session is past while the row is valid. Before:
    // such a session was read again on every request, so a long day never used the kept read.
    vi.useFakeTimers({ now: new Date('2026-03-02T18:00:00Z'), toFake: ['Date'] });
    const store = testStore();
    store.rows.set('a', { cookie: { expires: '2026-03-02T17:00:00.000Z' }, passport: { user: 1 } });
    cacheSessionReads(store, 2000, () => true);
    await read(store, 'a');
    vi.setSystemTime(new Date('2026-03-02T18:00:01Z'));
    expect(await read(store, 'a')).toMatchObject({ passport: { user: 1 } });
    expect(store.reads).toBe(1);
  });

  it('goes to the store on every read while notices cannot be trusted', async () => {
    const store = testStore();
    store.rows.set('a', { cookie: { expires: later(60) } });
    let heard = false;
    cacheSessionReads(store, 2000, () => heard);
    await read(store, 'a');
    await read(store, 'a');
    expect(store.reads).toBe(2);
    heard = true;
    await read(store, 'a');
    await read(store, 'a');
    expect(store.reads).toBe(3);
  });

  it('does not keep a read that began before the session was changed', async () => {
    const store = testStore();
    store.rows.set('a', { cookie: { expires: later(60) }, signedInAt: 1 });
    cacheSessionReads(store, 2000, () => true);
    store.held = true;
    const old = read(store, 'a');
    store.set('a', { cookie: { expires: later(60) }, signedInAt: 2 });
    store.flush();
    expect(await old).toMatchObject({ signedInAt: 1 });
    store.held = false;
    expect(await read(store, 'a')).toMatchObject({ signedInAt: 2 });
  });

  it('forgets one session, or all, when told (a change notice, a change of person)', async () => {
    const store = testStore();
    store.rows.set('a', { cookie: { expires: later(60) } });
    store.rows.set('b', { cookie: { expires: later(60) } });
    cacheSessionReads(store, 60_000, () => true);
    await read(store, 'a');
    await read(store, 'b');
    store.rows.delete('a');
    forgetSessionReads('a');
    expect(await read(store, 'a')).toBeNull();
    expect(await read(store, 'b')).not.toBeNull();
    expect(store.reads).toBe(3);
    forgetSessionReads(null);
    await read(store, 'b');
    expect(store.reads).toBe(4);
  });

  it('is off at 0', async () => {
    const store = testStore();
    store.rows.set('a', { cookie: { expires: later(60) } });
    cacheSessionReads(store, 0, () => true);
    await read(store, 'a');
    await read(store, 'a');
    expect(store.reads).toBe(2);
  });
});
