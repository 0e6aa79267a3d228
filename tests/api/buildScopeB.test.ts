// Build-scoped routes of the episodes, plan, shop floor, calendar, publishing, link health,
// campaign, sales, slips, notices and events routers: the fixed order role → build → record →
// validation (server/routes/buildScoped.ts). Anonymous callers get 401 for any build; a person
// without the role gets 403 whether the build exists or not; a person with the role gets 404 for a
// build that does not exist, and 404 for a record of no build before the body is looked at.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, signInAs, testApp, type DemoRole } from '../helpers/api';
import { Build, Episode, Upgrade } from '../../server/models';
import { everyAnswerHasAContract } from '../helpers/contract';

// Every JSON answer these tests read is parsed with its route's contract (shared/contracts).
everyAnswerHasAContract();

const MISSING = 2_147_000_000;
let ternId: number;
let episodeId: number;
let upgradeId: number;

beforeAll(async () => {
  testApp();
  ternId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  episodeId = (await Episode.findOne({ where: { buildId: ternId } }))!.id;
  upgradeId = (await Upgrade.findOne({ where: { buildId: ternId } }))!.id;
  expect(await Build.findByPk(MISSING)).toBeNull();
});

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';
/** Each route: method, path (under /api/builds/:b), a demo role with it and one without it (null: every role may). */
const ROUTES: [Method, string, DemoRole, DemoRole | null][] = [
  ['get', '/episodes', 'installer', null],
  ['post', '/episodes', 'producer', 'marketing'],
  ['patch', '/episodes/:e', 'producer', 'marketing'],
  ['delete', '/episodes/:e', 'producer', 'installer'],
  ['get', '/episodes/:e/chapters', 'marketing', 'installer'],
  ['put', '/episodes/:e/chapters', 'marketing', 'installer'],
  ['get', '/episodes/:e/show-notes', 'marketing', 'installer'],
  ['get', '/episodes/:e/readiness', 'marketing', 'installer'],
  ['post', '/episodes/:e/publish', 'marketing', 'installer'],
  ['get', '/plan', 'producer', 'installer'],
  ['get', '/plan/check', 'producer', 'marketing'],
  ['post', '/plan/proposal', 'producer', 'installer'],
  ['put', '/plan', 'producer', 'installer'],
  ['get', '/plan/revisions', 'producer', 'marketing'],
  ['post', '/plan/undo', 'producer', 'installer'],
  ['get', '/shop-floor', 'installer', 'marketing'],
  ['post', '/shop-floor/upgrades/:u/step-back', 'installer', 'marketing'],
  ['post', '/shop-floor/upgrades/:u/caution-read', 'installer', 'marketing'],
  ['get', '/calendar', 'producer', 'installer'],
  ['post', '/calendar/rotate', 'producer', 'marketing'],
  ['get', '/link-health', 'marketing', 'installer'],
  ['get', '/campaign', 'marketing', 'installer'],
  ['put', '/campaign', 'marketing', 'installer'],
  ['get', '/sales', 'marketing', 'installer'],
  ['get', '/sales/lines', 'marketing', 'installer'],
  ['get', '/sales/mapping', 'marketing', 'producer'],
  ['post', '/sales/import', 'marketing', 'producer'],
  ['get', '/slips', 'producer', 'installer'],
  ['get', '/notices', 'producer', 'marketing'],
  ['post', '/notices/seen', 'producer', 'installer'],
  ['get', '/events', 'installer', null],
];

const url = (path: string, buildId: number) =>
  `/api/builds/${buildId}${path.replace(':e', String(episodeId)).replace(':u', String(upgradeId))}`;

function call(agent: ReturnType<typeof anonymous>, method: Method, u: string) {
  return method === 'get' ? agent.get(u) : agent[method](u).send({});
}

describe('build-scoped routes of episodes, plan, shop floor, publishing, sales and slips', () => {
  it('answer an anonymous caller 401 for a build that exists and one that does not', async () => {
    const wrong: string[] = [];
    for (const [method, path] of ROUTES) {
      if (path === '/events') continue; // a stream: checked below with a time-out
      const known = await call(anonymous(), method, url(path, ternId));
      const unknown = await call(anonymous(), method, url(path, MISSING));
      if (known.status !== 401 || unknown.status !== 401 || JSON.stringify(known.body) !== JSON.stringify(unknown.body))
        wrong.push(`${method} ${path}: ${known.status}/${unknown.status}`);
    }
    expect(wrong).toEqual([]);
    expect((await anonymous().get(url('/events', MISSING))).status).toBe(401);
  });

  it('answer a person without the role 403 whether the build exists or not', async () => {
    const wrong: string[] = [];
    const agents = new Map<DemoRole, Awaited<ReturnType<typeof signInAs>>>();
    for (const [method, path, , without] of ROUTES) {
      if (!without) continue;
      if (!agents.has(without)) agents.set(without, await signInAs(without));
      const agent = agents.get(without)!;
      const known = await call(agent, method, url(path, ternId));
      const unknown = await call(agent, method, url(path, MISSING));
      if (known.status !== 403 || unknown.status !== 403)
        wrong.push(`${method} ${path} as ${without}: existing ${known.status}, missing ${unknown.status}`);
    }
    expect(wrong).toEqual([]);
  });

  it('answer a person with the role 404 naming the build when the build does not exist', async () => {
    const wrong: string[] = [];
    const agents = new Map<DemoRole, Awaited<ReturnType<typeof signInAs>>>();
    for (const [method, path, withRole] of ROUTES) {
      if (path === '/events') continue;
      if (!agents.has(withRole)) agents.set(withRole, await signInAs(withRole));
      const res = await call(agents.get(withRole)!, method, url(path, MISSING));
      if (res.status !== 404 || !/Build/.test(res.body.error?.message ?? ''))
        wrong.push(`${method} ${path} as ${withRole}: ${res.status}`);
    }
    expect(wrong).toEqual([]);
  });

  it('check the record is in the build before the body: a missing record with a bad body is 404, a record of the build is 400', async () => {
    const producer = await signInAs('producer');
    const marketing = await signInAs('marketing');
    const installer = await signInAs('installer');
    const cases: [Awaited<ReturnType<typeof signInAs>>, Method, string, object][] = [
      [producer, 'patch', '/episodes/:id', { title: 12 }],
      [marketing, 'put', '/episodes/:id/chapters', { chapters: 'none' }],
      [marketing, 'post', '/episodes/:id/publish', { videoUrl: 3 }],
      [installer, 'post', '/shop-floor/upgrades/:id/step-back', { mark: 'colour' }],
      [installer, 'post', '/shop-floor/upgrades/:id/caution-read', { extra: true }],
    ];
    for (const [agent, method, path, body] of cases) {
      const own = path.startsWith('/episodes') ? episodeId : upgradeId;
      const missing = await agent[method](`/api/builds/${ternId}${path.replace(':id', String(MISSING))}`).send(body);
      expect([path, missing.status]).toEqual([path, 404]);
      const bad = await agent[method](`/api/builds/${ternId}${path.replace(':id', String(own))}`).send(body);
      expect([path, bad.status]).toEqual([path, 400]);
    }
  });

  it('answer 404 for a record of no build on a read, before anything is looked up (chapters, show notes)', async () => {
    const marketing = await signInAs('marketing');
    for (const path of ['chapters', 'show-notes', 'readiness']) {
      const res = await marketing.get(`/api/builds/${ternId}/episodes/${MISSING}/${path}`);
      expect([path, res.status, res.body.error.message]).toEqual([path, 404, expect.stringMatching(/Episode/)]);
    }
  });
});
