// @vitest-environment happy-dom
// The planner timeline's "today" marker (issue 12, deliverable 4): drawn at today's day in the build's
// time zone — at 23:30 in Denver, when UTC has already moved to the next day, it is still Denver's day.
import { describe, it, expect, vi, afterEach } from 'vitest';
import { defineComponent, h } from 'vue';
import { mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import type { EpisodeRecord } from '../../shared/domain';

// Chart.js cannot draw under happy-dom: the stand-in keeps what the timeline hands the chart.
const drawn: { options: Record<string, unknown>; plugins: { id: string }[] }[] = [];
vi.mock('vue-chartjs', () => ({
  Bar: defineComponent({
    props: ['data', 'options', 'plugins'],
    setup(props) {
      return () => {
        drawn.push({ options: props.options as Record<string, unknown>, plugins: props.plugins as { id: string }[] });
        return h('canvas');
      };
    },
  }),
}));

const { default: PlannerTimeline } = await import('../../src/components/PlannerTimeline.vue');
const { useBuildStore } = await import('../../src/stores/build');
const { queryClient } = await import('../../src/queries/client');
const { keys } = await import('../../src/queries/keys');
/** Opens build 1 with this time zone, as the app does: the store names the open build, the query cache holds its record. */
const openBuild = (timeZone: string) => {
  useBuildStore().open(1);
  queryClient.setQueryData(keys.buildRecord(1), { id: 1, timeZone });
};

const episode = (number: number, shootDate: string | null, releaseDate: string | null): EpisodeRecord => ({
  id: number,
  buildId: 1,
  number,
  title: `Episode ${number}`,
  summary: null,
  state: 'scheduled',
  shootDate,
  releaseDate,
  videoUrl: null,
  runtimeSeconds: null,
  publishedAt: null,
  upgradeIds: [],
  version: 1,
});
const episodes = [episode(1, '2026-03-02', '2026-03-09'), episode(2, '2026-03-16', '2026-03-23')];
const lastMarker = () =>
  (drawn.at(-1)!.options.plugins as { bayslateToday: { value: number; label: string } }).bayslateToday;

afterEach(() => {
  vi.useRealTimers();
  drawn.length = 0;
});

describe('the planner timeline’s today marker', () => {
  it('marks the given day on the day axis and names it in words', () => {
    const w = mount(PlannerTimeline, { props: { episodes, today: '2026-03-14' } });
    // 2026-03-14 is day 20,526 since 1970-01-01 (56 years with 14 leap days = 20,454 days to 2026-01-01, + 31 + 28 + 13).
    expect(lastMarker()).toMatchObject({ value: 20_526, label: 'Today 2026-03-14' });
    expect(drawn.at(-1)!.plugins.map((p) => p.id)).toContain('bayslateToday');
    expect(w.get('[data-test="timeline-today"]').text()).toContain('2026-03-14');
    expect(w.find('canvas').exists()).toBe(true);
  });

  it('takes today in the open build’s zone: 23:30 in Denver is still the 14th while UTC is on the 15th', () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-03-15T05:30:00Z')); // 2026-03-14 23:30 MDT (UTC−6)
    setActivePinia(createPinia());
    openBuild('America/Denver');
    const denver = mount(PlannerTimeline, { props: { episodes } });
    expect(lastMarker().label).toBe('Today 2026-03-14');
    expect(denver.get('[data-test="timeline-today"]').text()).toContain('2026-03-14');
    openBuild('UTC');
    mount(PlannerTimeline, { props: { episodes } });
    expect(lastMarker().label).toBe('Today 2026-03-15');
  });

  it('keeps today on the axis when every episode lies ahead', () => {
    mount(PlannerTimeline, { props: { episodes, today: '2026-02-01' } });
    const x = (drawn.at(-1)!.options.scales as { x: { min: number; max: number } }).x;
    expect(x.min).toBeLessThanOrEqual(lastMarker().value);
    expect(x.max).toBeGreaterThan(lastMarker().value);
  });

  it('with no dated episodes shows its empty state and no marker', () => {
    const w = mount(PlannerTimeline, { props: { episodes: [episode(1, null, null)], today: '2026-03-14' } });
    expect(w.text()).toContain('No dates yet');
    expect(w.find('[data-test="timeline-today"]').exists()).toBe(false);
    expect(drawn).toHaveLength(0);
  });
});
