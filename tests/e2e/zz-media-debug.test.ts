import { it } from 'vitest';
import { startAppServer } from '../helpers/browser';
it('debug', async () => {
  const s = await startAppServer();
  const r = await fetch(s.url + '/sign-in');
  console.log('STATUS', r.status, r.headers.get('content-type'), (await r.text()).slice(0, 300));
  const h = await fetch(s.url + '/api/health');
  console.log('HEALTH', await h.text());
  console.log('OUT', s.output());
  await s.stop();
});
