// CSV reading and writing shared by the backlog and parts import/export (papaparse), with line
// numbers people can find in their spreadsheet: the header is line 1, the first row line 2.
import Papa from 'papaparse';
import type { ZodError } from 'zod';

export interface CsvProblem {
  line: number;
  field: string;
  message: string;
}

export interface CsvRow {
  line: number;
  cells: Record<string, string>;
}

export interface ImportResult<P> {
  ok: boolean;
  dryRun: boolean;
  rows: P[];
  errors: CsvProblem[];
  created?: number;
}

/** Undoes writeCsv's formula guard: "'=x" → "=x". */
const unescapeFormula = (cell: string) => (/^'[=+\-@\t\r]/.test(cell) ? cell.slice(1) : cell);

/** Parses CSV text into rows keyed by header; blank lines are skipped but still counted. */
export function readCsv(text: string, columns: readonly string[], required: readonly string[]) {
  const errors: CsvProblem[] = [];
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: false });
  for (const e of parsed.errors) {
    // Papaparse counts data rows from 0, header included.
    errors.push({ line: (e.row ?? 0) + 1, field: '(row)', message: e.message });
  }
  const [header = [], ...body] = parsed.data;
  const names = header.map((h) => h.trim());
  if (names.length === 0 || names.every((n) => n === '')) {
    errors.push({
      line: 1,
      field: '(header)',
      message: `The first line must name the columns: ${columns.join(', ')}.`,
    });
    return { rows: [] as CsvRow[], errors };
  }
  const seen = new Set<string>();
  names.forEach((n) => {
    if (!columns.includes(n))
      errors.push({ line: 1, field: n || '(blank)', message: `is not a column we know (use: ${columns.join(', ')})` });
    else if (seen.has(n)) errors.push({ line: 1, field: n, message: 'appears twice in the header' });
    seen.add(n);
  });
  for (const r of required) if (!names.includes(r)) errors.push({ line: 1, field: r, message: 'column is missing' });

  const rows: CsvRow[] = [];
  body.forEach((cells, i) => {
    const line = i + 2;
    if (cells.every((c) => c.trim() === '')) return;
    if (cells.length > names.length)
      errors.push({
        line,
        field: '(row)',
        message: `has ${cells.length} cells but the header names ${names.length} columns`,
      });
    const rec: Record<string, string> = {};
    names.forEach((n, j) => (rec[n] = unescapeFormula((cells[j] ?? '').trim())));
    rows.push({ line, cells: rec });
  });
  if (rows.length === 0 && !errors.length)
    errors.push({ line: 2, field: '(row)', message: 'The file has a header but no rows.' });
  return { rows, errors };
}

/** Writes rows as CSV with a fixed column order (CRLF line ends, as RFC 4180 describes). */
export function writeCsv(columns: readonly string[], rows: Record<string, string | number | null>[]) {
  // escapeFormulae: a cell starting with = + - @ gets a leading ' so a spreadsheet shows it as text
  // instead of running it (OWASP "CSV injection"); readCsv takes the ' off again.
  return (
    Papa.unparse(
      {
        fields: [...columns],
        data: rows.map((r) => columns.map((c) => (r[c] === null || r[c] === undefined ? '' : String(r[c])))),
      },
      { newline: '\r\n', escapeFormulae: true },
    ) + '\r\n'
  );
}

export const blankToUndefined = (s: string | undefined) => (s === undefined || s === '' ? undefined : s);

/** "1,400.00" or "$1400" → 140000 cents; a number that is not money is left for the schema to refuse. */
export function dollarsToCents(s: string | undefined): number | string | undefined {
  const v = blankToUndefined(s?.replace(/[$,\s]/g, ''));
  if (v === undefined) return undefined;
  if (!/^-?\d+(\.\d{1,2})?$/.test(v)) return s; // a string: the schema answers "expected number"
  const [whole, frac = ''] = v.replace('-', '').split('.');
  const c = Number(whole) * 100 + Number(frac.padEnd(2, '0'));
  return v.startsWith('-') ? -c : c;
}

export const centsToDollars = (c: number | null | undefined) =>
  c === null || c === undefined ? '' : (c / 100).toFixed(2);

export function toNumber(s: string | undefined): number | string | undefined {
  const v = blankToUndefined(s);
  if (v === undefined) return undefined;
  const n = Number(v);
  return Number.isFinite(n) && /^-?\d+(\.\d+)?$/.test(v) ? n : v;
}

export const splitList = (s: string | undefined) =>
  (s ?? '')
    .split(';')
    .map((x) => x.trim())
    .filter(Boolean);

/** Zod issues of one row as CSV problems, with schema field names turned into column names. */
export function rowProblems(line: number, err: ZodError, columnOf: Record<string, string> = {}): CsvProblem[] {
  return err.issues.map((i) => {
    const key = String(i.path[0] ?? '(row)');
    return { line, field: columnOf[key] ?? key, message: i.message };
  });
}
