// Vote stuffing (issue 11, "What was seen" 7): addresses are normalised before counting (case,
// surrounding spaces, "+tag" sub-addresses), one confirmed vote per person per request, and
// unconfirmed votes and requests are capped per request and per person.
import { describe, it, expect, beforeAll, vi } from 'vitest';

vi.hoisted(() => {
  // Many public writes from one test address; small caps so the test can reach them.
  process.env.PUBLIC_WRITE_RATE_LIMIT = '200';
  process.env.PENDING_VOTES_PER_REQUEST = '3';
  process.env.PENDING_VOTES_PER_ADDRESS = '4';
});

import { Op } from 'sequelize';
import { anonymous } from '../helpers/api';
import { mailsTo, linkIn } from '../helpers/mailbox';
import { Build, ViewerRequest, ViewerVote } from '../../server/models';
import { processDueMail } from '../../server/mail/worker';
import { emailHash, personOfEmail } from '../../server/services/viewerPrivacy';

const slug = 'project-tern';
let tern: Build;
const stamp = Date.now().toString(36);
beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug } }))!;
});
const openRequest = (title: string) =>
  ViewerRequest.create({ buildId: tern.id, title, details: null, confirmedAt: new Date() });
const vote = (requestId: number, email: string) =>
  anonymous().post(`/api/public/builds/${slug}/requests/${requestId}/votes`).send({ email });
const confirmed = (requestId: number) => ViewerVote.count({ where: { requestId, confirmedAt: { [Op.ne]: null } } });

async function confirmAllLinksTo(address: string) {
  await processDueMail();
  const mails = (await mailsTo(address)).filter(
    (m) => m.to === address || m.to.includes(`<${address}>`) || m.to.split(', ').includes(address),
  );
  let ok = 0;
  for (const m of mails) {
    const token = linkIn(m, '/confirm/').split('/confirm/')[1]!;
    if ((await anonymous().get(`/api/public/confirm/${token}`)).status === 200) ok++;
  }
  return ok;
}

describe('one person, one vote', () => {
  it('names the same person whatever the case, spaces or +tag', () => {
    // Worked out by hand from the rule: lower case, trimmed, the part after "+" dropped.
    expect(personOfEmail('  Kit.M+1@Example.TEST ')).toBe('kit.m@example.test');
    expect(personOfEmail('kit.m@example.test')).toBe('kit.m@example.test');
    expect(emailHash('Kit.M+tern@example.test')).toBe(emailHash('kit.m@example.test'));
    expect(emailHash('kit.n@example.test')).not.toBe(emailHash('kit.m@example.test'));
  });

  it('six votes from name+1 … name+6 count once', async () => {
    const req = await openRequest('Roof-mounted work lights');
    const base = `stuffer${stamp}`;
    const answers = [];
    for (let i = 1; i <= 6; i++) answers.push((await vote(req.id, `${base}+${i}@example.test`)).status);
    // The sixth is over the per-person mail limit (five an hour): it is the same person.
    expect(answers.slice(0, 5)).toEqual([202, 202, 202, 202, 202]);
    let confirmedLinks = 0;
    for (let i = 1; i <= 6; i++) confirmedLinks += await confirmAllLinksTo(`${base}+${i}@example.test`);
    expect(confirmedLinks).toBeGreaterThanOrEqual(1); // every link that was sent was opened
    expect(await confirmed(req.id)).toBe(1);
  });

  it('a vote in capitals with spaces around it is the same person as the one already counted', async () => {
    const req = await openRequest('Bed liner');
    const address = `lower${stamp}@example.test`;
    await vote(req.id, address);
    expect(await confirmAllLinksTo(address)).toBe(1);
    await vote(req.id, `  ${address.toUpperCase()}  `);
    expect(await ViewerVote.count({ where: { requestId: req.id } })).toBe(1);
    expect(await confirmed(req.id)).toBe(1);
  });
});

describe('caps on unconfirmed votes and requests', () => {
  it('at most PENDING_VOTES_PER_REQUEST unconfirmed votes wait on one request', async () => {
    const req = await openRequest('Snorkel');
    for (let i = 0; i < 5; i++) expect((await vote(req.id, `cap${i}-${stamp}@example.test`)).status).toBe(202);
    expect(await ViewerVote.count({ where: { requestId: req.id, confirmedAt: null } })).toBe(3);
  });

  it('one person holds at most PENDING_VOTES_PER_ADDRESS unconfirmed votes and new requests', async () => {
    const address = `busy${stamp}@example.test`;
    const before = await ViewerRequest.count({ where: { buildId: tern.id } });
    for (let i = 0; i < 6; i++) {
      const res = await anonymous()
        .post(`/api/public/builds/${slug}/requests`)
        .send({ title: `Idea number ${i} from one person`, email: i % 2 ? address : address.replace('@', `+${i}@`) });
      expect([202, 429]).toContain(res.status);
    }
    expect(await ViewerVote.count({ where: { emailHash: emailHash(address), confirmedAt: null } })).toBe(4);
    expect((await ViewerRequest.count({ where: { buildId: tern.id } })) - before).toBe(4);
  });
});

describe('the database holds the rule too', () => {
  it('refuses a second confirmed vote of one person on one request', async () => {
    const req = await openRequest('Second confirmed vote');
    const row = {
      requestId: req.id,
      emailHash: emailHash(`twice${stamp}@example.test`),
      emailSealed: null,
      email: null,
      name: null,
      expiresAt: new Date(Date.now() + 3_600_000),
      confirmedAt: new Date(),
    };
    const { newToken } = await import('../../server/services/viewerPrivacy');
    await ViewerVote.create({ ...row, confirmTokenHash: newToken().hash });
    await expect(ViewerVote.create({ ...row, confirmTokenHash: newToken().hash })).rejects.toThrow();
    expect(await confirmed(req.id)).toBe(1);
  });
});
