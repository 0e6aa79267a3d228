// Every route table in one: 'METHOD /api/path/:param' → the contract of its 2xx JSON answer.
// The API tests look answers up here (tests/helpers/contract.ts). Add a domain's table on its own line.
import type { RouteTable } from './common';
import { authRoutes } from './auth';
import { buildRoutes } from './build';
import { expenseRoutes } from './expense';
import { labourRoutes } from './labour';
import { mailRoutes } from './mail';
import { mediaRoutes } from './media';
import { partRoutes } from './part';
import { publicRoutes } from './public';
import { removedPartRoutes } from './removedPart';
import { upgradeRoutes } from './upgrade';
import { viewerRequestRoutes } from './viewerRequest';
import { calendarRoutes } from './calendar';
import { episodeRoutes } from './episode';
import { healthRoutes } from './health';
import { planRoutes } from './plan';
import { publishingRoutes } from './publishing';
import { salesRoutes } from './sales';
import { shopFloorRoutes } from './shopFloor';
import { slipRoutes } from './slips';

export const API: RouteTable = {
  ...authRoutes,
  ...buildRoutes,
  ...expenseRoutes,
  ...labourRoutes,
  ...mailRoutes,
  ...mediaRoutes,
  ...partRoutes,
  ...publicRoutes,
  ...removedPartRoutes,
  ...upgradeRoutes,
  ...viewerRequestRoutes,
  ...calendarRoutes,
  ...episodeRoutes,
  ...healthRoutes,
  ...planRoutes,
  ...publishingRoutes,
  ...salesRoutes,
  ...shopFloorRoutes,
  ...slipRoutes,
};
