// The planner's public surface: critical path, episode planner and plan validator.
export { criticalPath, findCycle } from './criticalPath';
export type { CpmTask, CpmTimes, CriticalPathResult } from './criticalPath';
export { proposePlan, validatePlan, minimumShopDays, episodeCapacity } from './plan';
export type { MinimumShopDays } from './plan';
export { VIOLATION_KINDS } from './types';
export type {
  PlannerUpgrade,
  PlannerInput,
  FixedEpisode,
  PlanEpisode,
  Plan,
  PlanMethod,
  PlanToValidate,
  PlanViolation,
  ViolationKind,
} from './types';
