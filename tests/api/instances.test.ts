// Several instances on one database (deploy): two compiled servers on this file's database.
// A session made on one works on the other, and one signed out on either ends on both (kept reads
// included); the sign-in limit counts across both; a write through one is in the other's overview
// at once; a person deactivated through one is signed out on the other; two mail workers send each
// mail exactly once.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, removeBuild, startServerProcess, type ServerProcess } from '../helpers/server-process';
import { DEMO_EMAIL, DEMO_PASSWORD } from '../helpers/api';
import { enqueueMail } from '../../server/mail';
import { mailsTo, uniqueAddress } from '../helpers/mailbox';
import { sequelize } from '../../server/models';

const LIMIT = 4;
let a: ServerProcess;
let b: ServerProcess;

beforeAll(async () => {
  const env = {
    NODE_ENV: 'test',
    BAYSLATE_DEMO: '1',
    LOGIN_RATE_LIMIT: String(LIMIT),
    MAIL_WORKER: '1',
    MAIL_POLL_MS: '50',
    LOG_TEST_ERRORS: '1',
    // Kept session reads last a minute here, so only the change notice can end one in time below.
    SESSION_READ_CACHE_MS: '60000',
  };
  [a, b] = await Promise.all([startServerProcess(env), startServerProcess(env)]);
});
afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
  removeBuild();
});

async function signedIn(server: ServerProcess, email: string) {
  const c = new Client(server.url);
  const res = await c.post('/api/auth/login', { email, password: DEMO_PASSWORD });
  expect(res.status, res.text).toBe(200);
  return c;
}

describe('two instances on one database', () => {
  it('a session made on one works on the other', async () => {
    const onA = await signedIn(a, DEMO_EMAIL.producer);
    const onB = onA.on(b.url);
    const me = await onB.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe(DEMO_EMAIL.producer);
    // Signing out on B ends the session on A too.
    expect((await onB.post('/api/auth/logout', {})).status).toBe(200);
    expect((await onA.get('/api/auth/me')).status).toBe(401);
  });

  it('a session read kept on one ends there at once when it is signed out on the other', async () => {
    const onA = await signedIn(a, DEMO_EMAIL.producer);
    expect((await onA.get('/api/auth/me')).status).toBe(200);
    expect((await onA.get('/api/auth/me')).status).toBe(200);
    expect((await onA.on(b.url).post('/api/auth/logout', {})).status).toBe(200);
    // A kept its read for a minute; the notice ends it within moments (asked until 10 s have passed).
    const until = Date.now() + 10_000;
    let status = (await onA.get('/api/auth/me')).status;
    while (status === 200 && Date.now() < until) {
      await new Promise((r) => setTimeout(r, 50));
      status = (await onA.get('/api/auth/me')).status;
    }
    expect(status).toBe(401);
  });

  it('the sign-in limit counts attempts on both together', async () => {
    const wrong = { email: DEMO_EMAIL.marketing, password: 'not-the-password' };
    const onA = new Client(a.url);
    const onB = new Client(b.url);
    // LIMIT wrong attempts, half on each: each instance alone saw fewer than its limit.
    for (let i = 0; i < LIMIT / 2; i++) expect((await onA.post('/api/auth/login', wrong)).status).toBe(401);
    for (let i = 0; i < LIMIT / 2; i++) expect((await onB.post('/api/auth/login', wrong)).status).toBe(401);
    const next = await onA.post('/api/auth/login', { ...wrong, password: DEMO_PASSWORD });
    expect(next.status).toBe(429);
    expect((await onB.post('/api/auth/login', { ...wrong, password: DEMO_PASSWORD })).status).toBe(429);
    const [rows] = await sequelize.query(
      `SELECT hits FROM rate_limit_counters WHERE key LIKE 'login:%' AND key LIKE '%${DEMO_EMAIL.marketing}'`,
    );
    expect((rows as { hits: number }[])[0].hits).toBe(LIMIT + 2);
  });

  it('a write through one is in the other’s overview at once', async () => {
    const ownerA = await signedIn(a, DEMO_EMAIL.owner);
    const ownerB = ownerA.on(b.url);
    const list = await ownerA.get('/api/builds');
    const build = (list.body.builds as { id: number; slug: string }[]).find((x) => x.slug === 'project-tern')!;
    const path = `/api/builds/${build.id}/overview`;
    // B computes and caches the overview (its listening connection opens on the first read), until
    // a read is served from its cache.
    const first = await ownerB.get(path);
    expect(first.status).toBe(200);
    let cachedOnB = false;
    for (let i = 0; i < 40 && !cachedOnB; i++) {
      cachedOnB = (await ownerB.get(path)).headers.get('x-overview-cache') === 'hit';
      if (!cachedOnB) await new Promise((r) => setTimeout(r, 50));
    }
    expect(cachedOnB).toBe(true);
    const budget = (first.body.build.budgetCents ?? 0) + 12_345;
    let version = (await ownerA.get(`/api/builds/${build.id}`)).body.build.version as number;
    for (let round = 0; round < 5; round++) {
      const patched = await ownerA.patch(`/api/builds/${build.id}`, { budgetCents: budget + round, version });
      expect(patched.status, patched.text).toBe(200);
      version = patched.body.build.version;
      // Straight after A answered: B must not serve its cached copy.
      const seen = await ownerB.get(path);
      expect(seen.status).toBe(200);
      expect(seen.body.build.budgetCents).toBe(budget + round);
    }
  });

  it('a person deactivated through one is signed out on the other', async () => {
    const ownerA = await signedIn(a, DEMO_EMAIL.owner);
    const installerB = await signedIn(b, DEMO_EMAIL.installer);
    expect((await installerB.get('/api/auth/me')).status).toBe(200);
    const users = await ownerA.get('/api/users');
    const installer = (users.body.users as { id: number; email: string }[]).find(
      (u) => u.email === DEMO_EMAIL.installer,
    )!;
    expect((await ownerA.patch(`/api/users/${installer.id}`, { active: false })).status).toBe(200);
    // B had the person in its two-second cache; the change notice drops it well before that.
    await new Promise((r) => setTimeout(r, 300));
    expect((await installerB.get('/api/auth/me')).status).toBe(401);
  });

  it('two mail workers send each mail exactly once', async () => {
    const addresses = Array.from({ length: 24 }, (_, i) => uniqueAddress(`twice-${i}`));
    for (const to of addresses)
      await enqueueMail(null, { kind: 'test', to, subject: 'One of a batch', text: 'Sent once.' });
    const until = Date.now() + 20_000;
    for (;;) {
      const [rows] = await sequelize.query(
        `SELECT count(*)::int AS n FROM mail_outbox WHERE kind = 'test' AND state = 'sent'`,
      );
      if ((rows as { n: number }[])[0].n === addresses.length) break;
      if (Date.now() > until) throw new Error('the workers did not send the batch in time');
      await new Promise((r) => setTimeout(r, 100));
    }
    for (const to of addresses) expect((await mailsTo(to)).length, to).toBe(1);
  });
});
