// The public build page at audience scale (issue 10): the answer is cached in the server until
// its build changes, sent with public caching headers and an ETag that answers 304.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, signInAs } from '../helpers/api';
import { sequelize, Build, Upgrade, ViewerRequest, ViewerVote } from '../../server/models';
import { emailHash, newToken } from '../../server/services/viewerPrivacy';

const URL_ = '/api/public/builds/project-tern';
let tern: Build;

/** Waits (at most 2.5 s) for the change notice of a commit to reach the cache. */
async function until(check: () => Promise<boolean>) {
  for (let i = 0; i < 50; i++) {
    if (await check()) return true;
    await new Promise((r) => setTimeout(r, 50));
  }
  return false;
}
/** A second request once the first put the answer in the cache. */
async function cachedAnswer() {
  await anonymous().get(URL_);
  let last = await anonymous().get(URL_);
  await until(async () => (last = await anonymous().get(URL_)).headers['x-public-cache'] === 'hit');
  expect(last.headers['x-public-cache']).toBe('hit');
  return last;
}

beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
});

describe('the public build answer', () => {
  it('is served from the cache with public caching headers, and a repeat with its ETag gets 304', async () => {
    const res = await cachedAnswer();
    expect(res.status).toBe(200);
    expect(res.headers['x-public-cache']).toBe('hit');
    // 30 s and 60 s are the defaults of PUBLIC_MAX_AGE_SECONDS and PUBLIC_STALE_SECONDS.
    expect(res.headers['cache-control']).toBe('public, max-age=30, stale-while-revalidate=60');
    expect(res.headers.etag).toMatch(/^W\/"/);
    expect(res.body.build.slug).toBe('project-tern');
    const again = await anonymous().get(URL_).set('If-None-Match', res.headers.etag);
    expect(again.status).toBe(304);
    expect(again.text).toBe('');
    const zipped = await anonymous().get(URL_).set('Accept-Encoding', 'gzip');
    expect(zipped.headers['content-encoding']).toBe('gzip');
    expect(zipped.body).toEqual(res.body);
  });

  it('drops the copy when an upgrade of the build changes', async () => {
    const before = await cachedAnswer();
    const u = (await Upgrade.findOne({ where: { buildId: tern.id }, order: [['id', 'ASC']] }))!;
    await sequelize.query('UPDATE upgrades SET title = :t WHERE id = :id', {
      replacements: { t: 'Renamed for the cache test', id: u.id },
    });
    const titles = (body: { areas: { upgrades: { title: string }[] }[] }) =>
      body.areas.flatMap((a) => a.upgrades.map((x) => x.title));
    expect(titles(before.body)).not.toContain('Renamed for the cache test');
    expect(
      await until(async () => titles((await anonymous().get(URL_)).body).includes('Renamed for the cache test')),
    ).toBe(true);
    const after = await cachedAnswer();
    expect(after.headers.etag).not.toBe(before.headers.etag);
    // The old ETag no longer matches: the client gets the new page.
    expect((await anonymous().get(URL_).set('If-None-Match', before.headers.etag)).status).toBe(200);
  });

  it('drops the copy when a vote is confirmed', async () => {
    const r = await ViewerRequest.create({
      buildId: tern.id,
      title: 'Cache test request',
      details: null,
      confirmedAt: new Date(),
    });
    const votesOf = (body: { requests: { id: number; votes: number }[] }) =>
      body.requests.find((x) => x.id === r.id)?.votes ?? 0;
    expect(
      await until(
        async () =>
          votesOf((await anonymous().get(URL_)).body) === 0 &&
          !!(await anonymous().get(URL_)).body.requests.find((x: { id: number }) => x.id === r.id),
      ),
    ).toBe(true);
    await cachedAnswer();
    await ViewerVote.create({
      requestId: r.id,
      emailHash: emailHash('cache-voter@viewers.test'),
      emailSealed: null,
      email: 'cache-voter@viewers.test',
      name: null,
      confirmTokenHash: newToken().hash,
      expiresAt: new Date(),
      confirmedAt: new Date(),
    });
    expect(await until(async () => votesOf((await anonymous().get(URL_)).body) === 1)).toBe(true);
  });

  it('a signed-in person gets no-store even for the public page', async () => {
    const res = await (await signInAs('marketing')).get(URL_);
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toBe('no-store');
  });
});
