// The contract of GET /api/builds/:buildId/overview as it travels: the handler is typed against it,
// the client expands it (shared/overview.ts, expandOverview) and the API tests parse every answer
// with it. Per role an allow-list: a person who sees money gets `overviewAnswer`; anyone else would
// get `overviewAnswerWithoutMoney`, whose parse strips every field not named in it.
// Compact by design: the upgrade rows and the burndown go as columns (one array per field) and
// nothing a client can work out (net cost, value per dollar, hours ratio, dates of a daily series)
// is sent. zod's number refuses NaN and ±Infinity, so a parsed answer has finite numbers only.
import { z } from 'zod';
import { AREAS, EPISODE_STATES } from '../domain';
import { COST_RECOGNITIONS } from '../costRecognition';
import { EV_CREDIT_RULES } from '../earnedValue';

const cents = z.number().int();
const hours = z.number().min(0);
const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/);
const count = z.number().int().min(0);

/** A cost row without its derived fields (net, value per dollar, hours ratio). */
const costRow = z.object({
  partsCents: cents,
  /** Null when the build has no labour rate. */
  labourCents: cents.nullable(),
  expensesCents: cents,
  recoveredCents: cents,
  expectedRecoveryCents: cents,
  estimatedHours: hours,
  actualHours: hours,
  valueAddedCents: cents,
});
const hoursRow = z.object({ estimatedHours: hours, actualHours: hours });

/** Columns of the upgrade rows, all of one length; `labourCents` is null (one value) without a labour rate. */
function columns<S extends z.ZodRawShape>(shape: S) {
  return z.object(shape).refine((c) => {
    const lengths = Object.values(c)
      .filter(Array.isArray)
      .map((a) => a.length);
    return lengths.every((n) => n === lengths[0]);
  }, 'every column of the upgrade rows has one value per upgrade');
}

const buildFields = {
  id: count,
  name: z.string(),
  slug: z.string(),
  year: z.number().int(),
  make: z.string(),
  model: z.string(),
  trim: z.string(),
  startDate: day,
};
const episodeFields = {
  episodeId: count.nullable(),
  number: z.number().int().nullable(),
  title: z.string(),
  state: z.enum(EPISODE_STATES).nullable(),
  shootDate: day.nullable(),
  upgrades: count,
};
const countFields = {
  estimatedHours: hours,
  actualHours: hours,
  remainingHours: hours,
  upgradesDone: count,
  upgradesTotal: count,
  episodesLive: count,
  episodesTotal: count,
};

export const overviewAnswer = z.object({
  build: z.object({ ...buildFields, budgetCents: cents.nullable(), labourRateCents: cents.nullable() }),
  /** The status date: today in the build's zone. */
  asOf: day,
  timeZone: z.string(),
  labourCosted: z.boolean(),
  headline: z.object({
    ...countFields,
    budgetCents: cents.nullable(),
    bacCents: cents.nullable(),
    reserveCents: cents.nullable(),
    actualCents: cents,
    costRecognition: z.enum(COST_RECOGNITIONS),
    costRecognitionLabel: z.string(),
    costRecognitionDescription: z.string(),
    cash: z.object({ paidCents: cents, committedCents: cents, notOrderedCents: cents, netCents: cents }),
    pending: z.object({
      receivedNotFittedCents: cents,
      committedCents: cents,
      notOrderedCents: cents,
      laterDatedCents: cents,
    }),
    etcCents: cents.nullable(),
    remainingLabourCents: cents.nullable(),
    remainingPartsCents: cents,
    plannedCents: cents,
    spentCents: cents,
    recoveredCents: cents,
    expectedRecoveryCents: cents,
    netCents: cents,
    remainingCents: cents.nullable(),
    spentShare: z.number().nullable(),
    forecastCents: cents.nullable(),
    forecastVarianceCents: cents.nullable(),
    valueAddedCents: cents,
    valuePerDollar: z.number().nullable(),
  }),
  earnedValue: z.object({
    rule: z.enum(EV_CREDIT_RULES.map((r) => r.id) as [EvRuleId, ...EvRuleId[]]),
    ruleLabel: z.string(),
    ruleDescription: z.string(),
    bac: cents.nullable(),
    pv: cents,
    ev: cents,
    ac: cents,
    cv: z.number().nullable(),
    sv: z.number().nullable(),
    cpi: z.number().nullable(),
    spi: z.number().nullable(),
    eac: z.number().nullable(),
    etc: z.number().nullable(),
    vac: z.number().nullable(),
    tcpi: z.number().nullable(),
    eacCpi: z.number().nullable(),
    eacOneOff: z.number().nullable(),
    eacComposite: z.number().nullable(),
    tcpiEac: z.number().nullable(),
    forecastFinish: day.nullable(),
    unscheduledPlannedCents: cents,
  }),
  /** One array per field, one value per upgrade; ordered as the cost roll-up orders them. */
  upgrades: columns({
    upgradeId: z.array(count),
    title: z.array(z.string()),
    done: z.array(z.boolean()),
    partsCents: z.array(cents),
    labourCents: z.array(cents).nullable(),
    expensesCents: z.array(cents),
    recoveredCents: z.array(cents),
    expectedRecoveryCents: z.array(cents),
    estimatedHours: z.array(hours),
    actualHours: z.array(hours),
    valueAddedCents: z.array(cents),
  }),
  areas: z.array(costRow.extend({ area: z.enum(AREAS), label: z.string(), upgrades: count })),
  episodes: z.array(costRow.extend(episodeFields)),
  /** Money on no upgrade (build-wide expenses, removed parts of no upgrade). */
  unassigned: costRow,
  totals: costRow,
  /**
   * Remaining budget over time as columns: `day` counts days from `from` (the first point's date);
   * planned, actual and forecast are cents, null where a line is not drawn. Empty without a budget.
   */
  burndown: z.object({
    from: day.nullable(),
    day: z.array(z.number().int().min(0)),
    planned: z.array(cents),
    actual: z.array(cents.nullable()),
    forecast: z.array(cents.nullable()),
  }),
});
type EvRuleId = (typeof EV_CREDIT_RULES)[number]['id'];

/**
 * The allow-list for a person who may not see money: names, dates, states, counts and hours only.
 * Parsing a full answer with it drops every other field (zod objects strip unknown keys).
 */
export const overviewAnswerWithoutMoney = z.object({
  build: z.object(buildFields),
  asOf: day,
  timeZone: z.string(),
  headline: z.object(countFields),
  upgrades: columns({
    upgradeId: z.array(count),
    title: z.array(z.string()),
    done: z.array(z.boolean()),
    estimatedHours: z.array(hours),
    actualHours: z.array(hours),
  }),
  episodes: z.array(hoursRow.extend(episodeFields)),
});

export type OverviewAnswer = z.infer<typeof overviewAnswer>;
export type OverviewAnswerWithoutMoney = z.infer<typeof overviewAnswerWithoutMoney>;
