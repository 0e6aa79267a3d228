// Each demo role signs in through the form, sees its own navigation, and signs out.
import { describe, it, expect } from 'vitest';
import { openBrowser, signIn, audit, type BrowserSession } from '../helpers/browser';
import { freshAppPerTest } from '../helpers/fresh-db';
import { outcomeOf } from '../helpers/outcome';
import type { DemoRole } from '../helpers/api';

// Each test runs on a database of its own, cloned from the template as it starts.
const app = freshAppPerTest();

const expectations: Record<DemoRole, { sees: string[]; hidden: string[] }> = {
  owner: { sees: ['Builds', 'Users & roles', 'My account'], hidden: [] },
  producer: { sees: ['Builds', 'My account'], hidden: ['Users & roles'] },
  installer: { sees: ['Builds', 'My account'], hidden: ['Users & roles'] },
  marketing: { sees: ['Builds', 'My account'], hidden: ['Users & roles'] },
};

describe('sign-in in the browser', () => {
  for (const role of Object.keys(expectations) as DemoRole[]) {
    it(`${role} signs in, sees their navigation and signs out`, async () => {
      const s: BrowserSession = await openBrowser({ server: app().server });
      try {
        await signIn(s, role);
        const nav = s.page.getByRole('navigation', { name: 'Main navigation' });
        for (const label of expectations[role].sees) await nav.getByRole('link', { name: label }).waitFor();
        for (const label of expectations[role].hidden)
          expect(await nav.getByRole('link', { name: label }).count()).toBe(0);
        if (role === 'owner') {
          await nav.getByRole('link', { name: 'Users & roles' }).click();
          await s.page.getByRole('heading', { name: 'Users & roles' }).waitFor();
          await s.page.getByText('installer@cedar-ridge.test').waitFor();
          await audit(s);
        }
        await s.page.getByRole('button', { name: 'Sign out' }).click();
        await s.page.waitForURL(/\/sign-in/);
        await s.page.getByRole('heading', { name: 'Sign in' }).waitFor();
        // Signed out for real: a signed-in page sends the person back to sign-in.
        await s.page.goto(`${s.server.url}/builds`);
        await s.page.waitForURL(/\/sign-in/);
      } finally {
        await s.close();
      }
    });
  }

  it('the owner adds a person with roles, then deactivates them after confirming', async () => {
    const s = await openBrowser({ server: app().server });
    try {
      await signIn(s, 'owner');
      await s.page.getByRole('link', { name: 'Users & roles' }).click();
      await s.page.getByRole('button', { name: 'Add a person' }).click();
      const dialog = s.page.getByRole('dialog', { name: 'Add a person' });
      await dialog.waitFor();
      await audit(s, 'add a person');
      await dialog.getByRole('button', { name: 'Add', exact: true }).click();
      await dialog.getByText('is required').first().waitFor();
      await dialog.getByLabel('Name').fill('Pia Sandoval');
      await dialog.getByLabel('E-mail').fill('pia@cedar-ridge.test');
      await dialog.getByRole('checkbox', { name: 'installer' }).click();
      await outcomeOf(s.page, () => dialog.getByRole('button', { name: 'Add', exact: true }).click(), {
        request: { method: 'POST', path: '/api/users' },
      });
      await dialog.getByText('Temporary password').waitFor();
      await dialog.getByRole('button', { name: 'Close' }).click();
      const row = s.page.getByRole('row').filter({ hasText: 'pia@cedar-ridge.test' });
      await row.waitFor();
      await row.getByRole('button', { name: 'Deactivate' }).click();
      await s.page.getByRole('dialog', { name: 'Deactivate Pia Sandoval?' }).waitFor();
      await audit(s, 'deactivate confirmation');
      await outcomeOf(s.page, () => s.page.getByRole('button', { name: 'Deactivate', exact: true }).last().click(), {
        request: { method: 'PATCH', path: /^\/api\/users\/\d+$/ },
      });
      await row.getByText('Deactivated').waitFor();
      await s.page.getByRole('link', { name: 'My account' }).click();
      await s.page.getByRole('heading', { name: 'Change password' }).waitFor();
      await audit(s, 'my account');
    } finally {
      await s.close();
    }
  });

  it('a wrong password shows a message and stays on sign-in', async () => {
    const s = await openBrowser({ server: app().server });
    try {
      await s.page.goto(`${s.server.url}/sign-in`);
      await s.page.getByLabel('E-mail').fill('owner@cedar-ridge.test');
      await s.page.getByLabel('Password', { exact: true }).fill('wrong-password');
      await outcomeOf(s.page, () => s.page.getByRole('button', { name: 'Sign in' }).click(), {
        request: { method: 'POST', path: '/api/auth/login', status: 401 },
      });
      await s.page.getByRole('alert').filter({ hasText: 'do not match' }).waitFor();
      expect(new URL(s.page.url()).pathname).toBe('/sign-in');
      await audit(s);
    } finally {
      await s.close();
    }
  });

  it('works at phone width: the menu opens and offers sign-out', async () => {
    const s = await openBrowser({ server: app().server, phone: true });
    try {
      await signIn(s, 'installer');
      await s.page.getByRole('button', { name: 'Open the menu' }).click();
      await s.page.getByRole('button', { name: 'Sign out' }).last().click();
      await s.page.waitForURL(/\/sign-in/);
    } finally {
      await s.close();
    }
  });
});
