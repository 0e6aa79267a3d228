// What was measured (issue 12, bench:api): a cached overview answered at 38 % of the bare route's
// rate against a target of 40 %; every signed-in request first read its session row, one query
// before any feature ran. A session read is now reused for SESSION_READ_CACHE_MS (2 s), and any
// change or end of the session is seen at once. (Across instances: tests/api/instances.test.ts.)
import { afterEach, describe, expect, it, vi } from 'vitest';
import { anonymous, DEMO_EMAIL, DEMO_PASSWORD } from '../helpers/api';
import { sharedPool } from '../../server/db/pool';
import { sequelize, User } from '../../server/models';
import { endSessionsOf } from '../../server/services/users';

/** Counts the session store's reads of a session row while `work` runs. */
async function sessionReadsDuring(work: () => Promise<void>): Promise<number> {
  const pool = sharedPool();
  const query = pool.query.bind(pool) as (...args: unknown[]) => unknown;
  let reads = 0;
  const spy = vi.spyOn(pool, 'query').mockImplementation(((...args: unknown[]) => {
    const text = typeof args[0] === 'string' ? args[0] : (args[0] as { text?: string })?.text;
    if (text && /SELECT sess FROM .*session/i.test(text)) reads += 1;
    return query(...args);
  }) as never);
  try {
    await work();
  } finally {
    spy.mockRestore();
  }
  return reads;
}

/** Signs in and returns the session cookie, to send on requests made afterwards. */
async function signedInCookie(email: string): Promise<string> {
  const res = await anonymous().post('/api/auth/login').send({ email, password: DEMO_PASSWORD });
  expect(res.status).toBe(200);
  return (res.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
}

const meWith = (cookie: string) => anonymous().get('/api/auth/me').set('Cookie', cookie);

afterEach(() => vi.restoreAllMocks());

describe('reading a signed-in person’s session', () => {
  it('reads the row once for several requests within the cache time', async () => {
    const cookie = await signedInCookie(DEMO_EMAIL.owner);
    const reads = await sessionReadsDuring(async () => {
      for (let i = 0; i < 5; i++) expect((await meWith(cookie)).status).toBe(200);
    });
    // Before: 5 (one per request).
    expect(reads).toBe(1);
  });

  it('signing out ends the session at once, kept read or not', async () => {
    const cookie = await signedInCookie(DEMO_EMAIL.installer);
    expect((await meWith(cookie)).status).toBe(200);
    expect((await meWith(cookie)).status).toBe(200);
    expect((await anonymous().post('/api/auth/logout').set('Cookie', cookie).send({})).status).toBe(200);
    expect((await meWith(cookie)).status).toBe(401);
  });

  it('a session deleted in this process by a change of person is not served from memory', async () => {
    const cookie = await signedInCookie(DEMO_EMAIL.owner);
    expect((await meWith(cookie)).status).toBe(200);
    // As "sign out my other sessions" does (services/users.ts endSessionsOf), through the service.
    const owner = (await User.findOne({ where: { email: DEMO_EMAIL.owner } }))!;
    await sequelize.transaction((t) => endSessionsOf(owner.id, t));
    expect((await meWith(cookie)).status).toBe(401);
  });
});
