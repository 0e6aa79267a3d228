// The public build page's API: no sign-in, builds marked public only.
import { api, request } from './http';
import type { Accepted, Confirmed, PublicBuild } from '@shared/contracts/public';

export type { PublicStatus, PublicBuild, Accepted } from '@shared/contracts/public';

const b = (slug: string) => `/api/public/builds/${encodeURIComponent(slug)}`;

export const publicApi = {
  // The answer may be kept by caches for other viewers (public, short max-age); this browser always
  // asks again with its ETag (a cheap 304), so a viewer sees their own confirmed vote at once.
  build: (slug: string) => request<PublicBuild>('GET', b(slug), undefined, { cache: 'no-cache' }),
  request: (
    slug: string,
    body: { title: string; details?: string | null; name?: string | null; email: string; website?: string },
  ) => api.post<Accepted>(`${b(slug)}/requests`, body),
  vote: (slug: string, requestId: number, body: { name?: string | null; email: string; website?: string }) =>
    api.post<Accepted>(`${b(slug)}/requests/${requestId}/votes`, body),
  confirm: (token: string) => api.get<Confirmed>(`/api/public/confirm/${encodeURIComponent(token)}`),
  unsubscribe: (token: string) => api.get<Accepted>(`/api/public/unsubscribe/${encodeURIComponent(token)}`),
};
