// Which money fields a person may receive. Fields a role may not see are removed from the
// response object (absent, not null), per DESIGN §2.
import { canSeeMoney, canSeeRetail } from '../../shared/domain';

export interface Viewer {
  roles: readonly string[];
}

export const seesMoney = (v: Viewer | undefined) => !!v && canSeeMoney(v.roles);
export const seesRetail = (v: Viewer | undefined) => !!v && canSeeRetail(v.roles);

/** Shop cost, labour rate, budget, value and every figure derived from them. */
export const SHOP_MONEY_FIELDS = [
  'budgetCents',
  'labourRateCents',
  'unitCostCents',
  'amountCents',
  'expectedSaleCents',
  'actualSaleCents',
  'valueAddedCents',
] as const;
export const RETAIL_FIELDS = ['retailPriceCents'] as const;

/** Returns a copy of `record` without the money fields `viewer` may not see. */
export function forViewer<T extends Record<string, unknown>>(record: T, viewer: Viewer | undefined): T {
  const out: Record<string, unknown> = { ...record };
  if (!seesMoney(viewer)) for (const f of SHOP_MONEY_FIELDS) delete out[f];
  if (!seesRetail(viewer)) for (const f of RETAIL_FIELDS) delete out[f];
  return out as T;
}
