// Sign-in, sign-out, sessions, rate limiting and malformed input on routes/auth.ts.
import { describe, it, expect } from 'vitest';
import request from 'supertest';
import { anonymous, signInAs, testApp, DEMO_EMAIL, DEMO_PASSWORD } from '../helpers/api';
import { count } from '../helpers/db';
import { updateUser } from '../../server/services/users';
import { User } from '../../server/models';
import { everyAnswerHasAContract, expectContract } from '../helpers/contract';
import { SessionAnswer } from '../../shared/contracts/auth';

// /api/health is another domain's (its contract comes with it).
everyAnswerHasAContract({ except: ['/api/health'] });

const cookieOf = (res: request.Response) => String(res.headers['set-cookie']?.[0] ?? '').split(';')[0];

describe('sign-in', () => {
  it('signs in with the right password and returns the user with roles', async () => {
    const res = await anonymous().post('/api/auth/login').send({ email: DEMO_EMAIL.producer, password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: DEMO_EMAIL.producer, roles: ['producer'] });
    expect(res.body.user.passwordHash).toBeUndefined();
    const cookie = res.headers['set-cookie']?.[0] ?? '';
    expect(cookie).toMatch(/^bayslate\.sid=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('accepts the e-mail in any case', async () => {
    const res = await anonymous()
      .post('/api/auth/login')
      .send({ email: DEMO_EMAIL.owner.toUpperCase(), password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
  });

  it('answers the same for an unknown e-mail and a wrong password', async () => {
    const wrong = await anonymous()
      .post('/api/auth/login')
      .send({ email: DEMO_EMAIL.installer, password: 'nope-nope' });
    const unknown = await anonymous()
      .post('/api/auth/login')
      .send({ email: 'nobody@cedar-ridge.test', password: 'nope-nope' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
  });

  it('me answers 401 anonymous and the user when signed in', async () => {
    expect((await anonymous().get('/api/auth/me')).status).toBe(401);
    const agent = await signInAs('marketing');
    const me = await agent.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.roles).toEqual(['marketing']);
  });

  it('changes the session id at sign-in: the pre-sign-in cookie stays anonymous', async () => {
    const app = testApp();
    // Anonymous visits get no cookie (sessions are made only at sign-in), so the cookie we
    // replay is one that existed before the second sign-in on the same browser.
    const first = await request(app)
      .post('/api/auth/login')
      .set('X-Requested-With', 'Bayslate')
      .send({ email: DEMO_EMAIL.owner, password: DEMO_PASSWORD });
    const oldCookie = cookieOf(first);
    const second = await request(app)
      .post('/api/auth/login')
      .set('Cookie', oldCookie)
      .set('X-Requested-With', 'Bayslate')
      .send({ email: DEMO_EMAIL.installer, password: DEMO_PASSWORD });
    const newCookie = cookieOf(second);
    expect(newCookie).not.toBe(oldCookie);
    // The old id was thrown away at the second sign-in: replaying it is anonymous now.
    expect((await request(app).get('/api/auth/me').set('Cookie', oldCookie)).status).toBe(401);
    const me = await request(app).get('/api/auth/me').set('Cookie', newCookie);
    expect(expectContract(SessionAnswer, me.body).user.email).toBe(DEMO_EMAIL.installer);
  });

  it('sign-out ends the session: the old cookie answers 401', async () => {
    const app = testApp();
    const res = await request(app)
      .post('/api/auth/login')
      .set('X-Requested-With', 'Bayslate')
      .send({ email: DEMO_EMAIL.producer, password: DEMO_PASSWORD });
    const cookie = cookieOf(res);
    expect((await request(app).get('/api/auth/me').set('Cookie', cookie)).status).toBe(200);
    expect(
      (await request(app).post('/api/auth/logout').set('Cookie', cookie).set('X-Requested-With', 'Bayslate')).status,
    ).toBe(200);
    expect((await request(app).get('/api/auth/me').set('Cookie', cookie)).status).toBe(401);
  });

  it('a deactivated person is signed out at once', async () => {
    const victim = await signInAs('marketing');
    expect((await victim.get('/api/auth/me')).status).toBe(200);
    const owner = await User.findOne({ where: { email: DEMO_EMAIL.owner } });
    const target = await User.findOne({ where: { email: DEMO_EMAIL.marketing } });
    await updateUser({ id: owner!.id, name: owner!.name }, target!.id, { active: false });
    expect((await victim.get('/api/auth/me')).status).toBe(401);
    const again = await anonymous()
      .post('/api/auth/login')
      .send({ email: DEMO_EMAIL.marketing, password: DEMO_PASSWORD });
    expect(again.status).toBe(401);
    await updateUser({ id: owner!.id, name: owner!.name }, target!.id, { active: true });
  });

  it('rate-limits repeated attempts for one e-mail with 429', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 12; i += 1) {
      statuses.push(
        (
          await anonymous()
            .post('/api/auth/login')
            .send({ email: 'target@cedar-ridge.test', password: `guess-${i}` })
        ).status,
      );
    }
    expect(statuses.slice(0, 10).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(10)).toEqual([429, 429]);
  });
});

describe('malformed input', () => {
  it('bad JSON answers 400 bad_json', async () => {
    const res = await anonymous().post('/api/auth/login').set('Content-Type', 'application/json').send('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_json');
  });
  it('unknown fields and wrong types answer 400 naming the field', async () => {
    const res = await anonymous().post('/api/auth/login').send({ email: 42, password: 'x', admin: true });
    expect(res.status).toBe(400);
    const paths = res.body.error.fields.map((f: { path: string }) => f.path);
    expect(paths).toContain('email');
    expect(JSON.stringify(res.body.error.fields)).toContain('admin');
  });
  it('a form post from another site is refused', async () => {
    const res = await request(testApp())
      .post('/api/auth/login')
      .set('Origin', 'http://evil.test')
      .set('Content-Type', 'application/json')
      .send({ email: DEMO_EMAIL.owner, password: DEMO_PASSWORD });
    expect(res.status).toBe(403);
    const form = await request(testApp())
      .post('/api/auth/login')
      .type('form')
      .send({ email: DEMO_EMAIL.owner, password: DEMO_PASSWORD });
    expect(form.status).toBe(415);
  });
  it('a refused user creation writes no row', async () => {
    const owner = await signInAs('owner');
    const before = await count('users');
    const res = await owner.post('/api/users').send({ email: 'not-an-email', name: '', roles: ['wizard'] });
    expect(res.status).toBe(400);
    const paths = res.body.error.fields.map((f: { path: string }) => f.path);
    expect(paths).toEqual(expect.arrayContaining(['email', 'name', 'roles.0']));
    expect(await count('users')).toBe(before);
  });
});

describe('health', () => {
  it('reports the database', async () => {
    const res = await anonymous().get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body.db).toBe(true);
  });
});
