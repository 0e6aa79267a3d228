// The answers' contracts (shared/contracts): money leaves through allow-lists per role, so a field
// added to a record later reaches nobody until a contract names it; and the test agents fail an
// answer that drifts from its contract.
import { describe, it, expect, beforeAll } from 'vitest';
import express from 'express';
import request from 'supertest';
import { z } from 'zod';
import { agentsByRole, type DemoRole } from '../helpers/api';
import { checkAnswer, everyAnswerHasAContract, expectContract } from '../helpers/contract';
import { Build, Upgrade } from '../../server/models';
import { upgradeRecord } from '../../server/services/backlogRecords';
import { toBuildRecord } from '../../server/services/builds';
import { sendFor } from '../../server/routes/send';
import { API } from '../../shared/contracts';
import { audienceOf, isAudiences, type Audiences } from '../../shared/contracts/common';
import { UpgradeAnswer, UpgradeDetail, UpgradePage } from '../../shared/contracts/upgrade';
import { BuildAnswer, BuildList } from '../../shared/contracts/build';
import { PartPage } from '../../shared/contracts/part';
import { RemovedPartList } from '../../shared/contracts/removedPart';

everyAnswerHasAContract();

let tern: number;
let upgradeId: number;
let as: Awaited<ReturnType<typeof agentsByRole>>;

beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  upgradeId = (await Upgrade.findOne({ where: { buildId: tern, title: 'Power liftgate' } }))!.id;
  as = await agentsByRole();
});

/** Every key an answer contract names, at any depth. */
function keysOf(s: z.ZodType): string[] {
  const d = (s as unknown as { _zod: { def: Record<string, unknown> } })._zod.def;
  if (d.type === 'object')
    return Object.entries(d.shape as Record<string, z.ZodType>).flatMap(([k, v]) => [k, ...keysOf(v)]);
  if (d.type === 'array') return keysOf(d.element as z.ZodType);
  if (['optional', 'nullable', 'default', 'readonly'].includes(d.type as string))
    return keysOf(d.innerType as z.ZodType);
  if (d.type === 'union') return (d.options as z.ZodType[]).flatMap(keysOf);
  return [];
}

/** A one-route app that answers with the real send helper, as a person of `roles`. */
function answering(roles: string[], contracts: Audiences, value: unknown) {
  const app = express();
  app.get('/x', (req, res) => {
    req.user = { id: 1, email: 'x@example.test', name: 'X', roles };
    sendFor(req, res, contracts, value as never);
  });
  return request(app).get('/x');
}

describe('per-role allow-lists', () => {
  it('the crew (installer) contracts name no money field, and the retail (marketing) ones only the retail price', () => {
    const leaks: string[] = [];
    for (const [route, c] of Object.entries(API)) {
      if (!isAudiences(c)) continue;
      for (const k of keysOf(c.crew)) if (/Cents$/.test(k)) leaks.push(`${route} crew: ${k}`);
      for (const k of keysOf(c.retail))
        if (/Cents$/.test(k) && k !== 'retailPriceCents') leaks.push(`${route} retail: ${k}`);
    }
    expect(leaks).toEqual([]);
  });

  it('maps each role to its audience; a person with several roles reads as the widest', () => {
    expect(['owner', 'producer', 'marketing', 'installer'].map((r) => audienceOf([r]))).toEqual([
      'money',
      'money',
      'retail',
      'crew',
    ]);
    expect(audienceOf(['installer', 'marketing'])).toBe('retail');
    expect(audienceOf(['installer', 'producer'])).toBe('money');
    expect(audienceOf(undefined)).toBe('crew');
  });

  it('a money field added to a record later reaches neither a producer nor an installer until a contract names it', async () => {
    const record = {
      ...(await upgradeRecord((await Upgrade.findByPk(upgradeId))!)),
      marginCents: 4200,
      supplierDiscountCents: 300,
    };
    for (const roles of [['owner'], ['producer'], ['installer'], ['marketing']]) {
      const res = await answering(roles, UpgradeAnswer, { upgrade: record });
      expect(res.status).toBe(200);
      expect(res.body.upgrade.id).toBe(upgradeId);
      expect(res.body.upgrade).not.toHaveProperty('marginCents');
      expect(res.body.upgrade).not.toHaveProperty('supplierDiscountCents');
      // The named money field: money roles only (Power liftgate adds value: written in the demo seed).
      if (roles[0] === 'owner' || roles[0] === 'producer')
        expect(res.body.upgrade.valueAddedCents).toBe(record.valueAddedCents);
      else expect(res.body.upgrade).not.toHaveProperty('valueAddedCents');
    }
  });

  it('a field added to a build record is not sent either, while the budget reaches money roles only', async () => {
    const build = {
      ...toBuildRecord((await Build.findByPk(tern))!),
      internalNotes: 'not for the list',
      spendForecastCents: 1,
    };
    const producer = await answering(['producer'], BuildAnswer, { build });
    const installer = await answering(['installer'], BuildAnswer, { build });
    for (const res of [producer, installer]) {
      expect(res.body.build.slug).toBe('project-tern');
      expect(res.body.build).not.toHaveProperty('internalNotes');
      expect(res.body.build).not.toHaveProperty('spendForecastCents');
    }
    expect(producer.body.build).toHaveProperty('budgetCents');
    expect(installer.body.build).not.toHaveProperty('budgetCents');
    expect(installer.body.build).not.toHaveProperty('labourRateCents');
  });

  it('the real routes send each role its own contract (the agents parse each answer for the role)', async () => {
    const expectations: [DemoRole, string][] = [
      ['owner', 'valueAddedCents'],
      ['producer', 'valueAddedCents'],
    ];
    for (const [role, key] of expectations) {
      const res = await as[role].get(`/api/builds/${tern}/upgrades/${upgradeId}`);
      expect(res.status).toBe(200);
      expect(res.body.upgrade).toHaveProperty(key);
      expect(Array.isArray(res.body.expenses)).toBe(true);
    }
    for (const role of ['installer', 'marketing'] as const) {
      const res = await as[role].get(`/api/builds/${tern}/upgrades/${upgradeId}`);
      expect(res.status).toBe(200);
      expect(res.body.upgrade).not.toHaveProperty('valueAddedCents');
      expect(res.body).not.toHaveProperty('expenses');
      expect(res.body.parts.length).toBeGreaterThan(0);
      expect(res.body.parts.every((p: Record<string, unknown>) => !('unitCostCents' in p))).toBe(true);
      expect(res.body.parts.every((p: Record<string, unknown>) => 'retailPriceCents' in p)).toBe(role === 'marketing');
    }
    const list = await as.installer.get('/api/builds');
    expect(list.body.builds.every((b: Record<string, unknown>) => !('spentCents' in b) && !('budgetCents' in b))).toBe(
      true,
    );
    const owners = await as.owner.get('/api/builds');
    expect(owners.body.builds.every((b: Record<string, unknown>) => typeof b.spentCents === 'number')).toBe(true);
  });
});

describe('the test agents', () => {
  it('fail an answer that carries a field its contract does not name for the role', async () => {
    const res = await as.owner.get(`/api/builds/${tern}/upgrades/${upgradeId}`);
    // The owner's answer, read as an installer's, carries money the installer's contract does not name.
    expect(() => expectContract(UpgradeDetail, res.body, ['installer'])).toThrow();
    expect(expectContract(UpgradeDetail, res.body, ['owner']).upgrade.id).toBe(upgradeId);
  });

  it('fail an answer whose field drifted from its contract (a number sent as text)', async () => {
    const res = await as.producer.get(`/api/builds/${tern}/parts?pageSize=2`);
    const drifted = { ...res, body: { ...res.body, total: String(res.body.total) } };
    expect(() => checkAnswer('get', `/api/builds/${tern}/parts?pageSize=2`, ['producer'], drifted as never)).toThrow(
      /contract/,
    );
    expect(() => checkAnswer('get', `/api/builds/${tern}/parts?pageSize=2`, ['producer'], res)).not.toThrow();
  });

  it('fail a JSON answer of a route without a contract in a file that asks for contracts', () => {
    const res = { status: 200, headers: { 'content-type': 'application/json' }, body: { any: 1 } };
    expect(() => checkAnswer('get', '/api/builds/1/no-such-resource', ['owner'], res as never)).toThrow(/No contract/);
  });

  it('know the per-role contracts of the lists', () => {
    for (const c of [UpgradePage, PartPage, RemovedPartList, BuildList]) expect(isAudiences(c)).toBe(true);
  });
});

describe('the history of a backlog record', () => {
  it("shows only the changed fields the reader's contract names: a field no contract names reaches nobody", async () => {
    const { Activity } = await import('../../server/models');
    const row = await Activity.create({
      buildId: tern,
      userId: null,
      userName: 'Contract test',
      entity: 'upgrade',
      entityId: upgradeId,
      action: 'update',
      summary: 'Changed notes and a figure no contract names',
      changes: { notes: ['a', 'b'], marginCents: [100, 200], valueAddedCents: [300, 400] },
    });
    const readAs = async (role: DemoRole) => {
      const res = await as[role].get(`/api/builds/${tern}/upgrades/${upgradeId}/activity`);
      expect(res.status).toBe(200);
      return res.body.activity.find((a: { id: number }) => a.id === Number(row.id));
    };
    const producer = await readAs('producer');
    const installer = await readAs('installer');
    expect(producer.changes).toEqual({ notes: ['a', 'b'], valueAddedCents: [300, 400] });
    expect(installer.changes).toEqual({ notes: ['a', 'b'] });
    expect(JSON.stringify(installer.readable)).not.toMatch(/margin|\$1\.00|\$2\.00|\$3\.00|\$4\.00/i);
    expect(JSON.stringify(producer.readable)).not.toMatch(/margin|\$1\.00|\$2\.00/i);
  });
});
