// Messages a person can act on (issue 11, "What was seen" 10): every validation message names the
// field in words and says what is expected; no raw schema text reaches a person, on the server,
// in the shared schemas the forms use, and in CSV import.
import { describe, it, expect, beforeAll } from 'vitest';
import { signInAs } from '../helpers/api';
import { Build } from '../../server/models';
import { createUpgradeSchema } from '../../shared/schemas/upgrade';
import { describeIssue, fieldLabel, issueWords, RAW_SCHEMA_TEXT } from '../../shared/schemas/errorMap';

let tern: Build;
beforeAll(async () => {
  tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
});

describe('the shared error map', () => {
  it('words the issues zod raises without a message of its own', () => {
    // Expected texts written out by hand from the rule "field in words: what is expected".
    expect(issueWords({ code: 'invalid_value', values: ['front', 'sides', 'rear'] })).toBe(
      'choose one of Front, Sides, Rear',
    );
    expect(issueWords({ code: 'invalid_type', expected: 'number', input: 'abc' })).toBe('enter a number');
    expect(issueWords({ code: 'invalid_type', expected: 'string', input: undefined })).toBe('is required');
    expect(issueWords({ code: 'too_big', origin: 'string', maximum: 140 })).toBe('at most 140 characters');
    expect(issueWords({ code: 'unrecognized_keys', keys: ['colour'] })).toBe(
      'is not something this form takes (colour)',
    );
    expect(fieldLabel(['unitCostCents'])).toBe('Unit cost');
    expect(fieldLabel(['chapters', 2, 'title'])).toBe('Chapters, row 3: title');
    expect(fieldLabel(['installSegment'])).toBe('Install segment');
  });

  it('the form schema gives "Area: choose one of Front, Sides, …" and "Estimated hours: enter a number"', () => {
    const r = createUpgradeSchema.safeParse({ title: 'Roof box', area: 'roof', estimatedHours: 'three' });
    expect(r.success).toBe(false);
    const lines = r.error!.issues.map((i) => describeIssue(i));
    expect(lines).toContain('Area: choose one of Front, Sides, Rear, Cabin, Electrical, Wheels & chassis');
    expect(lines).toContain('Estimated hours: enter a number');
    for (const l of lines) expect(l).not.toMatch(RAW_SCHEMA_TEXT);
  });
});

describe('on the server', () => {
  it('a bad upgrade answers 400 naming each field in words and what is expected, with no raw schema text', async () => {
    const producer = await signInAs('producer');
    const res = await producer
      .post(`/api/builds/${tern.id}/upgrades`)
      .send({ title: 'Roof box', area: 'roof', estimatedHours: 'three', colour: 'red' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toContain(
      'Area: choose one of Front, Sides, Rear, Cabin, Electrical, Wheels & chassis',
    );
    expect(res.body.error.message).toContain('Estimated hours: enter a number');
    const area = res.body.error.fields.find((f: { path: string }) => f.path === 'area');
    expect(area).toEqual({
      path: 'area',
      label: 'Area',
      message: 'choose one of Front, Sides, Rear, Cabin, Electrical, Wheels & chassis',
    });
    expect(JSON.stringify(res.body)).not.toMatch(RAW_SCHEMA_TEXT);
  });

  it('a hand-made field error from a service is worded too', async () => {
    const producer = await signInAs('producer');
    const res = await producer
      .post(`/api/builds/${tern.id}/upgrades`)
      .send({ title: 'Roof box', area: 'front', episodeId: 99_999_999 });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('Check these fields: Episode: is not an episode of this build.');
    expect(res.body.error.fields[0]).toMatchObject({ path: 'episodeId', label: 'Episode' });
  });

  it('CSV import problems say what is expected, without raw schema text', async () => {
    const producer = await signInAs('producer');
    const res = await producer
      .post(`/api/builds/${tern.id}/upgrades/import?dryRun=1`)
      .set('Content-Type', 'text/csv')
      .send('title,area,estimatedHours\nRoof box,roof,three\n');
    expect(res.status).toBe(200);
    expect(res.body.ok).toBe(false);
    const area = res.body.errors.find((e: { field: string }) => e.field === 'area');
    expect(area.message).toBe('choose one of Front, Sides, Rear, Cabin, Electrical, Wheels & chassis');
    expect(JSON.stringify(res.body)).not.toMatch(RAW_SCHEMA_TEXT);
  });
});
