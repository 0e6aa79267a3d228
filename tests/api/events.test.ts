// Live updates on routes/events.ts: a signed-in browser of a build hears, within two seconds, that
// something changed — whichever server instance made the change, since the notice comes from PostgreSQL.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { signInAs, testApp, DEMO_EMAIL, DEMO_PASSWORD, type DemoRole } from '../helpers/api';
import { Build, Upgrade } from '../../server/models';
import { sequelize } from '../../server/db/sequelize';
import { stopBuildEvents } from '../../server/services/buildEvents';
import { BuildChange } from '../../shared/contracts/events';

let server: http.Server;
let port: number;
let buildId: number;

beforeAll(async () => {
  buildId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  server = testApp().listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  port = (server.address() as AddressInfo).port;
});
afterAll(async () => {
  await stopBuildEvents();
  server.closeAllConnections();
  await new Promise((r) => server.close(r));
});

async function cookieOf(role: DemoRole) {
  const res = await request(testApp())
    .post('/api/auth/login')
    .set('X-Requested-With', 'Bayslate')
    .send({ email: DEMO_EMAIL[role], password: DEMO_PASSWORD });
  return (res.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
}

/** Opens the stream; `next(event)` resolves with the data of the next message of that event. */
function open(path: string, cookie?: string) {
  const events: { event: string; data: string }[] = [];
  const waiters: { event: string; resolve: (d: string) => void }[] = [];
  let buffer = '';
  return new Promise<{ status: number; next: (event: string) => Promise<string>; close: () => void }>((resolve) => {
    const req = http.get({ host: '127.0.0.1', port, path, headers: cookie ? { Cookie: cookie } : {} }, (res) => {
      res.setEncoding('utf8');
      res.on('data', (chunk: string) => {
        buffer += chunk;
        let i;
        while ((i = buffer.indexOf('\n\n')) >= 0) {
          const block = buffer.slice(0, i);
          buffer = buffer.slice(i + 2);
          const event = /^event: (.*)$/m.exec(block)?.[1];
          const data = /^data: (.*)$/m.exec(block)?.[1] ?? '';
          if (!event) continue;
          const w = waiters.findIndex((x) => x.event === event);
          if (w >= 0) waiters.splice(w, 1)[0].resolve(data);
          else events.push({ event, data });
        }
      });
      resolve({
        status: res.statusCode ?? 0,
        next: (event) => {
          const k = events.findIndex((e) => e.event === event);
          if (k >= 0) return Promise.resolve(events.splice(k, 1)[0].data);
          return new Promise((r) => waiters.push({ event, resolve: r }));
        },
        close: () => req.destroy(),
      });
    });
  });
}

const within = <T>(ms: number, p: Promise<T>) =>
  Promise.race([
    p,
    new Promise<never>((_, reject) => setTimeout(() => reject(new Error(`nothing within ${ms} ms`)), ms)),
  ]);

describe('live updates of a build', () => {
  it("a producer's stream hears the installer's mark within two seconds, naming what changed", async () => {
    const stream = await open(`/api/builds/${buildId}/events`, await cookieOf('producer'));
    try {
      expect(stream.status).toBe(200);
      await within(2000, stream.next('ready'));
      const u = (await Upgrade.findOne({ where: { buildId, title: 'Remote start' } }))!;
      const installer = await signInAs('installer');
      const started = Date.now(); // from the change, not from the installer's sign-in
      const res = await installer
        .patch(`/api/builds/${buildId}/upgrades/${u.id}`)
        .send({ installState: 'in_bay', version: u.version });
      expect(res.status).toBe(200);
      const data = BuildChange.parse(JSON.parse(await within(2000, stream.next('change'))));
      expect(Date.now() - started).toBeLessThan(2000);
      expect(data).toEqual({ what: ['upgrades'] });
    } finally {
      stream.close();
    }
  });

  it('a change written by another server instance (straight to the database) reaches marketing too; values never travel', async () => {
    const stream = await open(`/api/builds/${buildId}/events`, await cookieOf('marketing'));
    try {
      await within(2000, stream.next('ready'));
      await sequelize.query(
        `UPDATE parts SET supplier = supplier WHERE build_id = :b AND id = (SELECT min(id) FROM parts WHERE build_id = :b)`,
        { replacements: { b: buildId } },
      );
      const data = await within(2000, stream.next('change'));
      expect(BuildChange.parse(JSON.parse(data))).toEqual({ what: ['parts'] });
    } finally {
      stream.close();
    }
  });

  it("another build's change is not sent; anonymous 401; an unknown build 404", async () => {
    const other = await Build.create({
      slug: 'events-other',
      name: 'Other',
      year: 2020,
      make: 'Halvorsen',
      model: 'Skua',
      vin: null,
      mileage: null,
      budgetCents: null,
      labourRateCents: null,
      campaign: null,
      summary: null,
    });
    const stream = await open(`/api/builds/${buildId}/events`, await cookieOf('installer'));
    try {
      await within(2000, stream.next('ready'));
      await Upgrade.create({
        buildId: other.id,
        title: 'Elsewhere',
        area: 'cabin',
        replaces: null,
        becomes: null,
        installedOn: null,
        episodeId: null,
        episodePosition: null,
        notes: null,
        tireFrom: null,
        tireTo: null,
      });
      await Upgrade.create({
        buildId,
        title: 'Here',
        area: 'cabin',
        replaces: null,
        becomes: null,
        installedOn: null,
        episodeId: null,
        episodePosition: null,
        notes: null,
        tireFrom: null,
        tireTo: null,
      });
      // The first change message is this build's own insert, not the other build's.
      expect(BuildChange.parse(JSON.parse(await within(2000, stream.next('change'))))).toEqual({ what: ['upgrades'] });
    } finally {
      stream.close();
    }
    expect((await open(`/api/builds/${buildId}/events`)).status).toBe(401);
    const unknown = await open(`/api/builds/${buildId + 100000}/events`, await cookieOf('installer'));
    expect(unknown.status).toBe(404);
    unknown.close();
  });
});
