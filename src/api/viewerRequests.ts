// Marketing's triage of viewer requests.
import { api, qs } from './http';
import type { Area, RequestState } from '@shared/domain';
import type { StaffRequest, StaffRequestAnswer, StaffRequestList } from '@shared/contracts/viewerRequest';

/** A request as staff triage it (shared/contracts/viewerRequest.ts). */
export type ViewerRequestRow = StaffRequest;

export type TriageBody = (
  | { action: 'accept'; upgradeId: number }
  | { action: 'accept'; newUpgrade: { title: string; area: Area; estimatedHours?: number } }
  | { action: 'merge'; intoId: number }
  | { action: 'decline'; reason: string }
) & { version: number };

const base = (buildId: number) => `/api/builds/${buildId}/viewer-requests`;

export const viewerRequestsApi = {
  list: (buildId: number, state?: RequestState) => api.get<StaffRequestList>(base(buildId) + qs({ state })),
  triage: (buildId: number, id: number, body: TriageBody) =>
    api.patch<StaffRequestAnswer>(`${base(buildId)}/${id}`, body),
};
