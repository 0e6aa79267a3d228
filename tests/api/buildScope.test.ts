// Build-scoped routes (/api/builds/:buildId/…): an anonymous caller gets the same 401 for a build
// that exists and for one that does not, so the answers never tell which builds exist. Signed-in
// people with the role get 404 for an unknown build; the order is role, build, record, body.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, signInAs, testApp } from '../helpers/api';
import { routeTable } from '../../server/routes';
import { Build, Upgrade } from '../../server/models';
import { everyAnswerHasAContract } from '../helpers/contract';

everyAnswerHasAContract();

const MISSING_BUILD = 2_147_000_000;
let ternId: number;
let upgradeId: number;

beforeAll(async () => {
  testApp(); // mounts the routes, so routeTable() lists them
  ternId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  upgradeId = (await Upgrade.findOne({ where: { buildId: ternId } }))!.id;
  expect(await Build.findByPk(MISSING_BUILD)).toBeNull();
});

function scopedRoutes() {
  const seen = new Set<string>();
  return routeTable()
    .filter((r) => r.path.startsWith('/api/builds/:buildId'))
    .filter((r) => (seen.has(`${r.method} ${r.path}`) ? false : (seen.add(`${r.method} ${r.path}`), true)));
}

function url(path: string, buildId: number) {
  return path.replace(':buildId', String(buildId)).replace(/:(\w+)/g, '1');
}

function send(method: string, u: string) {
  const agent = anonymous();
  const m = method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  return m === 'get' ? agent.get(u) : agent[m](u).send({});
}

describe('build-scoped routes', () => {
  it('are registered (the list below is not empty)', () => {
    expect(scopedRoutes().length).toBeGreaterThan(20);
  });

  it('answer an anonymous caller 401 for a build that exists and for one that does not, with the same body', async () => {
    const differing: string[] = [];
    for (const r of scopedRoutes()) {
      const known = await send(r.method, url(r.path, ternId));
      const unknown = await send(r.method, url(r.path, MISSING_BUILD));
      const notNumber = await send(r.method, url(r.path, 0).replace('/builds/0', '/builds/not-a-build'));
      if (
        known.status !== 401 ||
        unknown.status !== 401 ||
        notNumber.status !== 401 ||
        JSON.stringify(known.body) !== JSON.stringify(unknown.body)
      )
        differing.push(
          `${r.method} ${r.path}: existing ${known.status}, missing ${unknown.status}, not a number ${notNumber.status}`,
        );
    }
    expect(differing).toEqual([]);
  });

  it('answer a signed-in person with the role 404 for a build that does not exist', async () => {
    const producer = await signInAs('producer');
    const res = await producer.get(`/api/builds/${MISSING_BUILD}/upgrades`);
    expect(res.status).toBe(404);
    expect(res.body.error.message).toMatch(/Build/);
    // The same route on the demo build answers.
    expect((await producer.get(`/api/builds/${ternId}/upgrades`)).status).toBe(200);
  });

  it('check the role before the build: a person without the role gets 403 whether the build exists or not', async () => {
    const marketing = await signInAs('marketing');
    const known = await marketing.delete(`/api/builds/${ternId}/upgrades/${upgradeId}`);
    const unknown = await marketing.delete(`/api/builds/${MISSING_BUILD}/upgrades/${upgradeId}`);
    expect([known.status, unknown.status]).toEqual([403, 403]);
  });

  it('check the record is in the build before the body: a record of the build with a bad body is 400, a missing record is 404', async () => {
    const producer = await signInAs('producer');
    const bad = await producer.patch(`/api/builds/${ternId}/upgrades/${upgradeId}`).send({ estimatedHours: 'lots' });
    expect(bad.status).toBe(400);
    const missing = await producer
      .patch(`/api/builds/${ternId}/upgrades/${MISSING_BUILD}`)
      .send({ estimatedHours: 'lots' });
    expect(missing.status).toBe(404);
  });

  it('run the same order on every router: media checks the role before the build (a person without the role gets 403 whether the build exists or not)', async () => {
    const marketing = await signInAs('marketing');
    const known = await marketing.patch(`/api/builds/${ternId}/media/1`).send({ caption: 'x' });
    const unknown = await marketing.patch(`/api/builds/${MISSING_BUILD}/media/1`).send({ caption: 'x' });
    expect([known.status, unknown.status]).toEqual([403, 403]);
    const installer = await signInAs('installer');
    const requests = [
      await installer.get(`/api/builds/${ternId}/viewer-requests`),
      await installer.get(`/api/builds/${MISSING_BUILD}/viewer-requests`),
    ];
    expect(requests.map((r) => r.status)).toEqual([403, 403]);
  });

  it("check the media record is in the build before the body: another build's or a missing media row is 404 whatever the body", async () => {
    const producer = await signInAs('producer');
    const missing = await producer.patch(`/api/builds/${ternId}/media/${MISSING_BUILD}`).send({ stage: 'not-a-stage' });
    expect(missing.status).toBe(404);
    const notNumber = await producer.patch(`/api/builds/${ternId}/media/abc`).send({ stage: 'not-a-stage' });
    expect(notNumber.status).toBe(404);
  });

  it('answer one build the same way: a signed-in person gets 404 for a build that does not exist, 200 for one that does', async () => {
    const installer = await signInAs('installer');
    expect((await installer.get(`/api/builds/${MISSING_BUILD}`)).status).toBe(404);
    const res = await installer.get(`/api/builds/${ternId}`);
    expect(res.status).toBe(200);
    expect(res.body.build.id).toBe(ternId);
  });
});
