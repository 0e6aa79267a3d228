// Marketing's triage of viewer requests.
import { api, qs } from './http';
import type { Area, RequestState } from '@shared/domain';

export interface ViewerRequestRow {
  id: number;
  title: string;
  details: string | null;
  state: RequestState;
  votes: number;
  pendingVotes: number;
  confirmed: boolean;
  upgradeId: number | null;
  upgradeTitle: string | null;
  mergedIntoId: number | null;
  mergedIntoTitle: string | null;
  declineReason: string | null;
  createdAt: string;
  /** Sent back with a triage: a request changed since answers 409. */
  version: number;
}

export type TriageBody = (
  | { action: 'accept'; upgradeId: number }
  | { action: 'accept'; newUpgrade: { title: string; area: Area; estimatedHours?: number } }
  | { action: 'merge'; intoId: number }
  | { action: 'decline'; reason: string }
) & { version: number };

const base = (buildId: number) => `/api/builds/${buildId}/viewer-requests`;

export const viewerRequestsApi = {
  list: (buildId: number, state?: RequestState) =>
    api.get<{ requests: ViewerRequestRow[]; votesByUpgrade: Record<number, number> }>(base(buildId) + qs({ state })),
  triage: (buildId: number, id: number, body: TriageBody) => api.patch<{ request: ViewerRequestRow }>(`${base(buildId)}/${id}`, body),
};
