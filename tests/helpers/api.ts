// Supertest helpers: the real app on this file's own database, and agents signed in per role.
import request from 'supertest';
import type { Express } from 'express';
import { createApp } from '../../server/app';

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
  return request.agent(testApp()).set('X-Requested-With', 'Bayslate');
}

export async function signInAs(role: DemoRole | { email: string; password: string }) {
  const agent = anonymous();
  const creds = typeof role === 'string' ? { email: DEMO_EMAIL[role], password: DEMO_PASSWORD } : role;
  const res = await agent.post('/api/auth/login').send(creds);
  if (res.status !== 200) throw new Error(`sign-in as ${creds.email} answered ${res.status}: ${JSON.stringify(res.body)}`);
  return agent;
}

/** One signed-in agent per demo role. */
export async function agentsByRole() {
  const out = {} as Record<DemoRole, Awaited<ReturnType<typeof signInAs>>>;
  for (const r of DEMO_ROLES) out[r] = await signInAs(r);
  return out;
}
