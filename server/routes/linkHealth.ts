// Product links of a build: parts shown in episodes that lack a product page, and the campaign
// name their links are tagged with (mounted at /api/builds/:buildId/link-health and …/campaign).
import { buildOf } from '../middleware/build';
import { buildScopedRouter } from './buildScoped';
import { campaignSchema } from '../../shared/schemas/publishing';
import * as publishing from '../services/publishing';
import { send } from './send';
import { Campaign, LinkHealth } from '../../shared/contracts/publishing';

const ROLES = ['marketing', 'producer'] as const;

export function linkHealthRouter() {
  return buildScopedRouter().get('/', { roles: ROLES }, async (req, res) => {
    send(res, LinkHealth, await publishing.linkHealth(buildOf(req).id));
  }).router;
}

export function campaignRouter() {
  return buildScopedRouter()
    .get('/', { roles: ROLES }, async (req, res) => {
      const b = buildOf(req);
      send(res, Campaign, {
        campaign: b.campaign,
        effective: publishing.effectiveCampaign(b),
        publicPageUrl: publishing.publicPageUrl(b),
      });
    })
    .put('/', { roles: ROLES, body: campaignSchema }, async (req, res) => {
      const b = buildOf(req);
      send(res, Campaign, {
        ...(await publishing.setCampaign(req.user!, b, req.body.campaign)),
        publicPageUrl: publishing.publicPageUrl(b),
      });
    }).router;
}
