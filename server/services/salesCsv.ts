// Reading a store's order export (papaparse) through the build's column mapping: every bad cell is
// reported by line (the header is line 1) and column name, nothing is guessed. Pure: no database.
//
// Rules, as the Sales screen states them:
// - a refund is a line whose quantity and revenue are both below zero; a negative quantity or
//   revenue on its own is refused;
// - a text cell (order id, line id, SKU, currency, landing page, campaign, content) that starts with
//   = + - @ or a tab looks like a spreadsheet formula and is refused (not rewritten), so no such text is
//   ever stored and shown or exported again;
// - dates are YYYY-MM-DD, optionally followed by a time; the date is taken as written;
// - revenue is the line's total in the build's currency: digits with an optional minus, currency sign,
//   thousands commas and up to two decimals.
import Papa from 'papaparse';
import { SALES_FIELDS, isCurrencyCode, type SalesFieldKey, type SalesMapping } from '../../shared/schemas/sales';
import { isRefund, tagsOfUrl } from '../../shared/sales';

export interface SalesProblem {
  line: number;
  column: string;
  message: string;
}

export interface ParsedSaleLine {
  line: number;
  orderId: string;
  lineId: string | null;
  soldOn: string;
  sku: string;
  quantity: number;
  revenueCents: number;
  currency: string;
  campaign: string | null;
  content: string | null;
  refund: boolean;
  /** Same order line as an earlier line of this file (counted once). */
  duplicateOf: number | null;
}

export const MAX_SALES_LINES = 100_000;
const MAX_TEXT = 100;
const MAX_TAG = 200;
const FORMULA = /^[=+\-@\t\r]/;
const DATE = /^(\d{4}-\d{2}-\d{2})(?:[T ]\d{1,2}:\d{2}(?::\d{2}(?:\.\d{1,6})?)?\s*(?:Z|[+-]\d{2}:?\d{2})?)?$/i;
const MONEY = /^(-?)(?:\d{1,3}(?:,\d{3})+|\d+)(?:\.(\d{1,2}))?$/;

function realDate(d: string): boolean {
  const t = Date.parse(`${d}T00:00:00Z`);
  return !Number.isNaN(t) && new Date(t).toISOString().startsWith(d);
}

/** "1,299.50" / "$1299.5" / "-199.00" → cents; null when it is not an amount. */
export function moneyToCents(cell: string): number | null {
  const s = cell
    .replace(/\s/g, '')
    .replace(/^(-?)[$€£¥]/, '$1')
    .replace(/^[$€£¥](-)/, '$1');
  const m = MONEY.exec(s);
  if (!m) return null;
  const [whole, frac = ''] = s.replace('-', '').replace(/,/g, '').split('.');
  const c = Number(whole) * 100 + Number(frac.padEnd(2, '0'));
  return m[1] === '-' ? -c : c;
}

export const dedupeKey = (l: Pick<ParsedSaleLine, 'orderId' | 'lineId' | 'sku' | 'quantity' | 'revenueCents'>) =>
  l.lineId !== null
    ? `L\u0000${l.orderId}\u0000${l.lineId}`
    : `S\u0000${l.orderId}\u0000${l.sku}\u0000${l.quantity}\u0000${l.revenueCents}`;

export interface ReadResult {
  header: string[];
  lines: ParsedSaleLine[];
  linesRead: number;
  errors: SalesProblem[];
}

export function readSalesCsv(text: string, mapping: SalesMapping, buildCurrency: string): ReadResult {
  const errors: SalesProblem[] = [];
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: false });
  const [rawHeader = [], ...body] = parsed.data;
  const header = rawHeader.map((h) => h.trim());
  const index = {} as Record<SalesFieldKey, number>;
  for (const f of SALES_FIELDS) {
    const col = mapping[f.key];
    if (!col) continue;
    const i = header.indexOf(col);
    if (i < 0)
      errors.push({
        line: 1,
        column: col,
        message: `is not a column of this file (it is mapped as ${f.label.toLowerCase()})`,
      });
    else index[f.key] = i;
  }
  // Papaparse counts rows from 0 with the header as row 0, so row r is line r + 1.
  for (const e of parsed.errors) errors.push({ line: (e.row ?? 0) + 1, column: '(row)', message: e.message });
  if (header.every((h) => h === ''))
    errors.push({ line: 1, column: '(header)', message: 'The first line must name the columns.' });
  if (errors.some((e) => e.line === 1 && e.column !== '(row)')) return { header, lines: [], linesRead: 0, errors };

  const lines: ParsedSaleLine[] = [];
  const firstLine = new Map<string, number>();
  let linesRead = 0;
  body.forEach((cells, i) => {
    const line = i + 2;
    if (cells.every((c) => c.trim() === '')) return;
    linesRead++;
    if (linesRead > MAX_SALES_LINES) {
      if (linesRead === MAX_SALES_LINES + 1)
        errors.push({
          line,
          column: '(row)',
          message: `A file may hold at most ${MAX_SALES_LINES.toLocaleString('en-US')} lines; split it.`,
        });
      return;
    }
    const before = errors.length;
    const bad = (key: SalesFieldKey, message: string) => errors.push({ line, column: mapping[key] ?? key, message });
    const cell = (key: SalesFieldKey) => (index[key] === undefined ? '' : (cells[index[key]] ?? '').trim());
    const textCell = (key: SalesFieldKey, required: boolean, max = MAX_TEXT): string | null => {
      const v = cell(key);
      if (FORMULA.test(v)) {
        bad(key, `starts with ${JSON.stringify(v[0])} like a spreadsheet formula; such cells are refused`);
        return null;
      }
      if (!v) {
        if (required) bad(key, 'is blank');
        return null;
      }
      if (v.length > max) {
        bad(key, `is longer than ${max} characters`);
        return null;
      }
      return v;
    };

    const orderId = textCell('orderId', true);
    const lineId = index.lineId === undefined ? null : textCell('lineId', false);
    const sku = textCell('sku', true);

    const dateCell = cell('date');
    const dm = DATE.exec(dateCell);
    const soldOn = dm && realDate(dm[1]!) ? dm[1]! : null;
    if (!soldOn)
      bad('date', dateCell ? `"${dateCell}" is not a date (use YYYY-MM-DD, optionally with a time)` : 'is blank');

    const qCell = cell('quantity');
    let quantity: number | null = null;
    if (/^[=+@]/.test(qCell))
      bad('quantity', `starts with ${JSON.stringify(qCell[0])} like a spreadsheet formula; such cells are refused`);
    else if (!/^-?\d{1,6}$/.test(qCell)) bad('quantity', qCell ? `"${qCell}" is not a whole number` : 'is blank');
    else if (Number(qCell) === 0) bad('quantity', 'is 0; a line sells or refunds at least one unit');
    else quantity = Number(qCell);

    const rCell = cell('revenue');
    let revenueCents: number | null = null;
    if (/^[=+@]/.test(rCell))
      bad('revenue', `starts with ${JSON.stringify(rCell[0])} like a spreadsheet formula; such cells are refused`);
    else {
      revenueCents = moneyToCents(rCell);
      if (revenueCents === null) bad('revenue', rCell ? `"${rCell}" is not an amount (like 199.00)` : 'is blank');
      else if (Math.abs(revenueCents) > 2_000_000_000) {
        bad('revenue', 'is too large');
        revenueCents = null;
      }
    }
    if (quantity !== null && revenueCents !== null && !isRefund(quantity, revenueCents)) {
      if (quantity < 0)
        bad(
          'quantity',
          'is below zero on a line that is not a refund (a refund has quantity and revenue both below zero)',
        );
      else if (revenueCents < 0)
        bad(
          'revenue',
          'is below zero on a line that is not a refund (a refund has quantity and revenue both below zero)',
        );
    }

    let currency = buildCurrency;
    if (index.currency !== undefined) {
      const c = textCell('currency', true)?.toUpperCase() ?? null;
      if (c !== null) {
        if (!isCurrencyCode(c)) bad('currency', `"${c}" is not a currency code we know`);
        else if (c !== buildCurrency)
          bad(
            'currency',
            `${c} is not this build's currency (${buildCurrency}); only ${buildCurrency} lines can be imported here`,
          );
        else currency = c;
      }
    }

    let campaign: string | null = null;
    let content: string | null = null;
    if (index.landingUrl !== undefined) {
      const url = textCell('landingUrl', false, 2000);
      ({ campaign, content } = tagsOfUrl(url));
    } else {
      if (index.campaign !== undefined) campaign = textCell('campaign', false, MAX_TAG);
      if (index.content !== undefined) content = textCell('content', false, MAX_TAG);
    }
    if ((campaign?.length ?? 0) > MAX_TAG || (content?.length ?? 0) > MAX_TAG)
      bad(
        index.landingUrl !== undefined ? 'landingUrl' : 'campaign',
        `a campaign tag is longer than ${MAX_TAG} characters`,
      );

    if (
      errors.length > before ||
      orderId === null ||
      sku === null ||
      soldOn === null ||
      quantity === null ||
      revenueCents === null
    )
      return;
    const parsedLine: ParsedSaleLine = {
      line,
      orderId,
      lineId,
      soldOn,
      sku,
      quantity,
      revenueCents,
      currency,
      campaign,
      content,
      refund: quantity < 0,
      duplicateOf: null,
    };
    const key = dedupeKey(parsedLine);
    parsedLine.duplicateOf = firstLine.get(key) ?? null;
    if (parsedLine.duplicateOf === null) firstLine.set(key, line);
    lines.push(parsedLine);
  });
  if (linesRead === 0 && !errors.length)
    errors.push({ line: 2, column: '(row)', message: 'The file has a header but no lines.' });
  return { header, lines, linesRead, errors };
}
