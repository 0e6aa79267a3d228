// Every text/background pair of the theme's --bs-* variables keeps WCAG AA contrast in both modes
// (4.5:1 for text, 3:1 for edges and the focus ring that must be seen), so a colour changed in
// src/theme.ts cannot quietly make a screen unreadable. axe checks the drawn screens in the browser
// (tests/e2e/themes*.test.ts); this checks the pairs themselves, fast.
import { describe, it, expect } from 'vitest';
import { themeVars, chartColors, type ThemeVars } from '../../src/theme';

/** WCAG 2 relative luminance of #rrggbb. */
function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5]
    .map((i) => parseInt(hex.slice(i, i + 2), 16) / 255)
    .map((c) => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

const TEXT: [keyof ThemeVars, keyof ThemeVars][] = [
  ['text', 'body'],
  ['text', 'panel'],
  ['text', 'head'],
  ['text', 'bar'],
  ['strong', 'panel'],
  ['muted', 'body'],
  ['muted', 'panel'],
  ['muted', 'head'],
  ['muted', 'bar'],
  ['onPrimary', 'primary'],
  ['primaryText', 'panel'],
  ['primaryText', 'body'],
  ['primaryText', 'head'],
  ['signal', 'panel'],
  ['signal', 'body'],
  ['signal', 'signalSoft'],
  ['onSignalSoft', 'signalSoft'],
  ['good', 'panel'],
  ['good', 'body'],
  ['good', 'goodSoft'],
  ['onGoodSoft', 'goodSoft'],
  ['danger', 'panel'],
  ['danger', 'body'],
  ['danger', 'dangerSoft'],
  ['onDangerSoft', 'dangerSoft'],
  ['progress', 'panel'],
  ['progress', 'body'],
  ['onRail', 'rail'],
  ['railMuted', 'rail'],
  ['onRail', 'railHover'],
  ['onRail', 'railActive'],
  ['onStage', 'stage'],
  ['onInverse', 'inverse'],
  ['markInk', 'markTile'],
];
const EDGES: [keyof ThemeVars, keyof ThemeVars][] = [
  ['edge', 'panel'],
  ['edge', 'body'],
  ['focus', 'panel'],
  ['focus', 'body'],
  ['primary', 'panel'],
];

describe('theme contrast', () => {
  it('the contrast formula gives the published figures', () => {
    // WCAG 2.x definition: black on white is (1 + 0.05) / (0 + 0.05) = 21:1.
    expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 5);
    // #767676 on white is the lightest grey that passes AA for small text: 4.54:1 (from memory).
    expect(contrast('#767676', '#ffffff')).toBeCloseTo(4.54, 2);
    expect(contrast('#777777', '#ffffff')).toBeLessThan(4.5);
  });

  for (const dark of [false, true]) {
    const v = themeVars(dark);
    const mode = dark ? 'dark' : 'light';
    it(`text pairs reach 4.5:1 in ${mode} mode`, () => {
      const low = TEXT.map(([fg, bg]) => [`${fg} on ${bg}`, contrast(v[fg], v[bg])] as const).filter(
        ([, c]) => c < 4.5,
      );
      expect(low).toEqual([]);
    });
    it(`edges and the focus ring reach 3:1 in ${mode} mode`, () => {
      const low = EDGES.map(([fg, bg]) => [`${fg} on ${bg}`, contrast(v[fg], v[bg])] as const).filter(([, c]) => c < 3);
      expect(low).toEqual([]);
    });
    it(`chart text reaches 4.5:1 on its panel in ${mode} mode`, () => {
      const c = chartColors(dark);
      expect(contrast(c.text, c.panel)).toBeGreaterThanOrEqual(4.5);
      expect(contrast(c.muted, c.panel)).toBeGreaterThanOrEqual(4.5);
    });
  }
});
