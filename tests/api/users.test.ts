// Users and roles on routes/users.ts: create, change roles, deactivate, reset, last owner.
import { describe, it, expect } from 'vitest';
import { anonymous, signInAs } from '../helpers/api';
import { count } from '../helpers/db';
import { everyAnswerHasAContract } from '../helpers/contract';

everyAnswerHasAContract();

describe('users and roles', () => {
  it('the owner lists users without password hashes', async () => {
    const owner = await signInAs('owner');
    const res = await owner.get('/api/users');
    expect(res.status).toBe(200);
    expect(res.body.users.length).toBeGreaterThanOrEqual(4);
    expect(JSON.stringify(res.body)).not.toContain('passwordHash');
  });

  it('creates a person with several roles and a temporary password that signs in', async () => {
    const owner = await signInAs('owner');
    const res = await owner
      .post('/api/users')
      .send({ email: 'Sam@Cedar-Ridge.test', name: 'Sam Aldana', roles: ['installer', 'marketing'] });
    expect(res.status).toBe(201);
    expect(res.body.user).toMatchObject({ email: 'sam@cedar-ridge.test', roles: ['installer', 'marketing'] });
    const temp = res.body.temporaryPassword as string;
    expect(temp.length).toBeGreaterThanOrEqual(10);
    const sam = await signInAs({ email: 'sam@cedar-ridge.test', password: temp });
    expect((await sam.get('/api/auth/me')).body.user.roles).toEqual(['installer', 'marketing']);
    const dup = await owner
      .post('/api/users')
      .send({ email: 'sam@cedar-ridge.test', name: 'Again', roles: ['installer'] });
    expect(dup.status).toBe(409);
    expect(dup.body.error.fields[0].path).toBe('email');
  });

  it('the last active owner cannot be demoted or deactivated', async () => {
    const owner = await signInAs('owner');
    const me = (await owner.get('/api/auth/me')).body.user;
    const demote = await owner.patch(`/api/users/${me.id}`).send({ roles: ['producer'] });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('last_owner');
    const deactivate = await owner.patch(`/api/users/${me.id}`).send({ active: false });
    expect(deactivate.status).toBe(409);
    expect((await owner.get('/api/auth/me')).body.user.roles).toEqual(['owner']);
  });

  it('a second owner makes demotion possible', async () => {
    const owner = await signInAs('owner');
    const created = await owner.post('/api/users').send({
      email: 'second-owner@cedar-ridge.test',
      name: 'Second Owner',
      roles: ['owner'],
      password: 'second-owner-pw',
    });
    expect(created.status).toBe(201);
    const res = await owner.patch(`/api/users/${created.body.user.id}`).send({ roles: ['producer'] });
    expect(res.status).toBe(200);
    expect(res.body.user.roles).toEqual(['producer']);
  });

  it('resetting a password ends their sessions and the new password works', async () => {
    const owner = await signInAs('owner');
    const producer = await signInAs('producer');
    const pid = (await producer.get('/api/auth/me')).body.user.id;
    const res = await owner.post(`/api/users/${pid}/password`).send({ password: 'fresh-password-1' });
    expect(res.status).toBe(200);
    expect((await producer.get('/api/auth/me')).status).toBe(401);
    await signInAs({ email: 'producer@cedar-ridge.test', password: 'fresh-password-1' });
    await owner.post(`/api/users/${pid}/password`).send({ password: 'bayslate-demo' });
  });

  it('a person changes their own password only with the current one', async () => {
    const m = await signInAs('marketing');
    const bad = await m.post('/api/auth/password').send({ currentPassword: 'wrong', newPassword: 'another-pass' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('currentPassword');
    const short = await m.post('/api/auth/password').send({ currentPassword: 'bayslate-demo', newPassword: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.fields[0].path).toBe('newPassword');
  });

  it('unknown user id answers 404 and writes nothing', async () => {
    const owner = await signInAs('owner');
    const before = await count('activities');
    expect((await owner.patch('/api/users/999999').send({ name: 'X' })).status).toBe(404);
    expect(await count('activities')).toBe(before);
  });

  it('every change is recorded in the activity history', async () => {
    const owner = await signInAs('owner');
    const before = await count('activities');
    await owner.post('/api/users').send({ email: 'rec@cedar-ridge.test', name: 'Rec', roles: ['installer'] });
    expect(await count('activities')).toBe(before + 1);
    expect((await anonymous().get('/api/users')).status).toBe(401);
  });
});
