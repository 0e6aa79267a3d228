// Deny by default: every route names the roles it admits. The owner may do everything.
import type { RequestHandler } from 'express';
import type { Role } from '../../shared/domain';
import { forbidden, unauthorized } from '../errors';

export const ANY_ROLE: readonly Role[] = ['owner', 'producer', 'installer', 'marketing'];

export function requireRole(...roles: Role[]): RequestHandler {
  const allowed = new Set<string>(['owner', ...roles]);
  return (req, _res, next) => {
    if (!req.user) return next(unauthorized());
    if (!req.user.roles.some((r) => allowed.has(r))) return next(forbidden());
    next();
  };
}

/** Any signed-in person, whatever their roles. */
export const requireSignedIn: RequestHandler = (req, _res, next) => (req.user ? next() : next(unauthorized()));

export function hasRole(user: Express.User | undefined, ...roles: Role[]): boolean {
  return !!user && user.roles.some((r) => r === 'owner' || (roles as string[]).includes(r));
}
