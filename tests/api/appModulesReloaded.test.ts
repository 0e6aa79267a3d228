// The app's modules loaded a second time in one process (as a test runner that reuses its workers
// does) make a second app that signs people in through its own database layer, not the first one's.
import { describe, expect, it, vi } from 'vitest';
import request from 'supertest';
import { DEMO_EMAIL, DEMO_PASSWORD } from '../helpers/api';

async function loadApp() {
  vi.resetModules();
  const { createApp } = await import('../../server/app');
  const { sequelize } = await import('../../server/models');
  return { app: createApp(), sequelize };
}

describe('an app made after its modules were loaded again', () => {
  it('looks up the signed-in person with its own database layer', async () => {
    const first = await loadApp();
    // The first app is done with: its database layer is closed, as at the end of a test file.
    await first.sequelize.close();
    const second = await loadApp();
    try {
      const agent = request.agent(second.app).set('X-Requested-With', 'Bayslate');
      const login = await agent.post('/api/auth/login').send({ email: DEMO_EMAIL.owner, password: DEMO_PASSWORD });
      expect(login.status).toBe(200);
      // Before each app had a passport of its own, the first app's look-up answered here: 500.
      const me = await agent.get('/api/auth/me');
      expect(me.status).toBe(200);
      expect(me.body.user.email).toBe(DEMO_EMAIL.owner);
    } finally {
      await second.sequelize.close();
    }
  });
});
