// Sign-in, the session's person, users (owner only) and invitation links.
import { z } from 'zod';
import { ROLES } from '../domain';
import { idNumber, OkAnswer, type RouteTable } from './common';

/** A person as the API sends them: never a password hash. */
export const User = z.object({
  id: idNumber,
  email: z.string(),
  name: z.string(),
  roles: z.array(z.enum(ROLES)),
  active: z.boolean(),
});
export type User = z.infer<typeof User>;
/** The signed-in person (always active: a deactivated person is signed out). */
export const SessionUser = User.omit({ active: true });
export type SessionUser = z.infer<typeof SessionUser>;

export const SessionAnswer = z.object({ user: SessionUser });
export type SessionAnswer = z.infer<typeof SessionAnswer>;
export const UserList = z.object({ users: z.array(User) });
export type UserList = z.infer<typeof UserList>;
export const UserAnswer = z.object({ user: User });
export type UserAnswer = z.infer<typeof UserAnswer>;
/** A new person; the temporary password only when none was given (an invitation link is mailed too). */
export const UserCreated = z.object({ user: User, temporaryPassword: z.string().nullable() });
export type UserCreated = z.infer<typeof UserCreated>;
/** Who an invitation link is for. */
export const InvitationWho = z.object({ name: z.string(), email: z.string() });
export type InvitationWho = z.infer<typeof InvitationWho>;

export const authRoutes = {
  'POST /api/auth/login': SessionAnswer,
  'POST /api/auth/logout': OkAnswer,
  'GET /api/auth/me': SessionAnswer,
  'POST /api/auth/password': OkAnswer,
  'GET /api/users': UserList,
  'POST /api/users': UserCreated,
  'PATCH /api/users/:userId': UserAnswer,
  'POST /api/users/:userId/password': OkAnswer,
  'GET /api/invitations/:token': InvitationWho,
  'POST /api/invitations/:token': OkAnswer,
} satisfies RouteTable;
