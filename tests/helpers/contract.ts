// Every answer an API test reads is parsed with its contract (shared/contracts): the agents of
// helpers/api.ts run `checkAnswer` on each response, so an answer that drifts from its contract, or
// carries a field the caller's role is not allowed (a field no contract names), fails the test.
import { expect } from 'vitest';
import type { z } from 'zod';
import type { Response } from 'supertest';
import { API } from '../../shared/contracts';
import { allow, contractFor, ErrorAnswer, type Audiences } from '../../shared/contracts/common';

interface Route {
  method: string;
  re: RegExp;
  params: number;
  contract: z.ZodType | Audiences;
  key: string;
  status: number | null;
}
const routes: Route[] = Object.entries(API)
  .map(([key, contract]) => {
    const [method, path, status] = key.split(' ') as [string, string, string | undefined];
    const params = (path.match(/:\w+/g) ?? []).length;
    const re = new RegExp(`^${path.replace(/[.]/g, '\\.').replace(/:\w+/g, '[^/]+')}$`);
    return { method, re, params, contract, key, status: status ? Number(status) : null };
  })
  .sort((a, b) => a.params - b.params);

let strict = false;
let exceptPrefixes: readonly string[] = [];
/**
 * Call once in a test file: a JSON answer of a route without a contract then fails the test
 * (`except`: path prefixes of another domain whose contracts are not written yet).
 */
export function everyAnswerHasAContract(o: { except?: readonly string[] } = {}) {
  strict = true;
  exceptPrefixes = o.except ?? [];
}

/** The route-table entry of a request, if any. */
export function routeOf(method: string, url: string, status: number | null = null): Route | undefined {
  const path = new URL(url, 'http://x').pathname;
  return routes.find((r) => r.method === method.toUpperCase() && r.status === status && r.re.test(path));
}

/**
 * Parses `body` with `contract` (for these roles when it is per-role) and fails when the body holds
 * a field the contract does not name. Returns the parsed answer.
 */
export function expectContract<A extends Audiences>(
  contract: A,
  body: unknown,
  roles?: readonly string[],
): z.output<A['crew']>;
export function expectContract<S extends z.ZodType>(contract: S, body: unknown, roles?: readonly string[]): z.output<S>;
export function expectContract(contract: z.ZodType | Audiences, body: unknown, roles?: readonly string[]): unknown {
  const c = contractFor(contract as z.ZodType | Audiences, roles);
  const parsed = c.safeParse(body);
  if (!parsed.success)
    throw new Error(
      `The answer does not fit its contract: ${JSON.stringify(parsed.error.issues.slice(0, 5))}\n${JSON.stringify(body).slice(0, 600)}`,
    );
  expect(
    allow(c, body as never),
    'the answer carries a field its contract does not name (not allowed for this role)',
  ).toEqual(body);
  return parsed.data;
}

/** Checks one response against the route table (run by the agents of helpers/api.ts). */
export function checkAnswer(method: string, url: string, roles: readonly string[] | undefined, res: Response) {
  const json = /json/.test(String(res.headers['content-type'] ?? ''));
  if (res.status >= 400) {
    // An error answer of its own ('POST /path 400' in a route table), else the common one.
    if (json) expectContract(contractFor(routeOf(method, url, res.status)?.contract ?? ErrorAnswer, roles), res.body);
    return;
  }
  const route = routeOf(method, url);
  if (!route) {
    const excepted = exceptPrefixes.some((p) => new URL(url, 'http://x').pathname.startsWith(p));
    if (strict && json && !excepted)
      throw new Error(`No contract for ${method.toUpperCase()} ${url}: add it to a route table in shared/contracts.`);
    return;
  }
  if (res.status === 204 || !json) return;
  expectContract(contractFor(route.contract, roles), res.body);
}
