// Hardening found while trying the server as an attacker would (issue 10): NUL characters, the
// Host header, caching of signed-in answers, invitation links and sessions after a password change.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, signInAs, testApp } from '../helpers/api';
import { counts } from '../helpers/db';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { sequelize, Build, Upgrade } from '../../server/models';
import { hostAllowed } from '../../server/middleware/host';
import { loadConfig } from '../../server/config';

let tern: number;
beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
});

describe('NUL characters', () => {
  const TABLES = ['upgrades', 'users', 'viewer_requests', 'activities'];

  it('a create answers 400 naming the field and stores nothing', async () => {
    const owner = await signInAs('owner');
    const before = await counts(...TABLES);
    const up = await owner.post(`/api/builds/${tern}/upgrades`).send({ title: 'Roof\u0000rack', area: 'front' });
    expect(up.status).toBe(400);
    expect(up.body.error.fields).toEqual([
      expect.objectContaining({ path: 'title', message: expect.stringContaining('NUL') }),
    ]);
    const person = await owner
      .post('/api/users')
      .send({ email: 'nul@cedar-ridge.test', name: 'Nul\u0000Person', roles: ['installer'] });
    expect(person.status).toBe(400);
    expect(person.body.error.fields[0].path).toBe('name');
    const viewer = await anonymous()
      .post('/api/public/builds/project-tern/requests')
      .send({ title: 'A winch\u0000please', email: 'nul@viewers.test' });
    expect(viewer.status).toBe(400);
    expect(viewer.body.error.fields[0].path).toBe('title');
    expect(await counts(...TABLES)).toEqual(before);
  });

  it('an update answers 400 naming the field (not 500) and changes nothing', async () => {
    const producer = await signInAs('producer');
    const u = (await Upgrade.findOne({ where: { buildId: tern }, order: [['id', 'ASC']] }))!;
    const res = await producer
      .patch(`/api/builds/${tern}/upgrades/${u.id}`)
      .send({ version: u.version, notes: 'fine\u0000not' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('notes');
    const after = (await Upgrade.findByPk(u.id))!;
    expect(after.version).toBe(u.version);
    expect(after.notes).toBe(u.notes);
  });
});

describe('NUL characters in fields outside the text helpers', () => {
  it('a chapter title and a backlog search answer 400 naming the field, not 500', async () => {
    const { Episode } = await import('../../server/models');
    const ep = (await Episode.findOne({ where: { buildId: tern, number: 3 } }))!;
    const marketing = await signInAs('marketing');
    const put = await marketing
      .put(`/api/builds/${tern}/episodes/${ep.id}/chapters`)
      .send({ chapters: [{ startSeconds: 0, title: 'Intro\u0000' }] });
    expect(put.status).toBe(400);
    expect(put.body.error.fields[0].path).toBe('chapters.0.title');
    const search = await (
      await signInAs('producer')
    ).get(`/api/builds/${tern}/upgrades?q=${encodeURIComponent('winch\u0000')}`);
    expect(search.status).toBe(400);
    expect(search.body.error.fields[0].path).toBe('q');
  });
});

describe('Host header', () => {
  it('a request for another host is refused with a clear JSON answer', async () => {
    const res = await request(testApp()).get('/api/auth/me').set('Host', 'bayslate.attacker.example');
    expect(res.status).toBe(421);
    expect(res.body.error.code).toBe('wrong_host');
    expect(res.body.error.message).toContain('bayslate.attacker.example');
  });

  it('loopback works in development and test, only the public host in production', () => {
    const prod = loadConfig({
      NODE_ENV: 'production',
      DATABASE_URL: 'postgres://x/y',
      SESSION_SECRET: 'x'.repeat(32),
      VIEWER_KEY_SECRET: 'y'.repeat(32),
      PUBLIC_URL: 'https://shop.example.com',
    });
    expect(hostAllowed('shop.example.com', prod)).toBe(true);
    expect(hostAllowed('SHOP.example.com', prod)).toBe(true);
    expect(hostAllowed('127.0.0.1:3000', prod)).toBe(false);
    expect(hostAllowed('evil.example.com', prod)).toBe(false);
    expect(hostAllowed(undefined, prod)).toBe(false);
    const listed = loadConfig({
      NODE_ENV: 'production',
      DATABASE_URL: 'postgres://x/y',
      SESSION_SECRET: 'x'.repeat(32),
      VIEWER_KEY_SECRET: 'y'.repeat(32),
      PUBLIC_URL: 'https://shop.example.com',
      ALLOWED_HOSTS: 'internal-lb:8080, other.example.com',
    });
    expect(hostAllowed('internal-lb:8080', listed)).toBe(true);
    expect(hostAllowed('other.example.com', listed)).toBe(true);
    const dev = loadConfig({
      NODE_ENV: 'development',
      DATABASE_URL: 'postgres://x/y',
      SESSION_SECRET: 'x'.repeat(32),
      PUBLIC_URL: 'http://127.0.0.1:3000',
    });
    expect(hostAllowed('localhost:5173', dev)).toBe(true);
    expect(hostAllowed('[::1]:3000', dev)).toBe(true);
    expect(hostAllowed('evil.example.com', dev)).toBe(false);
  });
});

describe('caching of signed-in answers', () => {
  it('every signed-in API answer carries Cache-Control: no-store', async () => {
    const owner = await signInAs('owner');
    for (const path of [
      '/api/auth/me',
      '/api/users',
      `/api/builds/${tern}/upgrades`,
      `/api/builds/${tern}/overview`,
      '/api/builds',
      '/api/no-such-route',
    ]) {
      const res = await owner.get(path);
      expect(res.headers['cache-control'], `${path} (${res.status})`).toBe('no-store');
    }
  });
});

async function invitationTokenFor(email: string) {
  const rows = await sequelize.query<{ text_body: string }>(
    `SELECT text_body FROM mail_outbox WHERE kind = 'invitation' AND to_address = :email ORDER BY id DESC LIMIT 1`,
    {
      replacements: { email },
      type: QueryTypes.SELECT,
    },
  );
  const m = /\/welcome\/([A-Za-z0-9_-]+)/.exec(rows[0]!.text_body);
  return m![1]!;
}

describe('invitation links end when the password changes', () => {
  it('an owner resetting the password ends the unused invitation', async () => {
    const owner = await signInAs('owner');
    const made = await owner
      .post('/api/users')
      .send({ email: 'invite-reset@cedar-ridge.test', name: 'Ines Reset', roles: ['installer'] });
    expect(made.status).toBe(201);
    const token = await invitationTokenFor('invite-reset@cedar-ridge.test');
    expect((await anonymous().get(`/api/invitations/${token}`)).status).toBe(200);
    expect(
      (await owner.post(`/api/users/${made.body.user.id}/password`).send({ password: 'owner-set-password' })).status,
    ).toBe(200);
    expect((await anonymous().get(`/api/invitations/${token}`)).status).toBe(404);
    const use = await anonymous().post(`/api/invitations/${token}`).send({ password: 'attacker-choice-1' });
    expect(use.status).toBe(404);
    await signInAs({ email: 'invite-reset@cedar-ridge.test', password: 'owner-set-password' });
  });

  it("changing one's own password ends the unused invitation", async () => {
    const owner = await signInAs('owner');
    const made = await owner.post('/api/users').send({
      email: 'invite-own@cedar-ridge.test',
      name: 'Otto Own',
      roles: ['installer'],
      password: 'first-password-1',
    });
    expect(made.status).toBe(201);
    const token = await invitationTokenFor('invite-own@cedar-ridge.test');
    const otto = await signInAs({ email: 'invite-own@cedar-ridge.test', password: 'first-password-1' });
    expect(
      (
        await otto
          .post('/api/auth/password')
          .send({ currentPassword: 'first-password-1', newPassword: 'second-password-2' })
      ).status,
    ).toBe(200);
    expect((await anonymous().post(`/api/invitations/${token}`).send({ password: 'attacker-choice-1' })).status).toBe(
      404,
    );
    await signInAs({ email: 'invite-own@cedar-ridge.test', password: 'second-password-2' });
  });
});

describe("sessions after changing one's own password", () => {
  it('ends the other sessions and keeps this one', async () => {
    const owner = await signInAs('owner');
    await owner.post('/api/users').send({
      email: 'two-devices@cedar-ridge.test',
      name: 'Tess Devices',
      roles: ['installer'],
      password: 'first-password-1',
    });
    const phone = await signInAs({ email: 'two-devices@cedar-ridge.test', password: 'first-password-1' });
    const desk = await signInAs({ email: 'two-devices@cedar-ridge.test', password: 'first-password-1' });
    expect((await phone.get('/api/auth/me')).status).toBe(200);
    const res = await desk
      .post('/api/auth/password')
      .send({ currentPassword: 'first-password-1', newPassword: 'second-password-2' });
    expect(res.status).toBe(200);
    expect((await desk.get('/api/auth/me')).status).toBe(200);
    expect((await phone.get('/api/auth/me')).status).toBe(401);
  });
});
