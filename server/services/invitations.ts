// Invitation links: a new person opens the link from their invitation mail once, within a week,
// and chooses their own password, so no password has to travel by mail.
import { QueryTypes, type Transaction } from 'sequelize';
import { sequelize, User } from '../models';
import { AppError } from '../errors';
import { record } from './activity';
import { newToken, tokenHash } from './viewerPrivacy';
import { hashPassword } from './passwords';

export const INVITATION_DAYS = 7;

/** A fresh link token for `userId` (only its hash is stored). */
export async function createInvitationLink(t: Transaction, userId: number): Promise<string> {
  const { token, hash } = newToken();
  await sequelize.query(
    `INSERT INTO invitation_links (user_id, token_hash, expires_at) VALUES (:userId, :hash, now() + interval '${INVITATION_DAYS} days')`,
    {
      replacements: { userId, hash },
      transaction: t,
    },
  );
  return token;
}

/** Ends every unused link of a person: a password set any other way makes them pointless. */
export async function endInvitationLinksOf(t: Transaction, userId: number) {
  await sequelize.query('DELETE FROM invitation_links WHERE user_id = :userId AND used_at IS NULL', {
    replacements: { userId },
    transaction: t,
  });
}

interface LinkRow {
  id: number;
  user_id: number;
  expired: boolean;
  used_at: Date | null;
}

async function usableLink(token: string, t?: Transaction) {
  const rows = await sequelize.query<LinkRow>(
    `SELECT id, user_id, expires_at < now() AS expired, used_at FROM invitation_links WHERE token_hash = :hash ${t ? 'FOR UPDATE' : ''}`,
    { replacements: { hash: tokenHash(token) }, type: QueryTypes.SELECT, transaction: t },
  );
  const link = rows[0];
  const user = link ? await User.findByPk(link.user_id, { transaction: t }) : null;
  if (!link || !user || !user.active) throw new AppError(404, 'invalid_link', 'This invitation link is not valid.');
  if (link.used_at)
    throw new AppError(
      410,
      'link_used',
      'This invitation link was already used. Sign in with your password, or ask the owner for a new one.',
    );
  if (link.expired)
    throw new AppError(
      410,
      'link_expired',
      'This invitation link has expired. Ask the owner to set a password for you.',
    );
  return { link, user };
}

export async function readInvitation(token: string) {
  const { user } = await usableLink(token);
  return { name: user.name, email: user.email };
}

export async function acceptInvitation(token: string, password: string) {
  await sequelize.transaction(async (t) => {
    const { link, user } = await usableLink(token, t);
    user.passwordHash = await hashPassword(password);
    await user.save({ transaction: t });
    await sequelize.query('UPDATE invitation_links SET used_at = now() WHERE id = :id', {
      replacements: { id: link.id },
      transaction: t,
    });
    await endInvitationLinksOf(t, user.id);
    await record(t, {
      actor: { id: user.id, name: user.name },
      buildId: null,
      entity: 'user',
      entityId: user.id,
      action: 'password',
      summary: `${user.name} chose a password from the invitation`,
      changes: {},
    });
  });
  return { ok: true as const };
}
