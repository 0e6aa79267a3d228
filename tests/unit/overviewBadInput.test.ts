// @vitest-environment happy-dom
// The overview's figures and charts for builds with missing inputs (issue 12, bad input): no budget,
// no labour rate, no upgrades, or only zero-hour upgrades show dashes and empty states, never NaN or
// Infinity. Each answer is written as the server sends it (parsed by the contract, expanded as the
// client expands it); the figures in them are the ones tests/api/overview.test.ts works out by hand.
import { describe, it, expect, vi } from 'vitest';
import { defineComponent, h, type Component } from 'vue';
import { mount } from '@vue/test-utils';
import { createRouter, createMemoryHistory } from 'vue-router';
import { overviewAnswer, type OverviewAnswer } from '../../shared/contracts/overview';
import { expandOverview } from '../../shared/overview';

// Chart.js cannot draw under happy-dom: the stand-ins draw a canvas and nothing else.
vi.mock('vue-chartjs', () => {
  const Stub = defineComponent({ props: ['data', 'options', 'plugins'], setup: () => () => h('canvas') });
  return { Bar: Stub, Line: Stub, Scatter: Stub };
});
const Figures = (await import('../../src/components/OverviewChartFigures.vue')).default;
const Burndown = (await import('../../src/components/OverviewChartBurndown.vue')).default;
const Cost = (await import('../../src/components/OverviewChartCost.vue')).default;
const Hours = (await import('../../src/components/OverviewChartHours.vue')).default;
const Value = (await import('../../src/components/OverviewChartValue.vue')).default;

const zeroRow = {
  partsCents: 0,
  labourCents: 0,
  expensesCents: 0,
  recoveredCents: 0,
  expectedRecoveryCents: 0,
  estimatedHours: 0,
  actualHours: 0,
  valueAddedCents: 0,
};
const noUpgrades = {
  upgradeId: [],
  title: [],
  done: [],
  partsCents: [],
  labourCents: [],
  expensesCents: [],
  recoveredCents: [],
  expectedRecoveryCents: [],
  estimatedHours: [],
  actualHours: [],
  valueAddedCents: [],
};

/** An answer as the server sends it for a build with nothing in it; `over` changes parts of it. */
function answer(
  over: {
    build?: Partial<OverviewAnswer['build']>;
    headline?: Partial<OverviewAnswer['headline']>;
    earnedValue?: Partial<OverviewAnswer['earnedValue']>;
  } & Partial<Omit<OverviewAnswer, 'build' | 'headline' | 'earnedValue'>> = {},
) {
  const base: OverviewAnswer = {
    build: {
      id: 7,
      name: 'Bad input',
      slug: 'bad-input',
      year: 2020,
      make: 'Halvorsen',
      model: 'Skua',
      trim: '',
      startDate: '2025-01-06',
      budgetCents: 1_000_000,
      labourRateCents: 8_550,
    },
    asOf: '2025-03-01',
    timeZone: 'UTC',
    labourCosted: true,
    headline: {
      budgetCents: 1_000_000,
      bacCents: null,
      reserveCents: null,
      actualCents: 0,
      costRecognition: 'fitting',
      costRecognitionLabel: 'At fitting',
      costRecognitionDescription: 'A part counts when fitted.',
      cash: { paidCents: 0, committedCents: 0, notOrderedCents: 0, netCents: 0 },
      pending: { receivedNotFittedCents: 0, committedCents: 0, notOrderedCents: 0, laterDatedCents: 0 },
      etcCents: null,
      remainingHours: 0,
      remainingLabourCents: 0,
      remainingPartsCents: 0,
      plannedCents: 0,
      spentCents: 0,
      recoveredCents: 0,
      expectedRecoveryCents: 0,
      netCents: 0,
      remainingCents: 1_000_000,
      spentShare: 0,
      forecastCents: null,
      forecastVarianceCents: null,
      estimatedHours: 0,
      actualHours: 0,
      valueAddedCents: 0,
      valuePerDollar: null,
      upgradesDone: 0,
      upgradesTotal: 0,
      episodesLive: 0,
      episodesTotal: 0,
    },
    earnedValue: {
      rule: '0/100',
      ruleLabel: '0/100',
      ruleDescription: 'Earned when done.',
      bac: null,
      pv: 0,
      ev: 0,
      ac: 0,
      cv: 0,
      sv: 0,
      cpi: null,
      spi: null,
      eac: null,
      etc: null,
      vac: null,
      tcpi: null,
      eacCpi: null,
      eacOneOff: null,
      eacComposite: null,
      tcpiEac: null,
      forecastFinish: '2025-03-01',
      unscheduledPlannedCents: 0,
    },
    upgrades: noUpgrades,
    areas: [],
    episodes: [],
    unassigned: zeroRow,
    totals: zeroRow,
    burndown: { from: null, day: [], planned: [], actual: [], forecast: [] },
  };
  const a = {
    ...base,
    ...over,
    build: { ...base.build, ...over.build },
    headline: { ...base.headline, ...over.headline },
    earnedValue: { ...base.earnedValue, ...over.earnedValue },
  };
  return expandOverview(overviewAnswer.parse(a));
}

const router = createRouter({
  history: createMemoryHistory(),
  routes: [{ path: '/', component: { render: () => null } }],
});
function text(component: Component, overview: ReturnType<typeof answer>) {
  const w = mount(component, { props: { overview }, global: { plugins: [router] } });
  const t = w.text();
  expect(t).not.toMatch(/NaN|Infinity|undefined/);
  return { w, t };
}
const all = [Figures, Burndown, Cost, Hours, Value];

describe('the overview with missing inputs', () => {
  it('no budget: the budget, what is left and the burndown show a dash or say what to do', () => {
    const o = answer({
      build: { budgetCents: null },
      headline: { budgetCents: null, remainingCents: null, spentShare: null },
    });
    for (const c of all) text(c, o);
    const { w } = text(Figures, o);
    expect(w.get('[data-test="figure-budget"]').text()).toBe('—');
    expect(w.get('[data-test="figure-remaining"]').text()).toBe('—');
    expect(text(Burndown, o).t).toContain('No burndown yet');
  });

  it('no labour rate: no forecast, and labour shows a dash', () => {
    const o = answer({
      build: { labourRateCents: null },
      labourCosted: false,
      headline: {
        remainingLabourCents: null,
        upgradesTotal: 1,
        estimatedHours: 2,
        actualHours: 3,
        netCents: 8_000,
        spentCents: 8_000,
      },
      upgrades: {
        ...noUpgrades,
        upgradeId: [1],
        title: ['Rain-sensing wipers'],
        done: [false],
        partsCents: [8_000],
        labourCents: null,
        expensesCents: [0],
        recoveredCents: [0],
        expectedRecoveryCents: [0],
        estimatedHours: [2],
        actualHours: [3],
        valueAddedCents: [0],
      },
    });
    expect(o.upgrades[0]).toMatchObject({ labourCents: null, netCents: 8_000, hoursRatio: 1.5 });
    for (const c of all) text(c, o);
    const { w } = text(Figures, o);
    expect(w.get('[data-test="figure-forecast"]').text()).toBe('—');
    expect(text(Figures, o).t).toContain('No forecast yet');
    expect(text(Cost, o).t).toContain('—'); // the labour column of the cost table
  });

  it('no upgrades: every upgrade chart shows its empty state', () => {
    const o = answer();
    for (const c of all) text(c, o);
    expect(text(Cost, o).t).toContain('No upgrades yet');
    expect(text(Hours, o).t).toContain('No upgrades yet');
    expect(text(Value, o).t).toContain('No upgrades yet');
    expect(text(Figures, o).w.get('[data-test="figure-upgrades"]').text()).toBe('0 / 0');
  });

  it('only zero-hour upgrades: ratios and indices are dashes', () => {
    const o = answer({
      build: { budgetCents: 0 },
      headline: {
        budgetCents: 0,
        remainingCents: 0,
        spentShare: null,
        bacCents: 0,
        reserveCents: 0,
        forecastCents: 0,
        forecastVarianceCents: 0,
        etcCents: 0,
        upgradesTotal: 2,
      },
      earnedValue: { bac: 0 },
      upgrades: {
        upgradeId: [1, 2],
        title: ['Auto-dimming mirror', 'Ambient lighting'],
        done: [false, false],
        partsCents: [0, 0],
        labourCents: [0, 0],
        expensesCents: [0, 0],
        recoveredCents: [0, 0],
        expectedRecoveryCents: [0, 0],
        estimatedHours: [0, 0],
        actualHours: [0, 0],
        valueAddedCents: [0, 0],
      },
    });
    expect(o.upgrades.every((u) => u.hoursRatio === null && u.valuePerDollar === null)).toBe(true);
    for (const c of all) text(c, o);
    expect(text(Figures, o).t).toContain('—');
  });
});
