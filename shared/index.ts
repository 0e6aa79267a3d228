// The shared domain: vocabulary, schemas' building blocks, and the pure computations that
// server and client both use. No Node or DOM imports below this folder.
export * from './domain';
export {
  checkVin,
  computeCheckDigit,
  modelYearsForCode,
  vinCharValue,
  VIN_WEIGHTS,
  VIN_LENGTH,
  type VinCheck,
} from './vin';
export {
  parseTireSize,
  compareTires,
  DIAMETER_WARNING_PCT,
  type TireSize,
  type TireSizeKind,
  type TireParseResult,
  type TireComparison,
  type TireCompareResult,
} from './tires';
export { SAFETY_CAUTIONS, SAFETY_DEFERRAL, cautionsFor, type SafetyCaution, type FlagCaution } from './safety';
export {
  formatChapterTime,
  parseChapterTime,
  validateChapters,
  tagProductUrl,
  slugify,
  buildShowNotes,
  MAX_CHAPTER_TITLE,
  PLATFORM_MIN_CHAPTERS,
  PLATFORM_MIN_CHAPTER_SECONDS,
  PLATFORM_MAX_DESCRIPTION,
  type ChapterInput,
  type ChapterProblem,
  type UtmTags,
  type ShowNotesPart,
  type ShowNotesUpgrade,
  type ShowNotesInput,
  type ShowNotes,
} from './showNotes';
export {
  criticalPath,
  findCycle,
  proposePlan,
  validatePlan,
  minimumShopDays,
  episodeCapacity,
  VIOLATION_KINDS,
  type CpmTask,
  type CpmTimes,
  type CriticalPathResult,
  type MinimumShopDays,
  type PlannerUpgrade,
  type PlannerInput,
  type FixedEpisode,
  type PlanEpisode,
  type Plan,
  type PlanToValidate,
  type PlanViolation,
  type ViolationKind,
} from './planner/index';
export { rollUpCosts, roundHalfUpCents, type CostInput, type CostRow, type CostRollup } from './costs';
export {
  earnedValue,
  earnedValueSeries,
  EV_CREDIT_RULES,
  type EarnedValueInput,
  type EarnedValueFigures,
  type EvCreditRule,
  type EvSeriesInput,
  type EvPoint,
  type EvSeries,
} from './earnedValue';
