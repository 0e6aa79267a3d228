// Reading a store export's cells (server/services/salesCsv.ts): amounts, dates, refunds and line
// numbers, on hand-made files. The API tests cover the same rules through the route.
import { describe, it, expect } from 'vitest';
import { moneyToCents, readSalesCsv } from '../../server/services/salesCsv';

const MAP = {
  orderId: 'o',
  lineId: null,
  date: 'd',
  sku: 's',
  quantity: 'q',
  revenue: 'r',
  currency: null,
  landingUrl: 'u',
  campaign: null,
  content: null,
};

describe('amounts', () => {
  it('reads the usual ways a store writes money, in cents', () => {
    expect(moneyToCents('1,299.50')).toBe(129_950);
    expect(moneyToCents('$1299.5')).toBe(129_950);
    expect(moneyToCents('-$19.99')).toBe(-1_999);
    expect(moneyToCents('$-19.99')).toBe(-1_999);
    expect(moneyToCents('0')).toBe(0);
    expect(moneyToCents('12.345')).toBeNull();
    expect(moneyToCents('1,29.00')).toBeNull();
    expect(moneyToCents('ten')).toBeNull();
  });
});

describe('lines', () => {
  it('takes the date as written, reads tags from the landing page, knows a refund and a repeated line', () => {
    const text = [
      'o,d,s,q,r,u',
      'A,2026-10-02T23:30:00-05:00,HT-A,1,199.00,/p?utm_campaign=tern&utm_content=episode-2',
      '',
      'A,2026-10-09 10:00,HT-A,-1,-199.00,',
      'A,2026-10-02T23:30:00-05:00,HT-A,1,199.00,/p?utm_campaign=tern&utm_content=episode-2',
    ].join('\r\n');
    const r = readSalesCsv(text, MAP, 'USD');
    expect(r.errors).toEqual([]);
    expect(r.linesRead).toBe(3);
    expect(r.lines.map((l) => [l.line, l.soldOn, l.refund, l.campaign, l.content, l.duplicateOf, l.currency])).toEqual([
      [2, '2026-10-02', false, 'tern', 'episode-2', null, 'USD'],
      [4, '2026-10-09', true, null, null, null, 'USD'],
      [5, '2026-10-02', false, 'tern', 'episode-2', 2, 'USD'],
    ]);
  });

  it('a quantity of 0 or a fraction is refused with its line and column', () => {
    const r = readSalesCsv(
      ['o,d,s,q,r,u', 'A,2026-10-02,HT-A,0,1.00,', 'B,2026-10-02,HT-A,1.5,1.00,'].join('\n'),
      MAP,
      'USD',
    );
    expect(r.errors).toEqual([
      { line: 2, column: 'q', message: 'is 0; a line sells or refunds at least one unit' },
      { line: 3, column: 'q', message: '"1.5" is not a whole number' },
    ]);
  });
});
