// Dark mode everywhere, first half: one journey on one fresh database runs axe in light AND dark mode
// on the public pages signed out, then, as the owner (who may open them all), the builds list, the
// account and users screens and the build's planning screens (overview to media). The build's other
// screens, the drawer, a dialog and the picker: themesProductionAndOverlays.test.ts. The shared part
// (modes, audits, the printed list) is tests/helpers/themes-audit.ts.
import { describe, it } from 'vitest';
import { randomBytes } from 'node:crypto';
import { auditThemes } from '../helpers/themes-audit';
import { DEMO_EMAIL } from '../helpers/api';
import { tokenHash } from '../../server/services/viewerPrivacy';

describe('every screen in both themes: signed out, account and planning', () => {
  it('axe finds no serious violation on the signed-out, account and planning screens, in light and in dark mode', async () => {
    await auditThemes('light', async ({ app, page, b, both, bothAt, h1, go, signInAsOwner }) => {
      // An invitation of our own for the welcome page (only the token's hash is stored).
      const token = randomBytes(24).toString('base64url');
      const [marketing] = await app.db.sql<{ id: number }>(`SELECT id FROM users WHERE email = $1`, [
        DEMO_EMAIL.marketing,
      ]);
      await app.db.sql(
        `INSERT INTO invitation_links (user_id, token_hash, expires_at) VALUES ($1, $2, now() + interval '1 day')`,
        [marketing!.id, tokenHash(token)],
      );

      // ---- signed out: sign-in, the public build page, an invitation, a page that does not exist ----
      await both('sign-in', () => h1('Sign in'), false);
      await go('/b/project-tern');
      await both('public build page', () => page.getByRole('heading', { name: 'Episodes you can watch' }), false);
      await go(`/welcome/${token}`);
      await both('welcome', () => page.getByText('choose the password you will sign in with'), false);
      await go('/confirm/not-a-real-token');
      await both('vote link that did not work', () => h1('This link did not work'), false);
      await go('/no-such-page');
      await both('not found', () => h1('Nothing here'), false);

      // ---- sign in as the owner, through the form ----
      await signInAsOwner();
      await bothAt([
        ['builds', '/builds', () => page.getByRole('link', { name: 'Open the backlog of Project Tern' })],
        ['account', '/account', () => page.getByRole('heading', { name: 'Change password' })],
        ['users', '/users', () => page.getByRole('cell', { name: DEMO_EMAIL.installer })],
        ['overview', `${b}/overview`, () => page.locator('[data-test="figure-net"]')],
        ['build report', `${b}/report`, () => page.getByRole('heading', { name: 'Earned value' })],
        [
          'backlog',
          `${b}/backlog`,
          () => page.locator('[data-test^="open-"]', { hasText: 'Projector LED headlamps' }).first(),
        ],
        ['parts', `${b}/parts`, () => page.locator('[data-test^="part-"]').first()],
        ['media', `${b}/media`, () => page.locator('[data-test="media-thumb"]').first()],
      ]);
    });
  });
});
