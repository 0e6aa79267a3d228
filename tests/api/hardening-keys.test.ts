// Keys of viewers' address hashes and unsubscribe links (issue 10): derived from VIEWER_KEY_SECRET
// with HKDF and a label per purpose, not from the session secret; links mailed before the change
// keep working after migration 0014.
import { describe, it, expect } from 'vitest';
import { createHash, createHmac, hkdfSync } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { anonymous } from '../helpers/api';
import { sequelize, Build, ViewerRequest, ViewerVote } from '../../server/models';
import { config } from '../../server/config';
import { emailHash, legacyEmailHash, newToken, unsubscribeToken } from '../../server/services/viewerPrivacy';
import { rekeyViewerHashes } from '../../server/db/migrations/0014-viewer-keys';

// The derivation before issue 10, written out here: SHA-256 of purpose and session secret.
const oldKey = (purpose: string) =>
  createHash('sha256').update(`bayslate:${purpose}:${config().SESSION_SECRET}`).digest();
const oldHash = (email: string) => createHmac('sha256', oldKey('email')).update(email).digest('hex');
const oldUnsubscribeToken = (hash: string) =>
  `${hash}.${createHmac('sha256', oldKey('unsubscribe')).update(hash).digest('hex').slice(0, 32)}`;

describe('viewer keys', () => {
  it('address hashes come from the viewer key secret by HKDF (RFC 5869), not from the session secret', () => {
    const email = 'kestrel@viewers.test';
    // HKDF-SHA-256 with salt "bayslate-viewer-keys" and info "bayslate/email-hash", 32 bytes.
    const k = Buffer.from(
      hkdfSync('sha256', config().viewerKeySecret, 'bayslate-viewer-keys', 'bayslate/email-hash', 32),
    );
    expect(emailHash(email)).toBe(createHmac('sha256', k).update(email).digest('hex'));
    expect(emailHash(email)).not.toBe(oldHash(email));
    expect(legacyEmailHash(email)).toBe(oldHash(email));
    const session = config().SESSION_SECRET;
    try {
      (config() as { SESSION_SECRET: string }).SESSION_SECRET = 'another-session-secret-entirely';
      expect(emailHash(email)).toBe(createHmac('sha256', k).update(email).digest('hex'));
    } finally {
      (config() as { SESSION_SECRET: string }).SESSION_SECRET = session;
    }
  });

  it('after the migration, a vote keeps counting once and an unsubscribe link mailed before it still works', async () => {
    const build = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
    const email = 'old-link@viewers.test';
    const before = oldHash(email);
    const r = await ViewerRequest.create({
      buildId: build.id,
      title: 'Before the key change',
      details: null,
      confirmedAt: new Date(),
    });
    const v = await ViewerVote.create({
      requestId: r.id,
      emailHash: before,
      emailSealed: null,
      email,
      name: null,
      confirmTokenHash: newToken().hash,
      expiresAt: new Date(),
      confirmedAt: new Date(),
    });

    expect(await rekeyViewerHashes(sequelize)).toBeGreaterThanOrEqual(1);
    await v.reload();
    expect(v.emailHash).toBe(emailHash(email));

    // The link from an "it is live" mail sent before the change.
    const res = await anonymous().get(`/api/public/unsubscribe/${oldUnsubscribeToken(before)}`);
    expect(res.status).toBe(200);
    await v.reload();
    expect(v.email).toBeNull();
    const unsub = await sequelize.query<{ email_hash: string }>(
      `SELECT email_hash FROM unsubscribes WHERE email_hash IN (:hashes)`,
      { replacements: { hashes: [before, emailHash(email)] }, type: QueryTypes.SELECT },
    );
    expect(unsub.map((u) => u.email_hash)).toEqual([emailHash(email)]);

    // New links use the new key, and a forged signature is refused.
    expect(
      (await anonymous().get(`/api/public/unsubscribe/${unsubscribeToken(emailHash('new@viewers.test'))}`)).status,
    ).toBe(200);
    expect(
      (await anonymous().get(`/api/public/unsubscribe/${emailHash('x@viewers.test')}.${'0'.repeat(32)}`)).status,
    ).toBe(404);
  });
});
