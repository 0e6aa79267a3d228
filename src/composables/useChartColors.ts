// Chart colours and type for the current theme: Chart.js defaults (Poppins, text and grid colours)
// follow light and dark mode, and charts read the colours for their own lines and bars.
import { computed, watch } from 'vue';
import { Chart as ChartJS } from 'chart.js';
import { chartColors, chartFont } from '@/theme';
import { useColorMode } from './useColorMode';

/** `paper`: always the light colours (the printable report is white in both themes). */
export function useChartColors(paper: () => boolean = () => false) {
  const { dark: mode } = useColorMode();
  const dark = computed(() => mode.value && !paper());
  const colors = computed(() => chartColors(dark.value));
  watch(
    colors,
    (c) => {
      ChartJS.defaults.font.family = chartFont;
      ChartJS.defaults.color = c.text;
      ChartJS.defaults.borderColor = c.grid;
    },
    { immediate: true },
  );
  /** Axis options in the theme's colours, to spread into a scale. */
  const axis = computed(() => {
    const c = colors.value;
    return {
      ticks: { color: c.text, font: { family: chartFont } },
      grid: { color: c.grid },
      title: { color: c.text, font: { family: chartFont } },
    };
  });
  /** The panel colour behind the chart (also the background of a PNG export). */
  const background = computed(() => ({ bayslateBackground: { color: colors.value.panel } }));
  return { dark, colors, axis, background };
}
