// Supertest helpers: the real app on this file's own database, and agents signed in per role.
import request from 'supertest';
import type { Express } from 'express';
import { createApp } from '../../server/app';
import { checkAnswer } from './contract';

export const DEMO_PASSWORD = 'bayslate-demo';
export const DEMO_EMAIL = {
  owner: 'owner@cedar-ridge.test',
  producer: 'producer@cedar-ridge.test',
  installer: 'installer@cedar-ridge.test',
  marketing: 'marketing@cedar-ridge.test',
} as const;
export type DemoRole = keyof typeof DEMO_EMAIL;
export const DEMO_ROLES = Object.keys(DEMO_EMAIL) as DemoRole[];

let app: Express | null = null;
export function testApp(): Express {
  app ??= createApp();
  return app;
}

/** An agent that behaves like our client: it sends our cross-site header on every request. */
export function anonymous() {
  return checked(request.agent(testApp()).set('X-Requested-With', 'Bayslate'));
}

/** Every answer the agent receives is parsed with its contract for the agent's roles (helpers/contract.ts). */
function checked<A extends object>(agent: A): A {
  let roles: readonly string[] | undefined;
  for (const method of ['get', 'post', 'put', 'patch', 'delete', 'del'] as const) {
    const a = agent as Record<string, unknown>;
    const original = a[method] as ((url: string, ...rest: unknown[]) => request.Test) | undefined;
    if (typeof original !== 'function') continue;
    a[method] = (url: string, ...rest: unknown[]) =>
      original.call(agent, url, ...rest).expect((res) => {
        checkAnswer(method === 'del' ? 'delete' : method, url, roles, res);
        if (url.startsWith('/api/auth/login') && res.status === 200) roles = res.body?.user?.roles;
        if (url.startsWith('/api/auth/logout') && res.status === 200) roles = undefined;
      });
  }
  return agent;
}

export async function signInAs(role: DemoRole | { email: string; password: string }) {
  const agent = anonymous();
  const creds = typeof role === 'string' ? { email: DEMO_EMAIL[role], password: DEMO_PASSWORD } : role;
  const res = await agent.post('/api/auth/login').send(creds);
  if (res.status !== 200)
    throw new Error(`sign-in as ${creds.email} answered ${res.status}: ${JSON.stringify(res.body)}`);
  return agent;
}

/** One signed-in agent per demo role. */
export async function agentsByRole() {
  const out = {} as Record<DemoRole, Awaited<ReturnType<typeof signInAs>>>;
  for (const r of DEMO_ROLES) out[r] = await signInAs(r);
  return out;
}
