// The public side of viewer requests: asking, voting, confirming by e-mail, unsubscribing.
// Every answer to "request" and "vote" is the same whatever the address did before, so the API
// never tells whether an address has voted; the address is kept only once the vote is confirmed.
import { Op } from 'sequelize';
import { sequelize, Build, ViewerRequest, ViewerVote, Unsubscribe } from '../models';
import { AppError, notFound } from '../errors';
import { config } from '../config';
import { enqueueMail } from '../mail/outbox';
import { confirmVoteMail } from '../mail/templates';
import { emailHash, newToken, readUnsubscribeToken, sealEmail, tokenHash, unsealEmail } from './viewerPrivacy';
import { publicBuildBySlug } from './publicBuild';
import type { PublicRequestInput, PublicVoteInput } from '../../shared/schemas/viewerRequest';
import type { Transaction } from 'sequelize';

/** What every request and vote answers, whatever happened. */
export const ACCEPTED_ANSWER = {
  ok: true,
  message:
    'Thanks! If this address can vote for it, a confirmation mail is on its way. Your vote counts once you open its link.',
} as const;

/** Unconfirmed links one person may hold for one request (a lost mail can be sent once more). */
const PENDING_PER_PERSON_PER_REQUEST = 2;

const pendingWhere = () => ({ confirmedAt: null, expiresAt: { [Op.gt]: new Date() } });

/** Whether one more unconfirmed vote is allowed: per request, per person, per person on this request. */
async function underPendingCaps(t: Transaction, requestId: number, hash: string) {
  const [forRequest, forPerson, forBoth] = await Promise.all([
    ViewerVote.count({ where: { requestId, ...pendingWhere() }, transaction: t }),
    ViewerVote.count({ where: { emailHash: hash, ...pendingWhere() }, transaction: t }),
    ViewerVote.count({ where: { requestId, emailHash: hash, ...pendingWhere() }, transaction: t }),
  ]);
  return (
    forRequest < config().PENDING_VOTES_PER_REQUEST &&
    forPerson < config().PENDING_VOTES_PER_ADDRESS &&
    forBoth < PENDING_PER_PERSON_PER_REQUEST
  );
}

/** Serialises votes of one person, so two parallel votes cannot both pass the caps. */
async function lockPerson(t: Transaction, hash: string) {
  await sequelize.query('SELECT pg_advisory_xact_lock(hashtext(:key))', {
    replacements: { key: `vote:${hash}` },
    transaction: t,
  });
}

async function pendingVote(
  t: Transaction,
  build: Build,
  request: ViewerRequest,
  who: { email: string; name: string | null },
  isNewRequest: boolean,
) {
  const hash = emailHash(who.email);
  const counted = await ViewerVote.count({
    where: { requestId: request.id, emailHash: hash, confirmedAt: { [Op.ne]: null } },
    transaction: t,
  });
  if (counted) return; // already counted: nothing to send, same answer
  if (!(await underPendingCaps(t, request.id, hash))) return; // enough links out already: same answer
  const { token, hash: confirmTokenHash } = newToken();
  const hours = config().CONFIRM_LINK_HOURS;
  await ViewerVote.create(
    {
      requestId: request.id,
      emailHash: hash,
      emailSealed: sealEmail(who.email, token),
      name: who.name,
      confirmTokenHash,
      expiresAt: new Date(Date.now() + hours * 3_600_000),
    },
    { transaction: t },
  );
  const mail = confirmVoteMail({
    buildName: build.name,
    requestTitle: request.title,
    link: `${config().publicUrl}/confirm/${token}`,
    hours,
    isNewRequest,
  });
  await enqueueMail(t, {
    kind: 'vote_confirm',
    to: who.email,
    subject: mail.subject,
    text: mail.text,
    scrubAfterSend: true,
  });
}

export async function createRequest(slug: string, input: PublicRequestInput) {
  const build = await publicBuildBySlug(slug);
  if (input.website) return ACCEPTED_ANSWER; // honeypot filled: a bot; write nothing
  await sequelize.transaction(async (t) => {
    const hash = emailHash(input.email);
    await lockPerson(t, hash);
    // A person with as many unconfirmed links out as allowed adds no new unconfirmed request.
    if (!(await underPendingCaps(t, 0, hash))) return;
    const request = await ViewerRequest.create(
      { buildId: build.id, title: input.title, details: input.details ?? null },
      { transaction: t },
    );
    await pendingVote(t, build, request, { email: input.email, name: input.name ?? null }, true);
  });
  return ACCEPTED_ANSWER;
}

export async function addVote(slug: string, requestId: number, input: PublicVoteInput) {
  const build = await publicBuildBySlug(slug);
  const found = await ViewerRequest.findOne({
    where: { id: requestId, buildId: build.id, confirmedAt: { [Op.ne]: null } },
  });
  if (!found) throw notFound('Request');
  let request: ViewerRequest = found;
  // A merged request passes its votes on to the one it was merged into.
  for (let hops = 0; request.state === 'merged' && request.mergedIntoId && hops < 10; hops++) {
    const next: ViewerRequest | null = await ViewerRequest.findOne({
      where: { id: request.mergedIntoId, buildId: build.id },
    });
    if (!next) break;
    request = next;
  }
  if (request.state !== 'new' && request.state !== 'accepted') {
    throw new AppError(409, 'voting_closed', 'This request is closed, so it takes no more votes.');
  }
  if (input.website) return ACCEPTED_ANSWER;
  await sequelize.transaction(async (t) => {
    await lockPerson(t, emailHash(input.email));
    await pendingVote(t, build, request, { email: input.email, name: input.name ?? null }, false);
  });
  return ACCEPTED_ANSWER;
}

/** Confirms the vote a link names: once, before it expires. */
export async function confirmVote(token: string) {
  return sequelize.transaction(async (t) => {
    const vote = await ViewerVote.findOne({
      where: { confirmTokenHash: tokenHash(token) },
      transaction: t,
      lock: t.LOCK.UPDATE,
    });
    if (!vote) throw new AppError(404, 'invalid_link', 'This confirmation link is not valid, or it was already used.');
    if (vote.confirmedAt)
      throw new AppError(410, 'link_used', 'This confirmation link was already used; the vote is counted.');
    if (vote.expiresAt.getTime() < Date.now())
      throw new AppError(
        410,
        'link_expired',
        'This confirmation link has expired. Vote again on the build page to get a new one.',
      );
    const email = vote.emailSealed ? unsealEmail(vote.emailSealed, token) : null;
    if (!email) throw new AppError(404, 'invalid_link', 'This confirmation link is not valid, or it was already used.');
    const request = await ViewerRequest.findByPk(vote.requestId, { transaction: t, lock: t.LOCK.UPDATE });
    if (!request)
      throw new AppError(404, 'invalid_link', 'This confirmation link is not valid, or it was already used.');
    const build = await Build.findByPk(request.buildId, { transaction: t });
    const already = await ViewerVote.count({
      where: { requestId: request.id, emailHash: vote.emailHash, confirmedAt: { [Op.ne]: null } },
      transaction: t,
    });
    if (already) {
      // A second pending vote of a person already counted (e.g. after a merge): count once.
      await vote.destroy({ transaction: t });
    } else {
      const unsubscribed = await Unsubscribe.count({ where: { emailHash: vote.emailHash }, transaction: t });
      await vote.update(
        { confirmedAt: new Date(), email: unsubscribed ? null : email, emailSealed: null },
        { transaction: t },
      );
      if (!request.confirmedAt) await request.update({ confirmedAt: new Date() }, { transaction: t });
    }
    return {
      ok: true as const,
      request: { id: request.id, title: request.title },
      build: build ? { slug: build.slug, title: build.name } : null,
    };
  });
}

/** Stops "it is live" mail to the address the token names, and forgets the address itself. */
export async function unsubscribe(token: string) {
  const hash = readUnsubscribeToken(token);
  if (!hash) throw new AppError(404, 'invalid_link', 'This unsubscribe link is not valid.');
  await sequelize.transaction(async (t) => {
    await sequelize.query('INSERT INTO unsubscribes (email_hash) VALUES (:hash) ON CONFLICT DO NOTHING', {
      replacements: { hash },
      transaction: t,
    });
    // Votes stay counted (by their hash); the address is no longer needed.
    await sequelize.query('UPDATE viewer_votes SET email = NULL WHERE email_hash = :hash', {
      replacements: { hash },
      transaction: t,
    });
  });
  return { ok: true as const, message: 'You will get no more mail about this series.' };
}
