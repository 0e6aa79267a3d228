// Loads the build named by :buildId for routers mounted under /api/builds/:buildId/…, so every
// record a handler touches can be scoped to it (a record of another build answers 404).
// An anonymous caller gets 401 before the build is looked up, whether it exists or not, so the
// answers never tell which builds exist (server/routes/buildScoped.ts puts the role check first).
import type { RequestHandler } from 'express';
import { Build } from '../models';
import { notFound, unauthorized } from '../errors';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      build?: Build;
    }
  }
}

export const loadBuild: RequestHandler = async (req, _res, next) => {
  if (!req.user) return next(unauthorized());
  const id = Number(req.params.buildId);
  if (!Number.isInteger(id) || id <= 0) return next(notFound('Build'));
  const build = await Build.findByPk(id);
  if (!build) return next(notFound('Build'));
  req.build = build;
  next();
};

/** The build loaded by loadBuild (throws if a router forgot to use it). */
export function buildOf(req: Express.Request): Build {
  if (!req.build) throw new Error('loadBuild did not run for this route');
  return req.build;
}
