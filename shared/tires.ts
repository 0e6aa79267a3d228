// Tire fitment checks: parse ISO metric and flotation sizes, and compare a change of size.
// Pure TypeScript (no Node or DOM imports). All figures are nominal (from the size marking);
// real tires of one size differ by maker and tread, so these are planning numbers, not measurements.

const MM_PER_INCH = 25.4;
const INCHES_PER_MILE = 63360; // 5280 ft × 12 in

/**
 * Common practice in the trade (a rule of thumb, not a regulation): keep a replacement tire's
 * overall diameter within about ±3 % of the original, or speedometer, odometer, gearing, ABS and
 * stability systems and body clearance start to notice.
 */
export const DIAMETER_WARNING_PCT = 3;

export type TireSizeKind = 'metric' | 'flotation';

export interface TireSize {
  /** Canonical marking, e.g. 'P275/55R20', '265/70R17', '33x12.50R20LT'. */
  text: string;
  kind: TireSizeKind;
  /** 'P' (passenger), 'LT' (light truck), or '' for metric (Euro/ISO) and flotation sizes. */
  prefix: string;
  /** Metric only: nominal section width in mm and aspect ratio in percent; null for flotation. */
  sectionWidthMm: number | null;
  aspectRatio: number | null;
  // The figures below are raw, unrounded numbers (inches, except revsPerMile). Use `display`
  // for screens and copy; use these for any further arithmetic.
  rimIn: number;
  sectionWidthIn: number;
  sidewallIn: number;
  overallDiameterIn: number;
  circumferenceIn: number;
  revsPerMile: number;
  /** Rounded for display: inches to 1 decimal place, revolutions per mile to a whole number. */
  display: {
    sectionWidth: string;
    sidewall: string;
    overallDiameter: string;
    circumference: string;
    revsPerMile: string;
  };
}

export type TireParseResult = { ok: true; size: TireSize } | { ok: false; error: string };

export interface TireComparison {
  ok: true;
  from: TireSize;
  to: TireSize;
  /** Raw: (to − from) / from × 100. Positive means the new tire is taller. */
  diameterChangePct: number;
  /** Raw: what the speedometer shows at a true 60 mph once the new tire is fitted. */
  speedometerAtTrue60: number;
  /** Set when |diameterChangePct| exceeds DIAMETER_WARNING_PCT (common practice); otherwise null. */
  warning: string | null;
  /** Rounded for display: percent to 1 decimal with sign, mph to 1 decimal. */
  display: { diameterChange: string; speedometerAtTrue60: string };
}

export type TireCompareResult = TireComparison | { ok: false; error: string };

const FORMS_HINT = 'Use a size like 265/70R17, P275/55R20, LT275/65R20 or 33x12.50R20.';

// ISO metric: optional P/LT prefix, width/aspect, R or ZR, rim; optional trailing LT or C
// (some light-truck metric sizes put it last) and an optional service description (e.g. 113T, 121/118S)
// so a size copied off a sidewall or a spec sheet still parses.
const METRIC_RE =
  /^(P|LT)?\s*(\d{3})\s*\/\s*(\d{2})\s*(ZR|R)\s*(\d{2}(?:\.\d)?)\s*(LT|C)?(?:\s+\d{2,3}(?:\/\d{2,3})?\s*[A-Z]{1,2})?(?:\s+XL)?$/;
// Flotation: diameter x section width (both inches), R or ZR, rim, optional LT and service description.
const FLOTATION_RE =
  /^(\d{2}(?:\.\d{1,2})?)\s*X\s*(\d{1,2}(?:\.\d{1,2})?)\s*(ZR|R)\s*(\d{2}(?:\.\d)?)\s*(LT)?(?:\s+\d{2,3}(?:\/\d{2,3})?\s*[A-Z]{1,2})?$/;

function fmt(n: number, digits: number): string {
  return n.toFixed(digits);
}

function finish(base: Omit<TireSize, 'circumferenceIn' | 'revsPerMile' | 'display'>): TireSize {
  const circumferenceIn = Math.PI * base.overallDiameterIn;
  const revsPerMile = INCHES_PER_MILE / circumferenceIn;
  return {
    ...base,
    circumferenceIn,
    revsPerMile,
    display: {
      sectionWidth: `${fmt(base.sectionWidthIn, 1)} in`,
      sidewall: `${fmt(base.sidewallIn, 1)} in`,
      overallDiameter: `${fmt(base.overallDiameterIn, 1)} in`,
      circumference: `${fmt(circumferenceIn, 1)} in`,
      revsPerMile: `${Math.round(revsPerMile)}`,
    },
  };
}

function formatRim(rim: number): string {
  return Number.isInteger(rim) ? String(rim) : rim.toFixed(1);
}

/** Parse a tire size marking. Never throws; an unreadable size comes back with a clear error. */
export function parseTireSize(text: string): TireParseResult {
  const raw = String(text ?? '').trim();
  if (!raw) return { ok: false, error: `Enter a tire size. ${FORMS_HINT}` };
  const t = raw.toUpperCase().replace(/\s+/g, ' ');

  const m = METRIC_RE.exec(t);
  if (m) {
    const prefix = m[1] ?? (m[6] === 'LT' ? 'LT' : '');
    const widthMm = Number(m[2]);
    const aspect = Number(m[3]);
    const rimIn = Number(m[5]);
    // Ranges cover every road tire we expect on a car, SUV or light truck; outside them a typo is likelier.
    if (widthMm < 115 || widthMm > 395)
      return { ok: false, error: `Section width ${widthMm} mm is outside 115–395 mm; check the first number.` };
    if (aspect < 20 || aspect > 95)
      return { ok: false, error: `Aspect ratio ${aspect} is outside 20–95; check the number after the slash.` };
    if (rimIn < 10 || rimIn > 30)
      return { ok: false, error: `Rim diameter ${rimIn} in is outside 10–30 in; check the number after the R.` };
    const sectionWidthIn = widthMm / MM_PER_INCH;
    const sidewallIn = (widthMm * aspect) / 100 / MM_PER_INCH;
    return {
      ok: true,
      size: finish({
        text: `${prefix}${widthMm}/${aspect}${m[4]}${formatRim(rimIn)}${m[6] === 'C' ? 'C' : ''}`,
        kind: 'metric',
        prefix,
        sectionWidthMm: widthMm,
        aspectRatio: aspect,
        rimIn,
        sectionWidthIn,
        sidewallIn,
        overallDiameterIn: rimIn + 2 * sidewallIn,
      }),
    };
  }

  const f = FLOTATION_RE.exec(t);
  if (f) {
    const diameterIn = Number(f[1]);
    const widthIn = Number(f[2]);
    const rimIn = Number(f[4]);
    if (rimIn < 10 || rimIn > 30)
      return { ok: false, error: `Rim diameter ${rimIn} in is outside 10–30 in; check the number after the R.` };
    if (diameterIn <= rimIn + 2)
      return {
        ok: false,
        error: `Overall diameter ${diameterIn} in leaves no room for a sidewall on a ${rimIn} in rim; the first number is the tire's height.`,
      };
    if (diameterIn > 46)
      return {
        ok: false,
        error: `Overall diameter ${diameterIn} in is larger than any road tire; check the first number.`,
      };
    if (widthIn < 6 || widthIn > 20)
      return { ok: false, error: `Section width ${widthIn} in is outside 6–20 in; check the number after the x.` };
    return {
      ok: true,
      size: finish({
        // Flotation widths are written with two decimals on the sidewall (12.50), so keep that form.
        text: `${f[1]}x${widthIn.toFixed(2)}${f[3]}${formatRim(rimIn)}${f[5] ?? ''}`,
        kind: 'flotation',
        prefix: '',
        sectionWidthMm: null,
        aspectRatio: null,
        rimIn,
        sectionWidthIn: widthIn,
        sidewallIn: (diameterIn - rimIn) / 2,
        overallDiameterIn: diameterIn,
      }),
    };
  }

  if (/^\D*\d{3}\s*\/\s*\d{2}\s*\d/.test(t)) {
    return {
      ok: false,
      error: `"${raw}" is missing the construction letter between the aspect ratio and the rim (R for radial). ${FORMS_HINT}`,
    };
  }
  return { ok: false, error: `"${raw}" is not a tire size we can read. ${FORMS_HINT}` };
}

// Signed and rounded, without a stray '-0.0' for changes that round to nothing.
function signed(n: number, digits: number): string {
  const s = n.toFixed(digits);
  if (Number(s) === 0) return (0).toFixed(digits);
  return n > 0 ? `+${s}` : s;
}

/** Compare a change of tire size: diameter change and what the speedometer shows at a true 60 mph. */
export function compareTires(fromText: string, toText: string): TireCompareResult {
  const a = parseTireSize(fromText);
  if (!a.ok) return { ok: false, error: `Current size: ${a.error}` };
  const b = parseTireSize(toText);
  if (!b.ok) return { ok: false, error: `New size: ${b.error}` };
  const from = a.size;
  const to = b.size;

  const diameterChangePct = ((to.overallDiameterIn - from.overallDiameterIn) / from.overallDiameterIn) * 100;
  // The speedometer counts wheel turns calibrated for the original tire. A taller tire covers more
  // road per turn, so at a true 60 mph the wheel turns more slowly and the gauge reads low.
  const speedometerAtTrue60 = (60 * from.overallDiameterIn) / to.overallDiameterIn;

  const pctText = `${signed(diameterChangePct, 1)} %`;
  const speedoText = speedometerAtTrue60.toFixed(1);
  let warning: string | null = null;
  if (Math.abs(diameterChangePct) > DIAMETER_WARNING_PCT) {
    const taller = diameterChangePct > 0;
    warning =
      `${to.text} is ${Math.abs(diameterChangePct).toFixed(1)} % ${taller ? 'taller' : 'shorter'} than ${from.text}, ` +
      `more than the ±${DIAMETER_WARNING_PCT} % that common practice allows. ` +
      `At a true 60 mph the speedometer would show about ${speedoText} mph (reading ${taller ? 'low' : 'high'}). ` +
      "Check clearance, load rating and recalibration against the vehicle maker's information before fitting.";
  }

  return {
    ok: true,
    from,
    to,
    diameterChangePct,
    speedometerAtTrue60,
    warning,
    display: { diameterChange: pctText, speedometerAtTrue60: `${speedoText} mph` },
  };
}
