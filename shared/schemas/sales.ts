// Sales import payloads: the build's currency code, the column mapping of a store's order export,
// and the import query. Shared by the Sales screen and the API.
import { z } from 'zod';

/** ISO 4217 codes the runtime knows (Intl), or only the shape where the runtime has no list. */
const knownCurrencies: ReadonlySet<string> | null = (() => {
  const intl = Intl as unknown as { supportedValuesOf?: (k: string) => string[] };
  try {
    return intl.supportedValuesOf ? new Set(intl.supportedValuesOf('currency')) : null;
  } catch {
    return null;
  }
})();

export function isCurrencyCode(code: string): boolean {
  return /^[A-Z]{3}$/.test(code) && (knownCurrencies === null || knownCurrencies.has(code));
}

export const currencyCode = z
  .string()
  .trim()
  .toUpperCase()
  .refine(isCurrencyCode, 'must be a three-letter currency code such as USD');

/** What each part of an order line is called in the store's export; the values are its header names. */
export const SALES_FIELDS = [
  { key: 'orderId', label: 'Order id', required: true },
  { key: 'lineId', label: 'Line id', required: false },
  { key: 'date', label: 'Order date', required: true },
  { key: 'sku', label: 'SKU', required: true },
  { key: 'quantity', label: 'Quantity', required: true },
  { key: 'revenue', label: 'Line revenue', required: true },
  { key: 'currency', label: 'Currency', required: false },
  { key: 'landingUrl', label: 'Landing page URL', required: false },
  { key: 'campaign', label: 'Campaign (utm_campaign)', required: false },
  { key: 'content', label: 'Content (utm_content)', required: false },
] as const;
export type SalesFieldKey = (typeof SALES_FIELDS)[number]['key'];

const column = z.string().trim().min(1, 'names no column').max(200, 'must be at most 200 characters');
const optionalColumn = column
  .nullish()
  .or(z.literal(''))
  .transform((v) => (v ? v : null));

export const salesMappingSchema = z
  .strictObject({
    orderId: column,
    lineId: optionalColumn,
    date: column,
    sku: column,
    quantity: column,
    revenue: column,
    currency: optionalColumn,
    landingUrl: optionalColumn,
    campaign: optionalColumn,
    content: optionalColumn,
  })
  .superRefine((m, ctx) => {
    if (m.landingUrl && (m.campaign || m.content)) {
      ctx.addIssue({
        code: 'custom',
        path: ['landingUrl'],
        message: 'use either a landing page URL or campaign and content columns, not both',
      });
    }
    const seen = new Map<string, string>();
    for (const f of SALES_FIELDS) {
      const col = m[f.key];
      if (!col) continue;
      if (seen.has(col))
        ctx.addIssue({
          code: 'custom',
          path: [f.key],
          message: `uses the column "${col}" already picked for ${seen.get(col)}`,
        });
      else seen.set(col, f.label.toLowerCase());
    }
  });
export type SalesMapping = z.infer<typeof salesMappingSchema>;

/** POST …/sales/import?dryRun=1&fileName=…&mapping={json}: the mapping is optional once remembered. */
export const salesImportQuery = z.object({
  dryRun: z.enum(['0', '1', 'true', 'false']).optional(),
  fileName: z.string().trim().max(200, 'must be at most 200 characters').optional(),
  mapping: z
    .string()
    .max(4000, 'is too long')
    .optional()
    .transform((s, ctx) => {
      if (s === undefined) return undefined;
      try {
        return JSON.parse(s) as unknown;
      } catch {
        ctx.addIssue({ code: 'custom', message: 'must be JSON' });
        return z.NEVER;
      }
    }),
});

export const salesLinesQuery = z.object({
  kind: z.enum(['direct', 'assisted', 'unattributed']).default('unattributed'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(100),
});
