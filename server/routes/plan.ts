// The episode plan: the planner screen's data, check, proposal and apply (producer and owner).
import { buildOf } from '../middleware/build';
import { buildScopedRouter } from './buildScoped';
import { planSchema, proposalSchema, undoPlanSchema } from '../../shared/schemas/episode';
import { listRevisions } from '../services/planRevisions';
import * as plan from '../services/plan';
import { applyPlan, undoLastPlanChange } from '../services/planApply';
import { send } from './send';
import {
  PlanApplied,
  PlanCheck,
  PlanOverview,
  PlanRevisions,
  PlanUndone,
  ProposalAnswer,
} from '../../shared/contracts/plan';

const producer = { roles: ['producer'] } as const;

export function planRouter() {
  return buildScopedRouter()
    .get('/', producer, async (req, res) => {
      send(res, PlanOverview, await plan.planOverview(buildOf(req)));
    })
    .get('/check', producer, async (req, res) => {
      send(res, PlanCheck, { violations: await plan.checkPlan(buildOf(req)) });
    })
    .post('/proposal', { ...producer, body: proposalSchema }, async (req, res) => {
      send(res, ProposalAnswer, await plan.propose(buildOf(req), req.body));
    })
    .put('/', { ...producer, body: planSchema }, async (req, res) => {
      send(res, PlanApplied, await applyPlan(req.user!, buildOf(req), req.body));
    })
    .get('/revisions', producer, async (req, res) => {
      send(res, PlanRevisions, { revisions: await listRevisions(buildOf(req).id) });
    })
    .post('/undo', { ...producer, body: undoPlanSchema }, async (req, res) => {
      send(res, PlanUndone, await undoLastPlanChange(req.user!, buildOf(req), req.body.basedOn));
    }).router;
}
