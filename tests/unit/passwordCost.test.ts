// bcrypt's cost for stored passwords: 10 by default, lower only outside production (the tests run
// at 4 so that their sign-ins stay cheap), and a production start at a lower cost is refused with
// the setting named. OWASP's Password Storage Cheat Sheet asks for a bcrypt work factor of 10 or more.
import { describe, it, expect } from 'vitest';
import { loadConfig, MIN_PRODUCTION_HASH_COST } from '../../server/config';

const base = { DATABASE_URL: 'postgres://x/y', SESSION_SECRET: 'x'.repeat(32) };
const production = { ...base, NODE_ENV: 'production', VIEWER_KEY_SECRET: 'y'.repeat(32) };

describe('PASSWORD_HASH_COST', () => {
  it('is 10 unless set, in production and elsewhere', () => {
    expect(MIN_PRODUCTION_HASH_COST).toBe(10);
    expect(loadConfig(production).PASSWORD_HASH_COST).toBe(10);
    expect(loadConfig({ ...base, NODE_ENV: 'development' }).PASSWORD_HASH_COST).toBe(10);
  });

  it('may be lowered outside production (the tests use 4) and raised anywhere', () => {
    expect(loadConfig({ ...base, NODE_ENV: 'test', PASSWORD_HASH_COST: '4' }).PASSWORD_HASH_COST).toBe(4);
    expect(loadConfig({ ...production, PASSWORD_HASH_COST: '12' }).PASSWORD_HASH_COST).toBe(12);
  });

  it('refuses a production start below 10, naming the setting and the fix', () => {
    expect(() => loadConfig({ ...production, PASSWORD_HASH_COST: '4' })).toThrow(
      /PASSWORD_HASH_COST: must be 10 or more in production \(it is 4; unset it for the default, 10\)/,
    );
  });

  it('refuses a cost bcrypt does not take, anywhere', () => {
    expect(() => loadConfig({ ...base, PASSWORD_HASH_COST: '3' })).toThrow(/PASSWORD_HASH_COST/);
    expect(() => loadConfig({ ...base, PASSWORD_HASH_COST: '16' })).toThrow(/PASSWORD_HASH_COST/);
    expect(() => loadConfig({ ...base, PASSWORD_HASH_COST: 'ten' })).toThrow(/PASSWORD_HASH_COST/);
  });
});
