// Refuses requests that name a host other than ours: links in mails, redirects and cookies are
// built for PUBLIC_URL, and a forged Host must not reach them. Loopback is fine outside production.
import type { RequestHandler } from 'express';
import { config, type Config } from '../config';
import { AppError } from '../errors';

const LOOPBACK = new Set(['127.0.0.1', 'localhost', '[::1]']);

const withoutPort = (host: string) =>
  host.startsWith('[') ? host.slice(0, host.indexOf(']') + 1) : host.split(':')[0]!;

const allowedSets = new WeakMap<Config, Set<string>>();
function allowedOf(c: Config) {
  let set = allowedSets.get(c);
  if (!set) {
    set = new Set([
      new URL(c.publicUrl).host.toLowerCase(),
      ...c.ALLOWED_HOSTS.split(',')
        .map((h) => h.trim().toLowerCase())
        .filter(Boolean),
    ]);
    allowedSets.set(c, set);
  }
  return set;
}

/** Whether a request naming `host` (host[:port]) may be served. */
export function hostAllowed(host: string | undefined, c: Config): boolean {
  if (!host) return false;
  const h = host.trim().toLowerCase();
  const allowed = allowedOf(c);
  if (allowed.has(h) || allowed.has(withoutPort(h))) return true;
  return !c.isProduction && LOOPBACK.has(withoutPort(h));
}

export const ownHostOnly: RequestHandler = (req, _res, next) => {
  const host = req.headers.host;
  if (hostAllowed(host, config())) return next();
  next(
    new AppError(421, 'wrong_host', `This server does not answer for the host "${String(host ?? '').slice(0, 100)}".`),
  );
};
