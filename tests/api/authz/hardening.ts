// Matrix rows for routes added by the hardening work (issue 10). The health probes (/api/health/live
// and /ready) answer ahead of sessions and outside the route table; tests/api/deploy-restart.test.ts
// covers them. The failed-mail routes are in mail.ts.
import type { MatrixRow } from './types';

export const rows: MatrixRow[] = [];
