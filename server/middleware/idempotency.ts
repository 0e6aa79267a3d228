// A change sent with an `Idempotency-Key` header happens once: a repeat with the same key (the
// phone resending a waiting change whose answer the network lost) gets the first answer again,
// marked `Idempotent-Replayed: true`. Changes without the header behave as before.
import type { NextFunction, Request, Response } from 'express';
import { badRequest, conflict, unprocessable } from '../errors';
import { logger } from '../logger';
import { claimReceipt, keepReceipt, releaseReceipt } from '../services/requestReceipts';

const CHANGES = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);
const KEY = /^[A-Za-z0-9_-]{8,100}$/;

export function idempotentChanges(req: Request, res: Response, next: NextFunction) {
  const key = req.get('Idempotency-Key');
  if (key === undefined || !CHANGES.has(req.method) || !req.user) return next();
  if (!KEY.test(key))
    return next(badRequest('The Idempotency-Key header must be 8 to 100 letters, digits, hyphens or underscores.'));
  const userId = req.user.id;
  const path = req.originalUrl.split('?')[0];
  void claimReceipt(userId, key, req.method, path).then((claim) => {
    if (claim.state === 'replay') {
      res.set('Idempotent-Replayed', 'true');
      return void res.status(claim.status).json(claim.body);
    }
    if (claim.state === 'busy') return next(conflict('This change is still being saved; try again in a moment.'));
    if (claim.state === 'mismatch') {
      return next(
        unprocessable(
          `This Idempotency-Key was already used for ${claim.method} ${claim.path}; use a new key for a different change.`,
        ),
      );
    }
    let body: unknown = null;
    const json = res.json.bind(res);
    res.json = (b: unknown) => {
      body = b;
      return json(b);
    };
    let settled = false;
    const settle = (finished: boolean) => {
      if (settled) return;
      settled = true;
      const kept = finished && res.statusCode < 500;
      const work = kept ? keepReceipt(userId, key, res.statusCode, body) : releaseReceipt(userId, key);
      work.catch((err: unknown) => logger().warn({ err }, 'request receipt not kept'));
    };
    res.on('finish', () => settle(true));
    res.on('close', () => settle(res.writableFinished));
    next();
  }, next);
}
