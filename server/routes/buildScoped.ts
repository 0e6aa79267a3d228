// Build-scoped routers (/api/builds/:buildId/…) in one fixed order, so it cannot differ between
// routers:
//   1. the role check      anonymous → 401, a person without the role → 403 (the build is not
//                          looked at yet, so neither answer tells whether the build exists)
//   2. load the build      unknown build → 404
//   3. record in the build :param names no record of this build → 404 (a record of another build
//                          is never told apart from one that does not exist)
//   4. validation          params, then query, then body → 400 naming the fields
//   5. the handler
import { Router, type RequestHandler } from 'express';
import type { ZodType } from 'zod';
import type { Role } from '../../shared/domain';
import { requireRole, requireSignedIn } from '../middleware/roles';
import { buildOf, loadBuild } from '../middleware/build';
import { validate } from '../middleware/validate';
import { notFound } from '../errors';

/** A model that can count its rows of one build (every build-scoped model has `buildId`). */
export interface BuildScopedModel {
  count: (o: { where: Record<string, number> }) => Promise<number>;
}

/**
 * 404 when :param names no record of this build. Runs after the role check and loadBuild, and
 * before the body is validated.
 */
export function recordInBuild(model: BuildScopedModel, param: string, label: string): RequestHandler {
  return async (req, _res, next) => {
    const id = Number(req.params[param]);
    if (!Number.isInteger(id) || id <= 0 || id > 2_147_483_647) return next(notFound(label));
    const n = await model.count({ where: { id, buildId: buildOf(req).id } });
    next(n ? undefined : notFound(label));
  };
}

export interface ScopedRoute {
  /** Who may call it: roles (the owner always may), or any signed-in person. */
  roles: readonly Role[] | 'signed-in';
  /** The record named in the path must belong to this build (see recordInBuild). */
  record?: RequestHandler;
  params?: ZodType;
  query?: ZodType;
  body?: ZodType;
}

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** The middleware chain of one build-scoped route, in the fixed order. */
export function scopedChain(spec: ScopedRoute): RequestHandler[] {
  const chain: RequestHandler[] = [
    spec.roles === 'signed-in' ? requireSignedIn : requireRole(...spec.roles),
    loadBuild,
  ];
  if (spec.record) chain.push(spec.record);
  if (spec.params) chain.push(validate(spec.params, 'params'));
  if (spec.query) chain.push(validate(spec.query, 'query'));
  if (spec.body) chain.push(validate(spec.body));
  return chain;
}

export interface BuildScopedRouter {
  /** The Express router to mount under /api/builds/:buildId/<resource>. */
  router: Router;
  get: (path: string, spec: ScopedRoute, ...handlers: RequestHandler[]) => BuildScopedRouter;
  post: (path: string, spec: ScopedRoute, ...handlers: RequestHandler[]) => BuildScopedRouter;
  put: (path: string, spec: ScopedRoute, ...handlers: RequestHandler[]) => BuildScopedRouter;
  patch: (path: string, spec: ScopedRoute, ...handlers: RequestHandler[]) => BuildScopedRouter;
  delete: (path: string, spec: ScopedRoute, ...handlers: RequestHandler[]) => BuildScopedRouter;
}

/**
 * A router whose every route runs role → build → record → validation → handler. Handlers read
 * the build with buildOf(req) and the parsed query with validQuery(req).
 */
export function buildScopedRouter(): BuildScopedRouter {
  const router = Router({ mergeParams: true });
  // The handlers run after the fixed chain (an upload's body parser, then the handler).
  const add =
    (method: Method) =>
    (path: string, spec: ScopedRoute, ...handlers: RequestHandler[]) => {
      router[method](path, ...scopedChain(spec), ...handlers);
      return scoped;
    };
  const scoped: BuildScopedRouter = {
    router,
    get: add('get'),
    post: add('post'),
    put: add('put'),
    patch: add('patch'),
    delete: add('delete'),
  };
  return scoped;
}
