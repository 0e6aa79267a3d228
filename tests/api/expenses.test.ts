// Expenses API (routes/expenses.ts): owner and producer only; installer and marketing get 403.
import { describe, it, expect, beforeAll } from 'vitest';
import { anonymous, agentsByRole } from '../helpers/api';
import { counts } from '../helpers/db';
import { Build, Expense } from '../../server/models';
import { everyAnswerHasAContract } from '../helpers/contract';

everyAnswerHasAContract();

let tern: number;
let as: Awaited<ReturnType<typeof agentsByRole>>;
const url = (s = '') => `/api/builds/${tern}/expenses${s}`;

beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  as = await agentsByRole();
});

describe('expenses', () => {
  it('owner and producer read them; installer and marketing get 403; anonymous 401', async () => {
    expect((await anonymous().get(url())).status).toBe(401);
    const res = await as.producer.get(url());
    expect(res.status).toBe(200);
    expect(res.body.expenses.length).toBeGreaterThan(5);
    expect(res.body.expenses[0].amountCents).toBeGreaterThan(0);
    for (const r of ['installer', 'marketing'] as const) expect((await as[r].get(url())).status).toBe(403);
  });
  it('producer adds, changes and deletes an expense, each recorded', async () => {
    const before = await counts('expenses', 'activities');
    const c = await as.producer
      .post(url())
      .send({ description: 'Zip ties', amountCents: 1299, spentOn: '2026-11-30', category: 'consumables' });
    expect(c.status).toBe(201);
    const p = await as.producer.patch(url(`/${c.body.expense.id}`)).send({ amountCents: 1499 });
    expect(p.body.expense.amountCents).toBe(1499);
    expect((await as.installer.delete(url(`/${c.body.expense.id}`))).status).toBe(403);
    expect((await as.owner.delete(url(`/${c.body.expense.id}`))).status).toBe(204);
    expect(await counts('expenses', 'activities')).toEqual({
      expenses: before.expenses,
      activities: before.activities + 3,
    });
  });
  it.each([
    ['amountCents', { amountCents: -1 }],
    ['amountCents', { amountCents: '12.00' }],
    ['spentOn', { spentOn: 'yesterday' }],
    ['description', { description: '' }],
    ['category', { category: 'x'.repeat(61) }],
  ])('bad %s answers 400 naming it, nothing written', async (field, over) => {
    const before = await counts('expenses', 'activities');
    const res = await as.producer
      .post(url())
      .send({ description: 'Bad', amountCents: 100, spentOn: '2026-11-30', ...over });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(field);
    expect(await counts('expenses', 'activities')).toEqual(before);
  });
  it('another build’s expense answers 404', async () => {
    const other = await Build.create({
      slug: 'expenses-other',
      name: 'Other',
      year: 2020,
      make: 'Halvorsen',
      model: 'Skua',
      vin: null,
      mileage: null,
      budgetCents: null,
      labourRateCents: null,
      campaign: null,
      summary: null,
    });
    const e = await Expense.create({
      buildId: other.id,
      upgradeId: null,
      description: 'Other',
      amountCents: 1,
      spentOn: '2026-11-30',
      category: null,
    });
    expect((await as.producer.patch(url(`/${e.id}`)).send({ amountCents: 2 })).status).toBe(404);
    expect((await as.producer.delete(url(`/${e.id}`))).status).toBe(404);
    expect((await Expense.findByPk(e.id))!.amountCents).toBe(1);
  });
});
