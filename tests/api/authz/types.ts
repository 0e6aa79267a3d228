// The shape of the authorization matrix. Each feature adds a file in this folder exporting
// `rows` (one per route) and, if it needs records to point at, `prepare(ctx)`.
import type { Role } from '../../../shared/domain';

export interface MatrixContext {
  /** Ids in the demo build ("Project Tern"): buildId, upgradeId, partId, … */
  ids: Record<string, number | string>;
  /** Ids in a second build that no demo record belongs to, for cross-build (IDOR) checks. */
  other: Record<string, number | string>;
}

export interface MatrixRow {
  method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  /** The route pattern exactly as the server registers it, e.g. /api/users/:userId */
  path: string;
  /** Who may call it: roles (owner always may), any signed-in person, or everyone. */
  allow: Role[] | 'signed-in' | 'public';
  /** The concrete URL; by default :params are filled from ctx.ids. */
  url?: (ctx: MatrixContext) => string;
  /** A body; keep it invalid for writes so allowed callers get 400 and nothing changes. */
  body?: (ctx: MatrixContext) => unknown;
  /**
   * A URL that names a record of the other build through this build's path (or the reverse);
   * every allowed role must get 404, never the record.
   */
  idor?: (ctx: MatrixContext) => string;
  /** The call ends the caller's session (sign-out): each role gets a fresh agent for it. */
  endsSession?: boolean;
}

export function fill(path: string, ids: Record<string, number | string>): string {
  return path.replace(/:(\w+)/g, (_m, k: string) => {
    if (!(k in ids)) throw new Error(`matrix context has no id for :${k} in ${path}`);
    return String(ids[k]);
  });
}
