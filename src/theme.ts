// Bayslate's look: graphite and chalk neutrals, one warm signal accent for what needs
// attention, and calm state colours of our own (always paired with a word or an icon).
import type { GlobalThemeOverrides } from 'naive-ui';

export const palette = {
  graphite900: '#1d1f22',
  graphite800: '#25272b',
  graphite700: '#33363c',
  graphite500: '#5c616b',
  graphite300: '#a3a7ae',
  chalk50: '#faf8f3',
  chalk100: '#f1ede4',
  chalk200: '#e4dfd3',
  signal: '#b34a14', // warm accent: attention, overdue, caution (AA on chalk and white)
  signalSoft: '#f6dccb',
  steel: '#3d5a73', // primary actions
  steelDark: '#6f93b3',
  moss: '#3f6b45', // done / installed
  ochre: '#8a6414', // in progress
  slate: '#5b6470', // waiting / queued
  plum: '#6a4a78', // shot / live media
} as const;

/** State → colour and word; screens always show the word too. */
export const stateTone: Record<string, { color: string; label?: string }> = {
  queued: { color: palette.slate },
  in_bay: { color: palette.ochre },
  installed: { color: palette.moss },
  not_shot: { color: palette.slate },
  shot: { color: palette.plum },
  to_order: { color: palette.signal },
  ordered: { color: palette.steel },
  backordered: { color: palette.signal },
  received: { color: palette.moss },
  fitted: { color: palette.moss },
  returned: { color: palette.graphite500 },
  draft: { color: palette.slate },
  scheduled: { color: palette.steel },
  in_edit: { color: palette.ochre },
  live: { color: palette.moss },
};

const font = "'Poppins', system-ui, -apple-system, 'Segoe UI', sans-serif";

export const lightOverrides: GlobalThemeOverrides = {
  common: {
    fontFamily: font,
    fontFamilyMono: "ui-monospace, 'DejaVu Sans Mono', monospace",
    primaryColor: palette.steel,
    primaryColorHover: '#4a6d8a',
    primaryColorPressed: '#30485c',
    primaryColorSuppl: '#4a6d8a',
    warningColor: palette.signal,
    warningColorHover: '#d9682a',
    errorColor: '#b3261e',
    successColor: palette.moss,
    infoColor: palette.steel,
    bodyColor: palette.chalk50,
    cardColor: '#ffffff',
    textColorBase: palette.graphite900,
    textColor1: palette.graphite900,
    textColor2: palette.graphite800,
    textColor3: palette.graphite500,
    borderRadius: '6px',
    fontSize: '14px',
  },
  Layout: { siderColor: palette.graphite800, headerColor: palette.chalk100 },
  DataTable: {
    thColor: palette.chalk100,
    thFontWeight: '600',
    thTextColor: palette.graphite900,
    tdTextColor: palette.graphite900,
  },
};

export const darkOverrides: GlobalThemeOverrides = {
  common: {
    fontFamily: font,
    primaryColor: palette.steelDark,
    primaryColorHover: '#86a7c4',
    primaryColorPressed: '#5b7d9b',
    primaryColorSuppl: '#86a7c4',
    warningColor: '#e38a55',
    successColor: '#7fb287',
    bodyColor: palette.graphite900,
    cardColor: palette.graphite800,
    borderRadius: '6px',
    fontSize: '14px',
  },
  Layout: { siderColor: '#17181b', headerColor: palette.graphite800 },
};

export const money = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' });
/** Formats integer cents; null/undefined shows an em dash. */
export function formatCents(cents: number | null | undefined): string {
  return cents === null || cents === undefined || !Number.isFinite(cents) ? '—' : money.format(cents / 100);
}
export function formatHours(h: number | null | undefined): string {
  return h === null || h === undefined || !Number.isFinite(h) ? '—' : `${Math.round(h * 10) / 10} h`;
}

/** Whole dollars for chart axes, with a true minus sign before the dollar sign: "−$10,000". */
export function formatDollarsTick(v: string | number): string {
  const n = Number(v);
  if (!Number.isFinite(n)) return '';
  const whole = Math.abs(n).toLocaleString('en-US', { maximumFractionDigits: 0 });
  return `${n < 0 ? '−' : ''}$${whole}`;
}

/** A line total with its unit price beside it: "4 × $185.00 = $740.00" (one piece: "$185.00"). */
export function formatLineTotal(quantity: number, unitCents: number | null | undefined): string {
  if (unitCents === null || unitCents === undefined || !Number.isFinite(unitCents)) return '—';
  return quantity === 1
    ? formatCents(unitCents)
    : `${quantity} × ${formatCents(unitCents)} = ${formatCents(Math.round(unitCents * quantity))}`;
}

/** Colours and type for charts and overview cards in each theme (text, grid, panels). */
export interface ChartColors {
  text: string;
  muted: string;
  grid: string;
  panel: string;
  border: string;
  /** Table heads and quiet fills. */
  head: string;
  strong: string;
  planned: string;
  actual: string;
  forecast: string;
  today: string;
  /** Dark, middle and light fills that stay apart in greyscale. */
  bars: [string, string, string];
  /** Points of a scatter, and a line that means "good" (margin earned). */
  point: string;
  good: string;
}
export const chartFont = "'Poppins', system-ui, sans-serif";
export function chartColors(dark: boolean): ChartColors {
  return dark
    ? {
        text: palette.chalk100,
        muted: palette.graphite300,
        grid: 'rgba(241, 237, 228, 0.14)',
        panel: palette.graphite800,
        border: palette.graphite700,
        head: palette.graphite700,
        strong: palette.chalk50,
        planned: palette.graphite300,
        actual: palette.chalk50,
        forecast: '#e38a55',
        today: palette.steelDark,
        bars: [palette.chalk200, palette.steelDark, palette.graphite500],
        point: palette.steelDark,
        good: '#8fc497',
      }
    : {
        text: palette.graphite900,
        muted: palette.graphite500,
        grid: 'rgba(29, 31, 34, 0.1)',
        panel: '#ffffff',
        border: palette.chalk200,
        head: palette.chalk100,
        strong: palette.graphite900,
        planned: palette.graphite500,
        actual: palette.graphite900,
        forecast: palette.signal,
        today: palette.steel,
        bars: [palette.graphite800, palette.steelDark, palette.chalk200],
        point: palette.steel,
        good: palette.moss,
      };
}

/**
 * The theme as CSS custom properties (`--bs-*`), set on the document root by App.vue for the current
 * mode, so every component's <style> (and teleported drawers and dialogs) colours itself from them.
 * Components never write a colour code of their own (tests/unit/noHexColours.test.ts checks).
 * Every text/background pair here keeps WCAG AA contrast (4.5:1) in its mode.
 */
export interface ThemeVars {
  /** Page background, panels (cards, tables), quiet fills (table heads, chips). */
  body: string;
  panel: string;
  head: string;
  /** Text: normal, strongest, secondary (AA on body, panel and head). */
  text: string;
  strong: string;
  muted: string;
  /** Borders: hairlines between panels, and edges that must be seen (inputs, drop zones: 3:1). */
  border: string;
  edge: string;
  /** Primary action fill and the text on it; a link-coloured text of the same hue. */
  primary: string;
  onPrimary: string;
  primaryText: string;
  /** Attention (overdue, caution): text/edge colour, a soft fill, and text on that fill. */
  signal: string;
  signalSoft: string;
  onSignalSoft: string;
  /** Done / good: text/edge, soft fill, text on the fill. */
  good: string;
  goodSoft: string;
  onGoodSoft: string;
  /** Problems and refusals: text/edge, soft fill, text on the fill. */
  danger: string;
  dangerSoft: string;
  onDangerSoft: string;
  /** In progress. */
  progress: string;
  /** The navigation rail (graphite in both modes): fill, text, quiet text, hover, the current place. */
  rail: string;
  onRail: string;
  railMuted: string;
  railHover: string;
  railActive: string;
  /** The phone's top bar. */
  bar: string;
  /** Keyboard focus ring. */
  focus: string;
  /** A toast or notice drawn against the page's grain (dark on light, light on dark) and its text. */
  inverse: string;
  onInverse: string;
  /** The dark stage behind photos and videos (both modes) and the text on it. */
  stage: string;
  onStage: string;
  /** Drop shadows. */
  shadow: string;
  /** Printed paper: white in both modes. */
  paper: string;
  /** The Bayslate mark: tile, ink and accent (the same in both modes). */
  markTile: string;
  markInk: string;
  markAccent: string;
}

export function themeVars(dark: boolean): ThemeVars {
  return dark
    ? {
        body: palette.graphite900,
        panel: palette.graphite800,
        head: palette.graphite700,
        text: palette.chalk100,
        strong: palette.chalk50,
        muted: '#c9c4b8',
        border: palette.graphite700,
        edge: '#8a8f98',
        primary: '#8fb0cc',
        onPrimary: '#15171a',
        primaryText: '#a9c3da',
        signal: '#f0a06e',
        signalSoft: '#3a2a20',
        onSignalSoft: palette.signalSoft,
        good: '#8fc497',
        goodSoft: '#22362a',
        onGoodSoft: '#cfe6d3',
        danger: '#f2a39b',
        dangerSoft: '#3d2220',
        onDangerSoft: '#f6d5d1',
        progress: '#e0b65a',
        rail: palette.graphite800,
        onRail: palette.chalk100,
        railMuted: '#c9c4b8',
        railHover: palette.graphite700,
        railActive: '#3b3f46',
        bar: palette.graphite800,
        focus: '#e8772e',
        inverse: palette.chalk100,
        onInverse: palette.graphite900,
        stage: palette.graphite700,
        onStage: palette.chalk50,
        shadow: 'rgba(0, 0, 0, 0.3)',
        paper: '#ffffff',
        markTile: palette.graphite800,
        markInk: palette.chalk100,
        markAccent: '#e8772e',
      }
    : {
        body: palette.chalk50,
        panel: '#ffffff',
        head: palette.chalk100,
        text: palette.graphite900,
        strong: palette.graphite900,
        muted: palette.graphite500,
        border: palette.chalk200,
        edge: palette.graphite500,
        primary: palette.steel,
        onPrimary: '#ffffff',
        primaryText: '#30485c',
        signal: '#9c3f0f', // the accent, a step darker: text on its soft fill too
        signalSoft: palette.signalSoft,
        onSignalSoft: palette.graphite900,
        good: '#2f5234',
        goodSoft: '#e3efe4',
        onGoodSoft: '#2f5234',
        danger: '#8f1f17',
        dangerSoft: '#fbeae8',
        onDangerSoft: '#8c1d16',
        progress: '#6e500f',
        rail: palette.graphite800,
        onRail: palette.chalk100,
        railMuted: '#c9c4b8',
        railHover: palette.graphite700,
        railActive: '#3b3f46',
        bar: palette.chalk100,
        focus: '#c8561c',
        inverse: palette.graphite800,
        onInverse: palette.chalk100,
        stage: palette.graphite700,
        onStage: palette.chalk50,
        shadow: 'rgba(0, 0, 0, 0.3)',
        paper: '#ffffff',
        markTile: palette.graphite800,
        markInk: palette.chalk100,
        markAccent: '#e8772e',
      };
}

/** `themeVars` as CSS custom properties: `{ '--bs-on-primary': '#fff', … }`. */
export function themeCssVars(dark: boolean): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of Object.entries(themeVars(dark)))
    out[`--bs-${k.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}`] = v;
  return out;
}
