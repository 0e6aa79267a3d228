// People and roles: create, change roles, deactivate (ending their sessions), reset passwords.
// The last active owner can never be removed or demoted.
import bcrypt from 'bcryptjs';
import { randomBytes } from 'node:crypto';
import { Op } from 'sequelize';
import { sequelize, User } from '../models';
import { AppError, badRequest, notFound } from '../errors';
import { record, type Actor } from './activity';
import { enqueueMail } from '../mail/outbox';
import { invitationMail } from '../mail/templates';
import { createInvitationLink, endInvitationLinksOf } from './invitations';
import { config } from '../config';
import type { CreateUserInput, UpdateUserInput } from '../../shared/schemas/auth';
import type { Role } from '../../shared/domain';

import { hashPassword } from './passwords';
import { forgetSessionReads } from './sessionReads';
export { hashPassword };

export async function listUsers() {
  const users = await User.findAll({ order: [['name', 'ASC']] });
  return users.map((u) => u.toPublic());
}

export async function createUser(actor: Actor | null, input: CreateUserInput) {
  const temporaryPassword = input.password ? null : randomBytes(9).toString('base64url');
  return sequelize.transaction(async (t) => {
    const exists = await User.findOne({ where: { email: input.email }, transaction: t });
    if (exists)
      throw new AppError(409, 'duplicate', 'Someone with this e-mail already exists.', [
        { path: 'email', message: 'is already used' },
      ]);
    const user = await User.create(
      {
        email: input.email,
        name: input.name,
        roles: [...new Set(input.roles)] as Role[],
        passwordHash: await hashPassword(input.password ?? temporaryPassword!),
      },
      { transaction: t },
    );
    await record(t, {
      actor,
      buildId: null,
      entity: 'user',
      entityId: user.id,
      action: 'create',
      summary: `Added ${user.name} (${user.roles.join(', ')})`,
      after: user.toPublic(),
    });
    // The invitation carries a one-time link to choose a password; no password travels by mail.
    const link = `${config().publicUrl}/welcome/${await createInvitationLink(t, user.id)}`;
    const mail = invitationMail({ name: user.name, roles: user.roles, invitedBy: actor?.name ?? null, link });
    await enqueueMail(t, {
      kind: 'invitation',
      to: user.email,
      subject: mail.subject,
      text: mail.text,
      dedupeKey: `invite:${user.id}`,
    });
    return { user: user.toPublic(), temporaryPassword };
  });
}

async function activeOwnersOtherThan(id: number, t: import('sequelize').Transaction) {
  return User.count({
    where: { id: { [Op.ne]: id }, active: true, roles: { [Op.contains]: ['owner'] } },
    transaction: t,
  });
}

/** Ends every session of a person at once (but `keepSessionId`, the one making the change). */
export async function endSessionsOf(userId: number, t?: import('sequelize').Transaction, keepSessionId?: string) {
  const [rows] = await sequelize.query(
    `DELETE FROM "session" WHERE (sess->'passport'->>'user')::int = :userId AND sid <> :keep RETURNING sid`,
    { replacements: { userId, keep: keepSessionId ?? '' }, transaction: t },
  );
  // This process's kept reads of them go once the deletion is committed (until then the rows are
  // still there for every other connection).
  const forget = () => (rows as { sid: string }[]).forEach((r) => forgetSessionReads(r.sid));
  if (t) t.afterCommit(forget);
  else forget();
}

export async function updateUser(actor: Actor, id: number, input: UpdateUserInput) {
  return sequelize.transaction(async (t) => {
    // Lock owners so two simultaneous demotions cannot leave the shop with none.
    await sequelize.query(`SELECT id FROM users WHERE 'owner' = ANY(roles) FOR UPDATE`, { transaction: t });
    const user = await User.findByPk(id, { transaction: t });
    if (!user) throw notFound('User');
    const before = user.toPublic();
    const losesOwner =
      user.roles.includes('owner') &&
      user.active &&
      ((input.roles && !input.roles.includes('owner')) || input.active === false);
    if (losesOwner && (await activeOwnersOtherThan(id, t)) === 0) {
      throw new AppError(409, 'last_owner', 'This is the last active owner; make someone else an owner first.', [
        { path: input.active === false ? 'active' : 'roles', message: 'would leave no active owner' },
      ]);
    }
    if (input.name !== undefined) user.name = input.name;
    if (input.roles) user.roles = [...new Set(input.roles)] as Role[];
    if (input.active !== undefined) user.active = input.active;
    await user.save({ transaction: t });
    if (input.active === false) await endSessionsOf(user.id, t);
    await record(t, {
      actor,
      buildId: null,
      entity: 'user',
      entityId: user.id,
      action: 'update',
      summary: `Changed ${user.name}`,
      before,
      after: user.toPublic(),
    });
    return user.toPublic();
  });
}

/**
 * Sets a password. Every outstanding invitation link of the person ends, and so do their sessions:
 * all of them for a reset by the owner, all but `keepSessionId` for a change of one's own.
 */
export async function setPassword(actor: Actor | null, id: number, password: string, keepSessionId?: string) {
  return sequelize.transaction(async (t) => {
    const user = await User.findByPk(id, { transaction: t });
    if (!user) throw notFound('User');
    user.passwordHash = await hashPassword(password);
    await user.save({ transaction: t });
    await endSessionsOf(user.id, t, keepSessionId);
    await endInvitationLinksOf(t, user.id);
    await record(t, {
      actor,
      buildId: null,
      entity: 'user',
      entityId: user.id,
      action: 'password',
      summary: `Password set for ${user.name}`,
      changes: {},
    });
  });
}

export async function changeOwnPassword(actor: Actor, current: string, next: string, thisSessionId: string) {
  const user = await User.findByPk(actor.id);
  if (!user) throw notFound('User');
  if (!(await bcrypt.compare(current, user.passwordHash))) {
    throw badRequest('The current password is not right.', [{ path: 'currentPassword', message: 'is not right' }]);
  }
  await setPassword(actor, actor.id, next, thisSessionId);
}
