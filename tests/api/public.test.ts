// The public build API (routes/public.ts): what a viewer sees (and never sees), requests and
// votes with double opt-in by e-mail, no enumeration, honeypot, bad input, rate limits, unsubscribe.
import { describe, it, expect, beforeAll, vi } from 'vitest';

// This file sends many public writes from one address; the per-address limit is tested last.
vi.hoisted(() => {
  process.env.PUBLIC_WRITE_RATE_LIMIT = '80';
});

import { anonymous } from '../helpers/api';
import { counts } from '../helpers/db';
import { mailsTo, linkIn, uniqueAddress } from '../helpers/mailbox';
import { sequelize, Build, Upgrade, ViewerRequest, ViewerVote, MailOutbox, Unsubscribe } from '../../server/models';
import { processDueMail } from '../../server/mail/worker';
import { emailHash, unsubscribeToken } from '../../server/services/viewerPrivacy';
import { fieldWords } from '../../shared/schemas/errorMap';
import { DEMO_USERS } from '../../server/db/seeders/0001-demo-users';
import { everyAnswerHasAContract } from '../helpers/contract';

everyAnswerHasAContract();

const TABLES = ['viewer_requests', 'viewer_votes', 'mail_outbox', 'unsubscribes'];
const slug = 'project-tern';
let tern: Build;

beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug } }))!;
});

async function confirmLinkFor(address: string) {
  await processDueMail();
  const mails = await mailsTo(address);
  const token = linkIn(mails.at(-1)!, '/confirm/').split('/confirm/')[1]!;
  return token;
}

async function openRequest(title: string) {
  const r = await ViewerRequest.create({ buildId: tern.id, title, details: null, confirmedAt: new Date() });
  return r;
}

describe('GET /api/public/builds/:slug', () => {
  it('shows the vehicle, upgrades by area, live episodes, cautions and open requests with their votes', async () => {
    const res = await anonymous().get(`/api/public/builds/${slug}`);
    expect(res.status).toBe(200);
    expect(res.body.build).toMatchObject({
      slug,
      title: 'Project Tern',
      vehicle: { year: 2019, make: 'Halvorsen', model: 'Tern' },
    });
    const all = res.body.areas.flatMap((a: { upgrades: unknown[] }) => a.upgrades);
    expect(all.length).toBe(await Upgrade.count({ where: { buildId: tern.id } }));
    expect(
      res.body.counts.planned + res.body.counts.inProgress + res.body.counts.comingSoon + res.body.counts.done,
    ).toBe(all.length);
    expect(res.body.counts.done).toBeGreaterThan(0);
    expect(res.body.episodes.length).toBeGreaterThan(0);
    for (const e of res.body.episodes) expect(e.videoUrl).toMatch(/^https?:\/\//);
    expect(res.body.cautions.length).toBeGreaterThan(0);
    expect(res.body.cautions[0].caution).toContain("vehicle maker's service information");
    const votes = res.body.requests.map((r: { votes: number }) => r.votes);
    expect(votes).toEqual([...votes].sort((a, b) => b - a));
    expect(res.body.requests[0]).toMatchObject({
      title: 'Heated steering wheel before winter',
      votes: 4,
      state: 'accepted',
      upgrade: 'Heated steering wheel',
    });
  });

  it('carries no money, no people and no internal notes anywhere in the JSON', async () => {
    const res = await anonymous().get(`/api/public/builds/${slug}`);
    const keys = new Set<string>();
    const walk = (v: unknown) => {
      if (Array.isArray(v)) v.forEach(walk);
      else if (v && typeof v === 'object')
        for (const [k, x] of Object.entries(v)) {
          keys.add(k);
          walk(x);
        }
    };
    walk(res.body);
    const forbidden = [...keys].filter(
      (k) =>
        /cents$/i.test(k) ||
        /price|cost|budget|rate|value|supplier|notes?$|email|name|person|user|vin|mileage|token|reason|hours/i.test(k),
    );
    expect(forbidden).toEqual([]);
    const text = JSON.stringify(res.body);
    for (const u of DEMO_USERS) {
      expect(text).not.toContain(u.name);
      expect(text).not.toContain(u.email);
    }
    expect(text).not.toContain('@viewers.test');
    expect(text).not.toContain('Dana P.');
    const withNotes = await Upgrade.findOne({
      where: { buildId: tern.id, notes: { [(await import('sequelize')).Op.ne]: null } },
    });
    if (withNotes?.notes) expect(text).not.toContain(withNotes.notes);
    expect(text).not.toContain(tern.vin!);
  });

  it('answers 404 for a build that is not public, and for an unknown one, alike', async () => {
    await Build.create({
      slug: 'private-build',
      name: 'Private',
      year: 2020,
      make: 'Halvorsen',
      model: 'Skua',
      vin: null,
      mileage: null,
      budgetCents: 1,
      labourRateCents: 1,
      campaign: null,
      summary: null,
    });
    const a = await anonymous().get('/api/public/builds/private-build');
    const b = await anonymous().get('/api/public/builds/no-such-build');
    expect(a.status).toBe(404);
    expect(b.status).toBe(404);
    expect(a.body).toEqual(b.body);
  });
});

describe('requests and votes, confirmed by e-mail', () => {
  it('a request is kept hidden and the address is not stored until the link is opened', async () => {
    const email = uniqueAddress('asker');
    const res = await anonymous()
      .post(`/api/public/builds/${slug}/requests`)
      .send({ title: 'Illuminated door sills', details: 'Like the top trim.', name: 'Rae', email, website: '' });
    expect(res.status).toBe(202);
    expect(res.body.ok).toBe(true);
    const req = (await ViewerRequest.findOne({ where: { buildId: tern.id, title: 'Illuminated door sills' } }))!;
    expect(req.confirmedAt).toBeNull();
    const vote = (await ViewerVote.findOne({ where: { requestId: req.id } }))!;
    expect(vote).toMatchObject({ email: null, confirmedAt: null, emailHash: emailHash(email) });
    expect(vote.emailSealed).not.toContain(email.split('@')[0]);
    // The address lives only in the queued mail.
    const [hits] = await sequelize.query(
      `SELECT count(*)::int AS n FROM viewer_votes v JOIN viewer_requests r ON r.id = v.request_id WHERE row_to_json(v)::text LIKE :p OR row_to_json(r)::text LIKE :p`,
      { replacements: { p: `%${email}%` } },
    );
    expect((hits as { n: number }[])[0]!.n).toBe(0);
    expect(await MailOutbox.count({ where: { toAddress: email, kind: 'vote_confirm' } })).toBe(1);
    const page = await anonymous().get(`/api/public/builds/${slug}`);
    expect(page.body.requests.map((r: { title: string }) => r.title)).not.toContain('Illuminated door sills');

    const token = await confirmLinkFor(email);
    // Once sent, the queued copy (address and link) is blanked.
    expect(await MailOutbox.count({ where: { toAddress: email } })).toBe(0);
    const ok = await anonymous().get(`/api/public/confirm/${token}`);
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ ok: true, request: { title: 'Illuminated door sills' }, build: { slug } });
    await vote.reload();
    expect(vote.email).toBe(email);
    expect(vote.emailSealed).toBeNull();
    expect(vote.confirmedAt).toBeInstanceOf(Date);
    const after = await anonymous().get(`/api/public/builds/${slug}`);
    expect(after.body.requests.find((r: { title: string }) => r.title === 'Illuminated door sills')).toMatchObject({
      votes: 1,
      state: 'new',
    });
  });

  it('a confirmation link used twice is refused the second time and counts once', async () => {
    const req = await openRequest('Second-row sunshades');
    const email = uniqueAddress('twice');
    expect((await anonymous().post(`/api/public/builds/${slug}/requests/${req.id}/votes`).send({ email })).status).toBe(
      202,
    );
    const token = await confirmLinkFor(email);
    expect((await anonymous().get(`/api/public/confirm/${token}`)).status).toBe(200);
    const before = await counts(...TABLES);
    const again = await anonymous().get(`/api/public/confirm/${token}`);
    expect(again.status).toBe(410);
    expect(again.body.error).toMatchObject({ code: 'link_used' });
    expect(again.body.error.message).toMatch(/already used/);
    expect(await counts(...TABLES)).toEqual(before);
    expect(
      await ViewerVote.count({
        where: { requestId: req.id, confirmedAt: { [(await import('sequelize')).Op.ne]: null } },
      }),
    ).toBe(1);
  });

  it('an expired confirmation link is refused and confirms nothing', async () => {
    const req = await openRequest('Heated rear seats');
    const email = uniqueAddress('late');
    await anonymous().post(`/api/public/builds/${slug}/requests/${req.id}/votes`).send({ email });
    const token = await confirmLinkFor(email);
    await sequelize.query(`UPDATE viewer_votes SET expires_at = now() - interval '1 minute' WHERE request_id = :id`, {
      replacements: { id: req.id },
    });
    const res = await anonymous().get(`/api/public/confirm/${token}`);
    expect(res.status).toBe(410);
    expect(res.body.error.code).toBe('link_expired');
    expect(res.body.error.message).toMatch(/expired/);
    expect(await ViewerVote.count({ where: { requestId: req.id, email: email } })).toBe(0);
    expect(
      await ViewerVote.count({
        where: { requestId: req.id, confirmedAt: { [(await import('sequelize')).Op.ne]: null } },
      }),
    ).toBe(0);
  });

  it('an unknown confirmation link answers 404', async () => {
    const res = await anonymous().get('/api/public/confirm/abcdefghijklmnopqrstuvwxyz0123456789ABCDEFG');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('invalid_link');
  });

  it('answers the same whether or not the address already voted, and sends nothing to an address already counted', async () => {
    const seeded = (await ViewerRequest.findOne({
      where: { buildId: tern.id, title: 'Heated steering wheel before winter' },
    }))!;
    const fresh = await anonymous()
      .post(`/api/public/builds/${slug}/requests/${seeded.id}/votes`)
      .send({ email: uniqueAddress('fresh') });
    const before = await counts('viewer_votes', 'mail_outbox');
    const known = await anonymous()
      .post(`/api/public/builds/${slug}/requests/${seeded.id}/votes`)
      .send({ email: 'Dana.P@viewers.test' });
    expect(known.status).toBe(fresh.status);
    expect(known.body).toEqual(fresh.body);
    expect(await counts('viewer_votes', 'mail_outbox')).toEqual(before);
  });

  it('counts a person once per request even with two confirmation links', async () => {
    const req = await openRequest('Cargo cover');
    const email = uniqueAddress('double');
    await anonymous().post(`/api/public/builds/${slug}/requests/${req.id}/votes`).send({ email });
    await anonymous().post(`/api/public/builds/${slug}/requests/${req.id}/votes`).send({ email: email.toUpperCase() });
    await processDueMail();
    const tokens = (await mailsTo(email)).map((m) => linkIn(m, '/confirm/').split('/confirm/')[1]!);
    expect(tokens).toHaveLength(2);
    for (const t of tokens) expect((await anonymous().get(`/api/public/confirm/${t}`)).status).toBe(200);
    expect(await ViewerVote.count({ where: { requestId: req.id } })).toBe(1);
  });

  it('a filled honeypot answers like a success and writes nothing', async () => {
    const before = await counts(...TABLES);
    const res = await anonymous()
      .post(`/api/public/builds/${slug}/requests`)
      .send({ title: 'Cheap watches', email: uniqueAddress('bot'), website: 'http://spam.example' });
    expect(res.status).toBe(202);
    expect(res.body.ok).toBe(true);
    const req = await openRequest('Honeypot target');
    const before2 = await counts(...TABLES);
    const vote = await anonymous()
      .post(`/api/public/builds/${slug}/requests/${req.id}/votes`)
      .send({ email: uniqueAddress('bot'), website: 'x' });
    expect(vote.status).toBe(202);
    expect(await counts(...TABLES)).toEqual(before2);
    expect(before2.viewer_requests).toBe(before.viewer_requests + 1);
  });
});

describe('bad input writes nothing', () => {
  const bad: [string, Record<string, unknown>, string][] = [
    ['a malformed e-mail', { title: 'Roof box', email: 'not-an-address' }, 'email'],
    ['a missing e-mail', { title: 'Roof box' }, 'email'],
    ['an over-long title', { title: 'x'.repeat(141), email: 'a@viewers.test' }, 'title'],
    ['a too-short title', { title: 'ab', email: 'a@viewers.test' }, 'title'],
    ['over-long details', { title: 'Roof box', details: 'y'.repeat(2001), email: 'a@viewers.test' }, 'details'],
    ['an over-long name', { title: 'Roof box', name: 'n'.repeat(81), email: 'a@viewers.test' }, 'name'],
    ['an unknown field', { title: 'Roof box', email: 'a@viewers.test', admin: true }, 'admin'],
  ];
  for (const [label, body, field] of bad) {
    it(`a request with ${label} answers 400 naming ${field}`, async () => {
      const before = await counts(...TABLES);
      const res = await anonymous().post(`/api/public/builds/${slug}/requests`).send(body);
      expect(res.status).toBe(400);
      expect(res.body.error.fields.map((f: { path: string }) => f.path).join(' ')).toContain(field);
      // The message names the field in words (issue 11): "E-mail: must be an e-mail address".
      // An unknown field is named as sent: "This form: is not something this form takes (admin)".
      expect(res.body.error.message).toMatch(new RegExp(`${fieldWords(field)}:|\\(${field}\\)`));
      expect(await counts(...TABLES)).toEqual(before);
    });
  }

  it('a vote with a malformed e-mail answers 400', async () => {
    const req = await openRequest('Roof box');
    const before = await counts(...TABLES);
    const res = await anonymous()
      .post(`/api/public/builds/${slug}/requests/${req.id}/votes`)
      .send({ email: 'someone@' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('email');
    expect(await counts(...TABLES)).toEqual(before);
  });

  it("a vote on a request of a build that is not public answers 404 — through either build's address", async () => {
    const hidden = await Build.create({
      slug: 'hidden-build',
      name: 'Hidden',
      year: 2021,
      make: 'Halvorsen',
      model: 'Skua',
      vin: null,
      mileage: null,
      budgetCents: 1,
      labourRateCents: 1,
      campaign: null,
      summary: null,
    });
    const req = await ViewerRequest.create({
      buildId: hidden.id,
      title: 'Hidden request',
      details: null,
      confirmedAt: new Date(),
    });
    const before = await counts(...TABLES);
    const direct = await anonymous()
      .post(`/api/public/builds/hidden-build/requests/${req.id}/votes`)
      .send({ email: uniqueAddress('h') });
    const through = await anonymous()
      .post(`/api/public/builds/${slug}/requests/${req.id}/votes`)
      .send({ email: uniqueAddress('h') });
    const newReq = await anonymous()
      .post('/api/public/builds/hidden-build/requests')
      .send({ title: 'Anything', email: uniqueAddress('h') });
    expect([direct.status, through.status, newReq.status]).toEqual([404, 404, 404]);
    expect(await counts(...TABLES)).toEqual(before);
  });

  it('a vote on a declined request is refused; a vote on a merged one goes to its target', async () => {
    const target = await openRequest('Merge target');
    const merged = await ViewerRequest.create({
      buildId: tern.id,
      title: 'Merged away',
      details: null,
      confirmedAt: new Date(),
      state: 'merged',
      mergedIntoId: target.id,
    });
    const declined = await ViewerRequest.create({
      buildId: tern.id,
      title: 'Declined one',
      details: null,
      confirmedAt: new Date(),
      state: 'declined',
      declineReason: 'Not a factory part',
    });
    const before = await counts(...TABLES);
    const no = await anonymous()
      .post(`/api/public/builds/${slug}/requests/${declined.id}/votes`)
      .send({ email: uniqueAddress('d') });
    expect(no.status).toBe(409);
    expect(no.body.error.code).toBe('voting_closed');
    expect(await counts(...TABLES)).toEqual(before);
    const yes = await anonymous()
      .post(`/api/public/builds/${slug}/requests/${merged.id}/votes`)
      .send({ email: uniqueAddress('m') });
    expect(yes.status).toBe(202);
    expect(await ViewerVote.count({ where: { requestId: target.id } })).toBe(1);
    expect(await ViewerVote.count({ where: { requestId: merged.id } })).toBe(0);
  });
});

describe('unsubscribe and rate limits', () => {
  it('an unsubscribe link works without sign-in and forgets the address', async () => {
    const address = 'ole.k@viewers.test';
    const hash = emailHash(address);
    expect(await ViewerVote.count({ where: { email: address } })).toBeGreaterThan(0);
    const res = await anonymous().get(`/api/public/unsubscribe/${unsubscribeToken(hash)}`);
    expect(res.status).toBe(200);
    expect(await Unsubscribe.count({ where: { emailHash: hash } })).toBe(1);
    expect(await ViewerVote.count({ where: { email: address } })).toBe(0);
    // Votes still count.
    expect(await ViewerVote.count({ where: { emailHash: hash } })).toBeGreaterThan(0);
    expect((await anonymous().get(`/api/public/unsubscribe/${unsubscribeToken(hash)}`)).status).toBe(200);
    expect(await Unsubscribe.count({ where: { emailHash: hash } })).toBe(1);
  });

  it('a forged unsubscribe link answers 404 and writes nothing', async () => {
    const before = await counts(...TABLES);
    const forged = `${emailHash('someone@viewers.test')}.${'0'.repeat(32)}`;
    expect((await anonymous().get(`/api/public/unsubscribe/${forged}`)).status).toBe(404);
    expect(await counts(...TABLES)).toEqual(before);
  });

  it('limits mail per e-mail address', async () => {
    const req = await openRequest('Per-address limit');
    const email = uniqueAddress('flood');
    const statuses: number[] = [];
    for (let i = 0; i < 7; i++)
      statuses.push(
        (await anonymous().post(`/api/public/builds/${slug}/requests/${req.id}/votes`).send({ email })).status,
      );
    expect(statuses.slice(0, 5)).toEqual([202, 202, 202, 202, 202]);
    expect(statuses.slice(5)).toEqual([429, 429]);
    // The answers stay the same, but one person gets at most two links for one request (issue 11).
    expect(await MailOutbox.count({ where: { toAddress: email } })).toBe(2);
    // Another address is not held back.
    expect(
      (
        await anonymous()
          .post(`/api/public/builds/${slug}/requests/${req.id}/votes`)
          .send({ email: uniqueAddress('other') })
      ).status,
    ).toBe(202);
  });

  it('limits public writes per network address', async () => {
    let status = 0;
    for (let i = 0; i < 90 && status !== 429; i++)
      status = (await anonymous().post(`/api/public/builds/${slug}/requests`).send({})).status;
    expect(status).toBe(429);
  });
});

describe('unconfirmed votes are forgotten', () => {
  it('the worker drops pending votes a day past their expiry, and requests nobody confirmed', async () => {
    const { pruneUnconfirmed } = await import('../../server/mail/worker');
    // (Created directly: this file has used up its per-address write limit by now.)
    const req = await ViewerRequest.create({ buildId: tern.id, title: 'Never confirmed wish', details: null });
    await ViewerVote.create({
      requestId: req.id,
      emailHash: emailHash(uniqueAddress('never')),
      emailSealed: 'sealed',
      name: null,
      confirmTokenHash: 'f'.repeat(64),
      expiresAt: new Date(Date.now() + 3_600_000),
    });
    const kept = await openRequest('Confirmed and kept');
    await pruneUnconfirmed();
    expect(await ViewerVote.count({ where: { requestId: req.id } })).toBe(1);
    await sequelize.query(`UPDATE viewer_votes SET expires_at = now() - interval '2 days' WHERE request_id = :id`, {
      replacements: { id: req.id },
    });
    await sequelize.query(`UPDATE viewer_requests SET created_at = now() - interval '3 days' WHERE id IN (:ids)`, {
      replacements: { ids: [req.id, kept.id] },
    });
    await pruneUnconfirmed();
    expect(await ViewerVote.count({ where: { requestId: req.id } })).toBe(0);
    expect(await ViewerRequest.count({ where: { id: req.id } })).toBe(0);
    expect(await ViewerRequest.count({ where: { id: kept.id } })).toBe(1);
  });
});

describe('the public page’s dates are the shop’s', () => {
  it('an episode published at 23:30 in the build’s zone shows that day, not the next day in UTC', async () => {
    // 2026-03-15 05:30 UTC is 2026-03-14 23:30 in America/Denver (MDT, UTC−6, from 2026-03-08).
    const [[live]] = (await sequelize.query(
      `SELECT id, number FROM episodes WHERE build_id = $1 AND state = 'live' ORDER BY number LIMIT 1`,
      { bind: [tern.id] },
    )) as [Array<{ id: number; number: number }>, unknown];
    await sequelize.query(`UPDATE episodes SET published_at = '2026-03-15T05:30:00Z' WHERE id = $1`, {
      bind: [live.id],
    });
    expect(tern.timeZone).toBe('America/Denver');
    let shown: string | null | undefined;
    for (let i = 0; i < 40; i++) {
      const res = await anonymous().get(`/api/public/builds/${slug}`);
      shown = res.body.episodes.find((e: { number: number }) => e.number === live.number)?.publishedOn;
      if (shown === '2026-03-14' || shown === '2026-03-15') break;
      await new Promise((r) => setTimeout(r, 50));
    }
    expect(shown).toBe('2026-03-14');
  });
});
