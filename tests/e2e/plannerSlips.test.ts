// The producer sees on the planner what late parts do to the series: the part that holds the finish
// back, releases at risk, notices with an unread badge, and each episode's baseline against now.
import { describe, it, beforeAll, afterAll } from 'vitest';
import { openBrowser, signInQuick, audit, visit, startAppServer, type AppServer } from '../helpers/browser';
import { Build, Episode, Part } from '../../server/models';
import { updatePart } from '../../server/services/parts';

let server: AppServer;
let buildId: number;
beforeAll(async () => {
  server = await startAppServer();
  buildId = (await Build.findOne({ where: { slug: 'project-tern' } }))!.id;
});
afterAll(async () => {
  await server?.stop();
});

describe('slips on the planner', () => {
  it(
    'producer sees the late part behind the finish, the baseline slip, a new release at risk and its notice',
    { timeout: 150_000 },
    async () => {
      const s = await openBrowser({ server });
      const { page } = s;
      try {
        await signInQuick(s, 'producer');
        await visit(s, `/builds/${buildId}/planner`);
        // The demo's camera set (due 2026-12-29) holds the earliest finish back.
        await page
          .locator('[data-test="finish-driver"]')
          .getByText(/Held back by a late part: HT-CAM-7100/)
          .waitFor();
        // Seeder 0007: "Ready to tow" a week behind its baseline, nothing at risk yet.
        const tow = page.locator('[data-test="baseline-table"]').getByRole('row', { name: /Ready to tow/ });
        await tow.getByRole('cell', { name: '7 days later' }).first().waitFor();
        await page.getByRole('heading', { name: 'No release at risk from parts' }).waitFor();

        // The supplier pushes the charging pad past the shoot: the producer records it (as the parts screen does).
        const pad = (await Part.findOne({ where: { buildId, partNumber: 'HT-WCP-9510' } }))!;
        const build = (await Build.findByPk(buildId))!;
        const episode = (await Episode.findOne({ where: { buildId, title: 'Ready to tow' } }))!;
        const due = new Date(Date.parse(`${episode.shootDate}T00:00:00Z`) + 4 * 86_400_000).toISOString().slice(0, 10);
        await updatePart({ id: 2, name: 'Theo Okafor', roles: ['producer'] }, build, pad.id, {
          expectedArrival: due,
          version: pad.version,
        });

        await page.reload();
        await page.getByRole('heading', { name: '1 release at risk from late parts' }).waitFor();
        await page
          .getByRole('listitem')
          .filter({ hasText: 'Ready to tow' })
          .getByText(/4 days later\. Waiting on HT-WCP-9510/)
          .waitFor();
        await tow.getByRole('cell', { name: '11 days later' }).first().waitFor();
        await page.getByRole('button', { name: /Notices \(\d+ new\)/ }).click();
        await page
          .locator('#notice-list')
          .getByText(/"Ready to tow": release .* at risk by 4 days/)
          .waitFor();
        await audit(s, 'planner with slips and notices');
        await page.getByRole('button', { name: 'Mark all as seen' }).click();
        await page.getByRole('button', { name: 'Notices', exact: true }).waitFor();
      } finally {
        await s.close();
      }
    },
  );
});
