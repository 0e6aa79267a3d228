// Product links of a build: parts shown in episodes that lack a product page, and the campaign
// name their links are tagged with (mounted at /api/builds/:buildId/link-health and …/campaign).
import { Router } from 'express';
import { z } from 'zod';
import { loadBuild, buildOf } from '../middleware/build';
import { requireRole } from '../middleware/roles';
import { validate } from '../middleware/validate';
import { id } from '../../shared/schemas/common';
import { campaignSchema } from '../../shared/schemas/publishing';
import * as publishing from '../services/publishing';

const params = z.object({ buildId: id });

export function linkHealthRouter() {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('marketing', 'producer'), validate(params, 'params'), loadBuild, async (req, res) => {
    res.json(await publishing.linkHealth(buildOf(req).id));
  });
  return router;
}

export function campaignRouter() {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('marketing', 'producer'), validate(params, 'params'), loadBuild, async (req, res) => {
    const b = buildOf(req);
    res.json({ campaign: b.campaign, effective: publishing.effectiveCampaign(b), publicPageUrl: publishing.publicPageUrl(b) });
  });
  router.put('/', requireRole('marketing', 'producer'), validate(params, 'params'), loadBuild, validate(campaignSchema), async (req, res) => {
    const b = buildOf(req);
    res.json({ ...(await publishing.setCampaign(req.user!, b, req.body.campaign)), publicPageUrl: publishing.publicPageUrl(b) });
  });
  return router;
}
