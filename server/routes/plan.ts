// The episode plan: the planner screen's data, check, proposal and apply (producer and owner).
import { Router } from 'express';
import { requireRole } from '../middleware/roles';
import { buildOf, loadBuild } from '../middleware/build';
import { validate } from '../middleware/validate';
import { planSchema, proposalSchema, undoPlanSchema } from '../../shared/schemas/episode';
import { listRevisions } from '../services/planRevisions';
import * as plan from '../services/plan';

export function planRouter() {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('producer'), loadBuild, async (req, res) => {
    res.json(await plan.planOverview(buildOf(req)));
  });
  router.get('/check', requireRole('producer'), loadBuild, async (req, res) => {
    res.json({ violations: await plan.checkPlan(buildOf(req)) });
  });
  router.post('/proposal', requireRole('producer'), loadBuild, validate(proposalSchema), async (req, res) => {
    res.json(await plan.propose(buildOf(req), req.body));
  });
  router.put('/', requireRole('producer'), loadBuild, validate(planSchema), async (req, res) => {
    res.json(await plan.applyPlan(req.user!, buildOf(req), req.body));
  });
  router.get('/revisions', requireRole('producer'), loadBuild, async (req, res) => {
    res.json({ revisions: await listRevisions(buildOf(req).id) });
  });
  router.post('/undo', requireRole('producer'), loadBuild, validate(undoPlanSchema), async (req, res) => {
    res.json(await plan.undoLastPlanChange(req.user!, buildOf(req), req.body.basedOn));
  });
  return router;
}
