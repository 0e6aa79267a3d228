// The public build page and its request, vote, confirm and unsubscribe links (no sign-in). No
// money, no people, no internal notes: this contract is the whole of what a viewer may read.
import { z } from 'zod';
import { AREAS, SAFETY_FLAGS } from '../domain';
import { day, idNumber, type RouteTable } from './common';

export const PUBLIC_STATUSES = ['planned', 'in_progress', 'coming_soon', 'done'] as const;
export type PublicStatus = (typeof PUBLIC_STATUSES)[number];

export const PublicUpgrade = z.object({
  id: idNumber,
  title: z.string(),
  becomes: z.string().nullable(),
  status: z.enum(PUBLIC_STATUSES),
  safetyFlags: z.array(z.enum(SAFETY_FLAGS)),
  liveEpisodeNumber: z.number().int().nullable(),
});
export const PublicBuild = z.object({
  build: z.object({
    slug: z.string(),
    title: z.string(),
    vehicle: z.object({ year: z.number().int(), make: z.string(), model: z.string(), trim: z.string() }),
    summary: z.string().nullable(),
  }),
  counts: z.object({
    planned: z.number().int(),
    inProgress: z.number().int(),
    comingSoon: z.number().int(),
    done: z.number().int(),
  }),
  areas: z.array(z.object({ area: z.enum(AREAS), label: z.string(), upgrades: z.array(PublicUpgrade) })),
  episodes: z.array(
    z.object({
      number: z.number().int(),
      title: z.string(),
      summary: z.string().nullable(),
      videoUrl: z.string().nullable(),
      publishedOn: day.nullable(),
      upgrades: z.array(z.string()),
    }),
  ),
  cautions: z.array(
    z.object({ flag: z.enum(SAFETY_FLAGS), label: z.string(), caution: z.string(), upgrades: z.array(z.string()) }),
  ),
  requests: z.array(
    z.object({
      id: idNumber,
      title: z.string(),
      details: z.string().nullable(),
      state: z.enum(['new', 'accepted']),
      votes: z.number().int(),
      upgrade: z.string().nullable(),
    }),
  ),
});
export type PublicBuild = z.infer<typeof PublicBuild>;

/** What every request and vote answers, whatever happened (nothing tells whether an address is known). */
export const Accepted = z.object({ ok: z.literal(true), message: z.string() });
export type Accepted = z.infer<typeof Accepted>;
export const Confirmed = z.object({
  ok: z.literal(true),
  request: z.object({ id: idNumber, title: z.string() }),
  build: z.object({ slug: z.string(), title: z.string() }).nullable(),
});
export type Confirmed = z.infer<typeof Confirmed>;

export const publicRoutes = {
  'GET /api/public/builds/:slug': PublicBuild,
  'POST /api/public/builds/:slug/requests': Accepted,
  'POST /api/public/builds/:slug/requests/:requestId/votes': Accepted,
  'GET /api/public/confirm/:token': Confirmed,
  'GET /api/public/unsubscribe/:token': Accepted,
} satisfies RouteTable;
