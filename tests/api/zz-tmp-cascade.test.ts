import { it, expect } from 'vitest';
import { Build, ViewerRequest, sequelize } from '../../server/models';
it('deleting a build with merged requests works', async () => {
  const b = await Build.create({ slug: 'cascade-x', name: 'X', year: 2020, make: 'H', model: 'S', vin: null, mileage: null, budgetCents: 1, labourRateCents: 1, campaign: null, summary: null });
  const t = await ViewerRequest.create({ buildId: b.id, title: 'Target', details: null, confirmedAt: new Date() });
  await ViewerRequest.create({ buildId: b.id, title: 'Dup', details: null, confirmedAt: new Date(), state: 'merged', mergedIntoId: t.id });
  await sequelize.query('DELETE FROM builds WHERE id = :id', { replacements: { id: b.id } });
  expect(await ViewerRequest.count({ where: { buildId: b.id } })).toBe(0);
});
