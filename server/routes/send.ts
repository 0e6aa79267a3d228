// Answers leave through their contract (shared/contracts): the value is typed against it, and only
// the fields the contract names are sent (per role for money: see shared/contracts/common.ts).
import type { Request, Response } from 'express';
import type { z } from 'zod';
import { allow, audienceOf, type Audiences } from '../../shared/contracts/common';

/** Sends `value` as `contract` allows it. */
export function send<S extends z.ZodType>(res: Response, contract: S, value: z.input<S>, status = 200): void {
  res.status(status).json(allow(contract, value));
}

/** Sends `value` (typed as the widest answer) as the contract of the caller's audience allows it. */
export function sendFor<A extends Audiences>(
  req: Request,
  res: Response,
  contracts: A,
  value: z.input<A['money']>,
  status = 200,
): void {
  res.status(status).json(allow(contracts[audienceOf(req.user?.roles)], value as never));
}

/** The allowed copy of one record for a person (for values that are not whole answers: conflict bodies, events). */
export function allowFor<A extends Audiences>(
  contracts: A,
  roles: readonly string[] | undefined,
  value: z.input<A['money']>,
): unknown {
  return allow(contracts[audienceOf(roles)], value as never);
}
