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
};
