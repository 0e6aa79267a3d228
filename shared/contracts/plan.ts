// Contracts of the episode plan (/api/builds/:buildId/plan, producer and owner): the planner
// screen's data, the check, a proposal with its differences, apply, undo and the revision list.
// The planner's own output (shared/planner) is typed against these by the routes that send it.
import { z } from 'zod';
import { AREAS, EPISODE_STATES, INSTALL_STATES } from '../domain';
import { VIOLATION_KINDS } from '../planner/types';
import { day, idNumber, timestamp, type RouteTable } from './common';
import { Episode } from './episode';

const hours = z.number().min(0);
const titled = z.object({ id: idNumber, title: z.string() });

export const PlanViolation = z.object({
  kind: z.enum(VIOLATION_KINDS),
  message: z.string(),
  upgradeIds: z.array(idNumber),
  episodeNumbers: z.array(z.number().int()),
});
export type PlanViolation = z.infer<typeof PlanViolation>;

/** An upgrade as the planner reads it (no money). */
export const PlanUpgrade = z.object({
  id: idNumber,
  title: z.string(),
  area: z.enum(AREAS),
  estimatedHours: hours,
  priority: z.number().int(),
  installState: z.enum(INSTALL_STATES),
  episodeId: idNumber.nullable(),
  episodePosition: z.number().int().nullable(),
  partsDueDate: day.nullable(),
  /** Parts still to come without an expected arrival (the planner cannot wait for them). */
  partsUndated: z.number().int().min(0),
  prerequisiteIds: z.array(idNumber),
});
export type PlanUpgrade = z.infer<typeof PlanUpgrade>;

/** The planner's input, so the screen checks a draft with the same rules (shared/planner). */
export const PlannerInputOut = z.object({
  startDate: day,
  shootHoursPerEpisode: hours,
  releaseCadenceDays: z.number().int(),
  shopHoursPerWeek: hours,
  upgrades: z.array(
    z.object({
      id: idNumber,
      title: z.string(),
      area: z.enum(AREAS),
      estimatedHours: hours,
      priority: z.number().int(),
      votes: z.number().int().min(0),
      installState: z.enum(INSTALL_STATES),
      partsDueDate: day.nullable(),
      prerequisiteIds: z.array(idNumber),
      fixedEpisode: z.number().int().nullable().optional(),
    }),
  ),
  fixedEpisodes: z
    .array(
      z.object({
        number: z.number().int(),
        shootDate: day.nullable(),
        releaseDate: day.nullable(),
        upgradeIds: z.array(idNumber),
      }),
    )
    .optional(),
});

export const CriticalSummary = z.object({
  hours,
  days: z.number().min(0),
  hoursPerDay: hours,
  /** What sets the earliest finish: a part the bay must wait for, or the hours of work themselves. */
  limitedBy: z.enum(['parts', 'hours']),
  critical: z.array(titled),
  /** The late part that opens the last stretch of work, when there is one. */
  drivingPart: z
    .object({
      upgradeId: idNumber,
      upgradeTitle: z.string(),
      partId: idNumber,
      partNumber: z.string(),
      description: z.string(),
      expectedArrival: day,
    })
    .nullable(),
  earliestFinish: day,
});
export type CriticalSummary = z.infer<typeof CriticalSummary>;

export const PlanOverview = z.object({
  /** The plan version changes are made from (PUT and undo send it back as basedOn). */
  planVersion: z.number().int().min(0),
  /** The applied change "Undo" would take back, if any. */
  undo: z
    .object({ number: z.number().int(), summary: z.string(), userName: z.string().nullable(), createdAt: timestamp })
    .nullable(),
  episodes: z.array(Episode),
  upgrades: z.array(PlanUpgrade),
  input: PlannerInputOut,
  violations: z.array(PlanViolation),
  criticalPath: CriticalSummary.nullable(),
  capacityHours: hours,
});
export type PlanOverview = z.infer<typeof PlanOverview>;

export const PlanCheck = z.object({ violations: z.array(PlanViolation) });
export type PlanCheck = z.infer<typeof PlanCheck>;

export const ProposedEpisode = z.object({
  /** An existing episode the proposal reuses; null for a new one. */
  id: idNumber.nullable(),
  number: z.number().int().positive(),
  title: z.string(),
  state: z.enum(EPISODE_STATES).nullable(),
  shootDate: day.nullable(),
  releaseDate: day.nullable(),
  area: z.enum(AREAS).nullable(),
  hours,
  upgradeIds: z.array(idNumber),
  locked: z.boolean(),
  oversize: z.boolean(),
});
export type ProposedEpisode = z.infer<typeof ProposedEpisode>;

const place = z
  .object({ episodeId: idNumber.nullable(), number: z.number().int(), position: z.number().int().min(0) })
  .nullable();
export const PlanDifference = z.object({
  upgradeId: idNumber,
  title: z.string(),
  kind: z.enum(['moved', 'reordered', 'added', 'removed']),
  from: place,
  to: place,
});
export type PlanDifference = z.infer<typeof PlanDifference>;

const datePair = z.tuple([day.nullable(), day.nullable()]).nullable();
/** What a plan change does (shared/planChange.ts). */
export const PlanChangeSummaryOut = z.object({
  moved: z.array(
    z.object({
      upgradeId: idNumber,
      title: z.string(),
      from: z.number().int().nullable(),
      to: z.number().int().nullable(),
    }),
  ),
  episodesChanged: z.array(
    z.object({
      id: idNumber.nullable(),
      number: z.number().int(),
      title: z.string(),
      added: z.array(z.string()),
      removed: z.array(z.string()),
      isNew: z.boolean(),
    }),
  ),
  dateChanges: z.array(
    z.object({
      id: idNumber,
      number: z.number().int(),
      title: z.string(),
      state: z.string().nullable(),
      shootDate: datePair,
      releaseDate: datePair,
    }),
  ),
});

export const ProposalAnswer = z.object({
  planVersion: z.number().int().min(0),
  summary: PlanChangeSummaryOut,
  proposal: z.object({
    episodes: z.array(ProposedEpisode),
    forecastFinish: day.nullable(),
    buildDoneDate: day.nullable(),
    /** Which rule ordered the proposal: priorities and votes, or longest chain first (when that finishes earlier). */
    method: z.enum(['priority', 'chain']),
    capacityHours: hours,
    unplaced: z.array(titled),
    violations: z.array(PlanViolation),
  }),
  current: z.object({ episodes: z.array(Episode), violations: z.array(PlanViolation) }),
  differences: z.array(PlanDifference),
});
export type ProposalAnswer = z.infer<typeof ProposalAnswer>;

export const PlanApplied = z.object({
  episodes: z.array(Episode),
  violations: z.array(PlanViolation),
  planVersion: z.number().int().min(0),
});
export type PlanApplied = z.infer<typeof PlanApplied>;

export const PlanUndone = z.object({
  episodes: z.array(Episode),
  planVersion: z.number().int().min(0),
  undone: z.object({ number: z.number().int(), summary: z.string() }),
});
export type PlanUndone = z.infer<typeof PlanUndone>;

export const PlanRevisions = z.object({
  revisions: z.array(
    z.object({
      number: z.number().int(),
      kind: z.enum(['apply', 'undo']),
      summary: z.string(),
      userName: z.string().nullable(),
      createdAt: timestamp,
      undone: z.boolean(),
    }),
  ),
});
export type PlanRevisions = z.infer<typeof PlanRevisions>;

export const planRoutes = {
  'GET /api/builds/:buildId/plan': PlanOverview,
  'GET /api/builds/:buildId/plan/check': PlanCheck,
  'POST /api/builds/:buildId/plan/proposal': ProposalAnswer,
  'PUT /api/builds/:buildId/plan': PlanApplied,
  'GET /api/builds/:buildId/plan/revisions': PlanRevisions,
  'POST /api/builds/:buildId/plan/undo': PlanUndone,
} satisfies RouteTable;
