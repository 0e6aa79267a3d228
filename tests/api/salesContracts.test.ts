// The sales answers per role (shared/contracts/sales.ts): the owner's shape carries the cost-based
// figures, the team's (producer, marketing) does not, and each role's answer parses with exactly its
// own contract — no field outside it. The allow-list decides: a field nobody named stays hidden.
import { describe, it, expect, beforeAll } from 'vitest';
import { agentsByRole, type DemoRole } from '../helpers/api';
import { everyAnswerHasAContract, expectContract } from '../helpers/contract';
import { Build } from '../../server/models';
import { salesForViewer } from '../../server/services/visibility';
import { allow } from '../../shared/contracts/common';
import {
  SalesLines,
  SalesSummary,
  SalesSummaryForOwner,
  SalesSummaryForTeam,
  salesContractFor,
} from '../../shared/contracts/sales';

everyAnswerHasAContract();

let as: Awaited<ReturnType<typeof agentsByRole>>;
let ternId: number;

beforeAll(async () => {
  as = await agentsByRole();
  ternId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
});

const ROLES: DemoRole[] = ['owner', 'producer', 'marketing'];

describe('sales answers per role', () => {
  it('the summary parses with the role’s own contract: the owner’s with margin and payback, the team’s without', async () => {
    for (const role of ROLES) {
      const res = await as[role].get(`/api/builds/${ternId}/sales`);
      expect(res.status).toBe(200);
      const body = expectContract(salesContractFor(SalesSummary, [role]), res.body, [role]);
      if (role === 'owner') {
        expect(body).toHaveProperty('payback');
        expect(body.series).toHaveProperty('marginCents');
      } else {
        // The owner's contract needs the cost-based figures: a team answer cannot pass for it.
        expect(SalesSummaryForOwner.safeParse(res.body).success).toBe(false);
        expect(JSON.stringify(res.body)).not.toMatch(
          /marginCents|netCostCents|returnOnBuild|paybackDate|marginNeededCents|cumulative/,
        );
      }
    }
  });

  it('a page of lines parses with the role’s own contract, margin on each line for the owner only', async () => {
    for (const role of ROLES) {
      const res = await as[role].get(`/api/builds/${ternId}/sales/lines?kind=direct&page=1&pageSize=5`);
      expect(res.status).toBe(200);
      const body = expectContract(salesContractFor(SalesLines, [role]), res.body, [role]);
      expect(body.lines.length).toBeGreaterThan(0);
      for (const line of body.lines) expect('marginCents' in line).toBe(role === 'owner');
    }
  });

  it('a field added to an answer later reaches no role until the allow-list and the contract name it', async () => {
    const owner = (await as.owner.get(`/api/builds/${ternId}/sales`)).body;
    const withNew = { ...owner, supplierRebateCents: 1234, series: { ...owner.series, supplierRebateCents: 1234 } };
    for (const role of ROLES) {
      const viaAllowList = salesForViewer(withNew, { roles: [role] });
      const sent = allow(salesContractFor(SalesSummary, [role]), viaAllowList as never);
      expect(JSON.stringify(sent)).not.toContain('supplierRebateCents');
    }
    // The team's contract alone also drops the owner's figures from an owner answer.
    expect(JSON.stringify(allow(SalesSummaryForTeam, owner))).not.toMatch(/marginCents|payback/);
  });
});
