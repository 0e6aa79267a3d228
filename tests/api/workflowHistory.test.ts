// History a person can read (issue 11, "What was seen" 9): field labels and states in words, money
// formatted for the roles that may see it and absent for the rest, ids and versions left out.
import { describe, it, expect, beforeAll } from 'vitest';
import { signInAs } from '../helpers/api';
import { Build } from '../../server/models';

let tern: Build;
beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
});
type Row = { action: string; entity: string; readable: { field: string; from: string; to: string }[] };

describe('the history of an upgrade', () => {
  it('reads in words, with money formatted for the owner and absent for the installer', async () => {
    const producer = await signInAs('producer');
    const created = await producer.post(`/api/builds/${tern.id}/upgrades`).send({ title: 'Cargo net', area: 'rear' });
    expect(created.status).toBe(201);
    const upgradeId = created.body.upgrade.id as number;
    const part = await producer
      .post(`/api/builds/${tern.id}/parts`)
      .send({ upgradeId, partNumber: 'CN-100', description: 'Cargo net kit', unitCostCents: 48_900 });
    expect(part.status).toBe(201);

    const owner = await signInAs('owner');
    const rows = (await owner.get(`/api/builds/${tern.id}/upgrades/${upgradeId}/activity`)).body.activity as Row[];
    const partRow = rows.find((r) => r.entity === 'part' && r.action === 'create')!;
    // 48 900 cents are $489.00.
    expect(partRow.readable).toContainEqual({ field: 'Unit cost', from: '—', to: '$489.00' });
    const upgradeRow = rows.find((r) => r.entity === 'upgrade' && r.action === 'create')!;
    expect(upgradeRow.readable).toContainEqual({ field: 'Install segment', from: '—', to: 'Not shot' });
    expect(upgradeRow.readable).toContainEqual({ field: 'Area', from: '—', to: 'Rear' });
    const fields = rows.flatMap((r) => r.readable.map((c) => c.field));
    for (const internal of ['Build', 'Id', 'Version', 'Upgrade', 'Build id', 'Episode position'])
      expect(fields).not.toContain(internal);
    expect(JSON.stringify(rows.map((r) => r.readable))).not.toMatch(/48900|not_shot|_id|Cents/);

    const installer = await signInAs('installer');
    const seen = (await installer.get(`/api/builds/${tern.id}/upgrades/${upgradeId}/activity`)).body.activity as Row[];
    const theirs = seen.find((r) => r.entity === 'part' && r.action === 'create')!;
    expect(theirs.readable.map((c) => c.field)).not.toContain('Unit cost');
    expect(JSON.stringify(seen)).not.toContain('489');
  });
});
