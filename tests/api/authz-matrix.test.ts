// The authorization matrix: every API route × anonymous and each role, table-driven from the
// files in tests/api/authz/. A route the server registers without a row here fails this test.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, agentsByRole, signInAs, DEMO_ROLES, type DemoRole } from '../helpers/api';
import { routeTable } from '../../server/routes';
import { Build } from '../../server/models';
import { fill, type MatrixContext, type MatrixRow } from './authz/types';

const modules = import.meta.glob<{ rows: MatrixRow[]; prepare?: (ctx: MatrixContext) => Promise<void> }>(
  './authz/*.ts',
  { eager: true },
);
const rows = Object.entries(modules)
  .filter(([file]) => !file.endsWith('/types.ts'))
  .flatMap(([, m]) => m.rows ?? []);

const ctx: MatrixContext = { ids: {}, other: {} };
let agents: Record<DemoRole, ReturnType<typeof anonymous>>;

beforeAll(async () => {
  const tern = await Build.findOne({ where: { slug: 'project-tern' } });
  const other = await Build.create({
    slug: 'matrix-other',
    name: 'Other build',
    year: 2020,
    make: 'Halvorsen',
    model: 'Skua',
    vin: null,
    mileage: null,
    budgetCents: 100,
    labourRateCents: 100,
    campaign: null,
    summary: null,
  });
  ctx.ids.buildId = tern?.id ?? 0;
  ctx.other.buildId = other.id;
  for (const m of Object.values(modules)) if (m.prepare) await m.prepare(ctx);
  agents = (await agentsByRole()) as typeof agents;
});

function send(agent: ReturnType<typeof anonymous>, row: MatrixRow, url: string) {
  const method = row.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  const req = agent[method](url);
  return row.body ? req.send(row.body(ctx) as object) : row.method === 'GET' ? req : req.send({});
}

const mayCall = (row: MatrixRow, role: DemoRole) =>
  row.allow === 'public' || row.allow === 'signed-in' || role === 'owner' || row.allow.includes(role);

describe('authorization matrix', () => {
  it('has a row for every route the server registers, and no row for a route that does not exist', () => {
    const registered = routeTable().map((r) => `${r.method} ${r.path}`);
    const covered = rows.map((r) => `${r.method} ${r.path}`);
    expect(registered.length).toBeGreaterThan(5);
    expect(registered.filter((r) => !covered.includes(r))).toEqual([]);
    expect(covered.filter((r) => !registered.includes(r))).toEqual([]);
  });

  for (const row of rows) {
    const label = `${row.method} ${row.path}`;
    it(`${label}: anonymous ${row.allow === 'public' ? 'may call it' : 'gets 401'}`, async () => {
      const url = row.url ? row.url(ctx) : fill(row.path, ctx.ids);
      const res = await send(anonymous(), row, url);
      if (row.allow === 'public') expect([401, 403]).not.toContain(res.status);
      else expect(res.status).toBe(401);
    });
    for (const role of DEMO_ROLES) {
      const allowed = mayCall(row, role);
      it(`${label}: ${role} ${allowed ? 'is let through' : 'gets 403'}`, async () => {
        const url = row.url ? row.url(ctx) : fill(row.path, ctx.ids);
        const agent = row.endsSession ? await signInAs(role) : agents[role];
        const res = await send(agent, row, url);
        if (allowed) expect([401, 403], `${role} was refused: ${JSON.stringify(res.body)}`).not.toContain(res.status);
        else expect(res.status).toBe(403);
        expect(res.status).not.toBe(500);
      });
      if (row.idor && allowed) {
        it(`${label}: ${role} cannot reach another build's record`, async () => {
          const res = await send(agents[role], row, row.idor!(ctx));
          expect(res.status).toBe(404);
        });
      }
    }
  }
});
