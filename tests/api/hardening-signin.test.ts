// Sign-in throttling per account across addresses (issue 10), behind a proxy that names the
// viewer's address in X-Forwarded-For (TRUST_PROXY), as a real deployment would run.
import { describe, it, expect, vi } from 'vitest';

vi.hoisted(() => {
  process.env.TRUST_PROXY = '1';
});

import { anonymous } from '../helpers/api';

const attempt = (from: string, email: string, password: string) =>
  anonymous().set('X-Forwarded-For', from).post('/api/auth/login').send({ email, password });

describe('sign-in throttling per account', () => {
  it('eleven wrong passwords from eleven addresses are not all tried', async () => {
    // LOGIN_RATE_LIMIT defaults to 10 failed attempts per account and window.
    const answers: number[] = [];
    for (let i = 1; i <= 11; i++)
      answers.push((await attempt(`203.0.113.${i}`, 'Producer@Cedar-Ridge.test', `wrong-guess-${i}`)).status);
    expect(answers.slice(0, 10)).toEqual(Array(10).fill(401));
    expect(answers[10]).toBe(429);
    // Another account from one of those addresses is still tried: the address limit is separate.
    expect((await attempt('203.0.113.11', 'installer@cedar-ridge.test', 'wrong-guess')).status).toBe(401);
  });

  it('successful sign-ins do not count against the account', async () => {
    for (let i = 1; i <= 12; i++) {
      const res = await attempt(`198.51.100.${i}`, 'marketing@cedar-ridge.test', 'bayslate-demo');
      expect(res.status, `sign-in ${i}`).toBe(200);
    }
  });

  it('the per-address limit sees the forwarded address, not the proxy', async () => {
    // The address limit is five times the account limit (50): one viewer trying fifty accounts is
    // held back on the 51st; another viewer behind the same proxy is not.
    for (let i = 0; i < 50; i++)
      expect((await attempt('192.0.2.7', `nobody-${i}@cedar-ridge.test`, 'wrong')).status).toBe(401);
    expect((await attempt('192.0.2.7', 'nobody-50@cedar-ridge.test', 'wrong')).status).toBe(429);
    expect((await attempt('192.0.2.8', 'nobody-50@cedar-ridge.test', 'wrong')).status).toBe(401);
  });
});

describe('an unknown e-mail', () => {
  it('costs the same bcrypt work as a wrong password: the stand-in hash has the real hashes’ cost', async () => {
    const bcrypt = (await import('bcryptjs')).default;
    const { dummyHash, DUMMY_HASH_COST_10 } = await import('../../server/middleware/auth');
    const { hashPassword } = await import('../../server/services/passwords');
    // The tests run at a lower cost (PASSWORD_HASH_COST=4); the stand-in follows it.
    expect(bcrypt.getRounds(dummyHash())).toBe(bcrypt.getRounds(await hashPassword('a-new-password-1')));
    expect(await bcrypt.compare('not-a-real-password', dummyHash())).toBe(false);
    // The literal used at the default cost is a hash at cost 10.
    expect(bcrypt.getRounds(DUMMY_HASH_COST_10)).toBe(10);
    const answer = await attempt('203.0.113.200', 'nobody-here@shop.test', 'whatever-1234');
    expect(answer.status).toBe(401);
  });
});
