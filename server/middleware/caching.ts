// Caching rules for API answers: nothing personal may be kept by a browser or a proxy.
import type { RequestHandler } from 'express';

/** Every API answer starts as no-store; a public route may relax it for anonymous viewers. */
export const noStoreByDefault: RequestHandler = (_req, res, next) => {
  res.set('Cache-Control', 'no-store');
  next();
};

/**
 * A signed-in person's answers are never stored, whatever a route set (an overview's
 * revalidation header, the public page's public caching), decided when the headers go out.
 */
export const noStoreWhenSignedIn: RequestHandler = (req, res, next) => {
  if (!req.user) return next();
  const writeHead = res.writeHead;
  res.writeHead = function (this: typeof res, ...args: Parameters<typeof writeHead>) {
    if (!this.headersSent) this.setHeader('Cache-Control', 'no-store');
    return writeHead.apply(this, args);
  } as typeof writeHead;
  next();
};
