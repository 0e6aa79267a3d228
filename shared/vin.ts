// VIN check: the 17-character check digit (49 CFR 565) and the model-year code of position 10.
// Pure TypeScript (no Node or DOM imports): the build form and the API both call checkVin.

export interface VinCheck {
  /** True only when the text is 17 allowed characters and position 9 matches the computed check digit. */
  valid: boolean;
  /** The check digit computed from the other 16 characters ('0'–'9' or 'X'); '' when it cannot be computed. */
  checkDigit: string;
  /** Candidate model years for position 10, one per 30-year cycle, oldest first; [] when not a year code. */
  modelYears: number[];
  /** Why the VIN is not valid (names the problem and the position). Absent when valid. */
  reason?: string;
  /** Something worth showing even when the check digit passes (e.g. position 10 is not a year code). */
  warning?: string;
  /** The text as checked: whitespace trimmed, upper-cased. */
  normalized: string;
}

export const VIN_LENGTH = 17;

// Letter values from the regulation's transliteration table. I, O and Q are absent on purpose:
// they are never used in a VIN because they are too easily confused with 1 and 0.
const LETTER_VALUES: Readonly<Record<string, number>> = {
  A: 1,
  B: 2,
  C: 3,
  D: 4,
  E: 5,
  F: 6,
  G: 7,
  H: 8,
  J: 1,
  K: 2,
  L: 3,
  M: 4,
  N: 5,
  P: 7,
  R: 9,
  S: 2,
  T: 3,
  U: 4,
  V: 5,
  W: 6,
  X: 7,
  Y: 8,
  Z: 9,
};

// Weight per position 1..17; position 9 (the check digit itself) weighs 0 so it drops out of the sum.
export const VIN_WEIGHTS: readonly number[] = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2];

// Position-10 codes in order: 1980 (A) … 2000 (Y), then 2001–2009 as digits. U, Z and 0 are not
// year codes (nor I, O, Q). The same 30 codes repeat from 2010, so each code names two years.
const YEAR_CODES = 'ABCDEFGHJKLMNPRSTVWXY123456789';
const FIRST_CYCLE_START = 1980;
const CYCLE_YEARS = 30;

/** Numeric value of one VIN character, or null when the character is not allowed in a VIN. */
export function vinCharValue(ch: string): number | null {
  if (ch.length !== 1) return null;
  if (ch >= '0' && ch <= '9') return ch.charCodeAt(0) - 48;
  return LETTER_VALUES[ch] ?? null;
}

/** Candidate model years for a position-10 code, oldest first ('K' → [1989, 2019]). */
export function modelYearsForCode(code: string): number[] {
  const i = code.length === 1 ? YEAR_CODES.indexOf(code.toUpperCase()) : -1;
  if (i < 0) return [];
  return [FIRST_CYCLE_START + i, FIRST_CYCLE_START + CYCLE_YEARS + i];
}

/**
 * Check digit for a 17-character VIN (position 9 is ignored, so any placeholder may sit there).
 * Returns '' when any other position holds a character that is not allowed.
 */
export function computeCheckDigit(vin: string): string {
  if (vin.length !== VIN_LENGTH) return '';
  let sum = 0;
  for (let i = 0; i < VIN_LENGTH; i++) {
    if (i === 8) continue;
    const v = vinCharValue(vin[i]!);
    if (v === null) return '';
    sum += v * VIN_WEIGHTS[i]!;
  }
  const r = sum % 11;
  return r === 10 ? 'X' : String(r);
}

function describeChar(ch: string): string {
  if (ch === ' ') return 'a space';
  if (/\s/.test(ch)) return 'a whitespace character';
  return `'${ch}'`;
}

/** Problems with individual characters, each naming its position (1-based). */
function characterProblems(vin: string): string[] {
  const problems: string[] = [];
  for (let i = 0; i < vin.length; i++) {
    const ch = vin[i]!;
    if (vinCharValue(ch) !== null) continue;
    const pos = i + 1;
    if (ch === 'I' || ch === 'O' || ch === 'Q') {
      const hint = ch === 'I' ? '1' : '0';
      problems.push(`position ${pos}: the letter ${ch} is never used in a VIN (did you mean ${hint}?)`);
    } else {
      problems.push(
        `position ${pos}: ${describeChar(ch)} is not allowed (only digits and letters other than I, O and Q)`,
      );
    }
  }
  return problems;
}

// Keep the reason readable when someone pastes a whole sentence into the field.
const MAX_LISTED_PROBLEMS = 3;

/**
 * Check a VIN as typed. Never throws: every problem comes back as valid:false with a reason.
 * A wrong check digit is reported as invalid, but the UI lets the user keep it, because some
 * vehicles built for markets outside North America do not use a check digit at all.
 */
export function checkVin(text: string): VinCheck {
  const normalized = String(text ?? '')
    .trim()
    .toUpperCase();
  if (normalized.length === 0) {
    return { valid: false, checkDigit: '', modelYears: [], reason: 'Enter a VIN (17 characters).', normalized };
  }

  const problems: string[] = [];
  if (normalized.length !== VIN_LENGTH) {
    problems.push(`a VIN has ${VIN_LENGTH} characters; this one has ${normalized.length}`);
  }
  const charProblems = characterProblems(normalized);
  problems.push(...charProblems.slice(0, MAX_LISTED_PROBLEMS));
  if (charProblems.length > MAX_LISTED_PROBLEMS) {
    problems.push(`and ${charProblems.length - MAX_LISTED_PROBLEMS} more character problem(s)`);
  }

  // Position 10 is still worth decoding when something else is wrong: it helps spot typos.
  const yearCode = normalized.length >= 10 ? normalized[9]! : '';
  const modelYears = modelYearsForCode(yearCode);
  const checkDigit = computeCheckDigit(normalized);

  if (problems.length > 0) {
    const reason = problems.join('; ');
    return {
      valid: false,
      checkDigit,
      modelYears,
      reason: reason[0]!.toUpperCase() + reason.slice(1) + '.',
      normalized,
    };
  }

  const found = normalized[8]!;
  const result: VinCheck = { valid: true, checkDigit, modelYears, normalized };
  if (found !== checkDigit) {
    result.valid = false;
    result.reason =
      `Check digit at position 9 is '${found}' but the other characters give '${checkDigit}'. ` +
      'Check for a typing mistake; vehicles built for markets outside North America may not use a check digit.';
  }
  if (modelYears.length === 0) {
    // '0', 'U' and 'Z' are not model-year codes; outside North America position 10 often is not one.
    result.warning = `Position 10 ('${yearCode}') is not a model-year code, so the model year cannot be read from this VIN.`;
  }
  return result;
}
