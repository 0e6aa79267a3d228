// Backlog and parts CSV (services/csv/*): export, import preview, all-or-nothing writes with every
// bad row reported by line and field, and the round trip export → import into an empty build.
import { describe, it, expect, beforeAll } from 'vitest';
import Papa from 'papaparse';
import { anonymous, agentsByRole } from '../helpers/api';
import { counts } from '../helpers/db';
import { Build } from '../../server/models';

let tern: number;
let as: Awaited<ReturnType<typeof agentsByRole>>;
const TABLES = ['upgrades', 'upgrade_prerequisites', 'parts', 'activities'];

async function emptyBuild(slug: string) {
  const res = await as.owner
    .post('/api/builds')
    .send({ slug, name: slug, year: 2019, make: 'Halvorsen', model: 'Tern' });
  expect(res.status).toBe(201);
  return res.body.build.id as number;
}
const postCsv = (path: string, text: string) => as.producer.post(path).set('Content-Type', 'text/csv').send(text);
const csvText = (res: { text: string }) => res.text;

beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
  as = await agentsByRole();
});

describe('export', () => {
  it('GET /upgrades.csv answers every upgrade with refs for prerequisites', async () => {
    const res = await as.producer.get(`/api/builds/${tern}/upgrades.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toContain('project-tern-backlog.csv');
    const rows = Papa.parse<Record<string, string>>(csvText(res), { header: true, skipEmptyLines: true }).data;
    expect(rows.length).toBeGreaterThanOrEqual(24);
    const wiring = rows.find((r) => r.title === 'Trailer wiring, 7-pin')!;
    const hitch = rows.find((r) => r.title === 'Class III hitch receiver')!;
    expect(wiring.prerequisites).toBe(hitch.ref);
    expect(rows.find((r) => r.title === 'Projector LED headlamps')!.valueAdded).toBe('1400.00');
  });
  it('installer and marketing get 403, anonymous 401', async () => {
    expect((await anonymous().get(`/api/builds/${tern}/parts.csv`)).status).toBe(401);
    for (const r of ['installer', 'marketing'] as const) {
      expect((await as[r].get(`/api/builds/${tern}/upgrades.csv`)).status).toBe(403);
      expect((await as[r].get(`/api/builds/${tern}/parts.csv`)).status).toBe(403);
      expect(
        (
          await as[r]
            .post(`/api/builds/${tern}/upgrades/import`)
            .set('Content-Type', 'text/csv')
            .send('title,area\nx,front\n')
        ).status,
      ).toBe(403);
    }
  });
});

describe('round trip', () => {
  it('export → import into an empty build gives the same backlog and parts', async () => {
    const backlog = csvText(await as.producer.get(`/api/builds/${tern}/upgrades.csv`));
    const parts = csvText(await as.producer.get(`/api/builds/${tern}/parts.csv`));
    const copy = await emptyBuild('round-trip');

    const before = await counts(...TABLES);
    const preview = await postCsv(`/api/builds/${copy}/upgrades/import?dryRun=1`, backlog);
    expect(preview.status).toBe(200);
    expect(preview.body.ok).toBe(true);
    expect(preview.body.errors).toEqual([]);
    expect(preview.body.rows.length).toBeGreaterThanOrEqual(24);
    expect(await counts(...TABLES)).toEqual(before); // a preview writes nothing

    const imported = await postCsv(`/api/builds/${copy}/upgrades/import`, backlog);
    expect(imported.status).toBe(201);
    expect(imported.body.created).toBe(preview.body.rows.length);
    const partsImport = await postCsv(`/api/builds/${copy}/parts/import`, parts);
    expect(partsImport.status, JSON.stringify(partsImport.body.errors)).toBe(201);

    expect(csvText(await as.producer.get(`/api/builds/${copy}/upgrades.csv`))).toBe(backlog);
    expect(csvText(await as.producer.get(`/api/builds/${copy}/parts.csv`))).toBe(parts);
    const after = await counts(...TABLES);
    expect(after.upgrades - before.upgrades).toBe(preview.body.rows.length);
    expect(after.upgrade_prerequisites - before.upgrade_prerequisites).toBeGreaterThanOrEqual(8);
  });
});

describe('spreadsheet formulas', () => {
  it('a title that looks like a formula is exported as text and comes back unchanged', async () => {
    const build = await emptyBuild('formula');
    const created = await as.producer
      .post(`/api/builds/${build}/upgrades`)
      .send({ title: '=HYPERLINK("x")', area: 'front' });
    expect(created.status).toBe(201);
    const text = csvText(await as.producer.get(`/api/builds/${build}/upgrades.csv`));
    expect(text).toContain(`"'=HYPERLINK(""x"")"`);
    const copy = await emptyBuild('formula-copy');
    expect((await postCsv(`/api/builds/${copy}/upgrades/import`, text)).status).toBe(201);
    const list = await as.producer.get(`/api/builds/${copy}/upgrades`);
    expect(list.body.upgrades[0].title).toBe('=HYPERLINK("x")');
  });
});

describe('import errors', () => {
  it('reports every bad row with line, field and reason, and writes nothing', async () => {
    const build = await emptyBuild('bad-import');
    const text = [
      'ref,title,area,estimatedHours,valueAdded,priority,safetyFlags,installedOn,tireTo,prerequisites',
      'A,Good row,front,2,100.00,3,,,,',
      'B,,front,2,,3,,,,', // line 3: no title
      'C,Bad area,roof,2,,3,,,,', // line 4
      'D,Negative money,cabin,-1,-5.00,3,,,,', // line 5: hours and money
      '',
      'E,Bad flag,cabin,1,,7,fire,2026-13-01,20 inch,Z', // line 7: priority, flag, date, tire, unknown prerequisite
      'A,Duplicate ref,rear,1,,3,,,,', // line 8
    ].join('\n');
    const before = await counts(...TABLES);
    const res = await postCsv(`/api/builds/${build}/upgrades/import`, text);
    expect(res.status).toBe(400);
    expect(res.body.ok).toBe(false);
    expect(res.body.error.code).toBe('bad_csv');
    const seen = res.body.errors.map((e: { line: number; field: string }) => `${e.line}:${e.field}`);
    expect(seen).toEqual(
      expect.arrayContaining([
        '3:title',
        '4:area',
        '5:estimatedHours',
        '5:valueAdded',
        '7:priority',
        '7:safetyFlags',
        '7:installedOn',
        '7:tireTo',
        '7:prerequisites',
        '8:ref',
      ]),
    );
    expect(seen).not.toContain('2:title');
    expect(res.body.errors.every((e: { message: string }) => e.message.length > 0)).toBe(true);
    expect(await counts(...TABLES)).toEqual(before);

    const dry = await postCsv(`/api/builds/${build}/upgrades/import?dryRun=1`, text);
    expect(dry.status).toBe(200);
    expect(dry.body.ok).toBe(false);
    expect(dry.body.errors).toEqual(res.body.errors);
  });
  it('refuses a loop of prerequisites among the rows, naming them', async () => {
    const build = await emptyBuild('loop-import');
    const text = 'ref,title,area,prerequisites\nA,Alpha,front,C\nB,Beta,front,A\nC,Gamma,front,B\n';
    const res = await postCsv(`/api/builds/${build}/upgrades/import`, text);
    expect(res.status).toBe(400);
    const loop = res.body.errors.find((e: { field: string }) => e.field === 'prerequisites');
    expect(loop.message).toContain('Alpha');
    expect(loop.message).toContain('Gamma');
  });
  it('refuses unknown and missing columns on line 1', async () => {
    const build = await emptyBuild('header-import');
    const res = await postCsv(`/api/builds/${build}/upgrades/import?dryRun=1`, 'title,colour\nX,red\n');
    expect(res.body.ok).toBe(false);
    expect(res.body.errors).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ line: 1, field: 'colour' }),
        expect.objectContaining({ line: 1, field: 'area' }),
      ]),
    );
  });
  it('parts rows must name an upgrade of the build and carry valid money', async () => {
    const before = await counts(...TABLES);
    const text =
      'upgrade,partNumber,description,quantity,unitCost,state\nPower liftgate,HT-1,Strut,2,10.00,ordered\nNo such upgrade,HT-2,Thing,1,1.00,ordered\nPower liftgate,HT-3,Thing,0,-1.00,lost\n';
    const res = await postCsv(`/api/builds/${tern}/parts/import`, text);
    expect(res.status).toBe(400);
    const seen = res.body.errors.map((e: { line: number; field: string }) => `${e.line}:${e.field}`);
    expect(seen).toEqual(expect.arrayContaining(['3:upgrade', '4:quantity', '4:unitCost', '4:state']));
    expect(await counts(...TABLES)).toEqual(before);
    const ok = await postCsv(`/api/builds/${tern}/parts/import`, text.split('\n').slice(0, 2).join('\n'));
    expect(ok.status).toBe(201);
    expect((await counts('parts')).parts).toBe(before.parts + 1);
  });
  it('a JSON body answers 415', async () => {
    const res = await as.producer.post(`/api/builds/${tern}/upgrades/import`).send({ rows: [] });
    expect(res.status).toBe(415);
  });
});
