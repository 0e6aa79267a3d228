// The public build page's API: no sign-in, builds marked public only.
import { api, request } from './http';

export type PublicStatus = 'planned' | 'in_progress' | 'coming_soon' | 'done';

export interface PublicBuild {
  build: { slug: string; title: string; vehicle: { year: number; make: string; model: string; trim: string }; summary: string | null };
  counts: { planned: number; inProgress: number; comingSoon: number; done: number };
  areas: { area: string; label: string; upgrades: { id: number; title: string; becomes: string | null; status: PublicStatus; safetyFlags: string[]; liveEpisodeNumber: number | null }[] }[];
  episodes: { number: number; title: string; summary: string | null; videoUrl: string | null; publishedOn: string | null; upgrades: string[] }[];
  cautions: { flag: string; label: string; caution: string; upgrades: string[] }[];
  requests: { id: number; title: string; details: string | null; state: 'new' | 'accepted'; votes: number; upgrade: string | null }[];
}

export interface Accepted {
  ok: true;
  message: string;
}

const b = (slug: string) => `/api/public/builds/${encodeURIComponent(slug)}`;

export const publicApi = {
  // The answer may be kept by caches for other viewers (public, short max-age); this browser always
  // asks again with its ETag (a cheap 304), so a viewer sees their own confirmed vote at once.
  build: (slug: string) => request<PublicBuild>('GET', b(slug), undefined, { cache: 'no-cache' }),
  request: (slug: string, body: { title: string; details?: string | null; name?: string | null; email: string; website?: string }) =>
    api.post<Accepted>(`${b(slug)}/requests`, body),
  vote: (slug: string, requestId: number, body: { name?: string | null; email: string; website?: string }) =>
    api.post<Accepted>(`${b(slug)}/requests/${requestId}/votes`, body),
  confirm: (token: string) =>
    api.get<{ ok: true; request: { id: number; title: string }; build: { slug: string; title: string } | null }>(`/api/public/confirm/${encodeURIComponent(token)}`),
  unsubscribe: (token: string) => api.get<{ ok: true; message: string }>(`/api/public/unsubscribe/${encodeURIComponent(token)}`),
};
