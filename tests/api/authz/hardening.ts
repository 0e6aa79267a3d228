// Matrix rows for routes added by the hardening work (issue 10).
import type { MatrixRow } from './types';

export const rows: MatrixRow[] = [{ method: 'GET', path: '/api/health/live', allow: 'public' }];
