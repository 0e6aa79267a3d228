// The product's vocabulary as types and value lists, shared by server and client.
// Names follow ../shared/DESIGN.md §3. Money is integer cents; dates are ISO strings (YYYY-MM-DD).

export const ROLES = ['owner', 'producer', 'installer', 'marketing'] as const;
export type Role = (typeof ROLES)[number];

export const AREAS = ['front', 'sides', 'rear', 'cabin', 'electrical', 'wheels_chassis'] as const;
export type Area = (typeof AREAS)[number];
export const AREA_LABELS: Record<Area, string> = {
  front: 'Front',
  sides: 'Sides',
  rear: 'Rear',
  cabin: 'Cabin',
  electrical: 'Electrical',
  wheels_chassis: 'Wheels & chassis',
};

export const INSTALL_STATES = ['queued', 'in_bay', 'installed'] as const;
export type InstallState = (typeof INSTALL_STATES)[number];
export const INSTALL_STATE_LABELS: Record<InstallState, string> = {
  queued: 'Queued',
  in_bay: 'In the bay',
  installed: 'Installed',
};

export const SEGMENT_STATES = ['not_shot', 'shot'] as const;
export type SegmentState = (typeof SEGMENT_STATES)[number];

export const SAFETY_FLAGS = [
  'srs_airbag',
  'brakes',
  'lighting',
  'rear_camera',
  'wheels_tires',
  'high_current',
  'lifting',
] as const;
export type SafetyFlag = (typeof SAFETY_FLAGS)[number];

export const PART_CONDITIONS = ['new', 'take_off'] as const;
export type PartCondition = (typeof PART_CONDITIONS)[number];

export const PART_STATES = ['to_order', 'ordered', 'backordered', 'received', 'fitted', 'returned'] as const;
export type PartState = (typeof PART_STATES)[number];
export const PART_STATE_LABELS: Record<PartState, string> = {
  to_order: 'To order',
  ordered: 'Ordered',
  backordered: 'Backordered',
  received: 'Received',
  fitted: 'Fitted',
  returned: 'Returned',
};

export const DISPOSITIONS = ['keep', 'for_sale', 'sold', 'scrapped'] as const;
export type Disposition = (typeof DISPOSITIONS)[number];

export const LABOUR_KINDS = ['install', 'filming', 'prep'] as const;
export type LabourKind = (typeof LABOUR_KINDS)[number];

export const EPISODE_STATES = ['draft', 'scheduled', 'shot', 'in_edit', 'live'] as const;
export type EpisodeState = (typeof EPISODE_STATES)[number];
export const EPISODE_STATE_LABELS: Record<EpisodeState, string> = {
  draft: 'Draft',
  scheduled: 'Scheduled',
  shot: 'Shot',
  in_edit: 'In edit',
  live: 'Live',
};

export const MEDIA_KINDS = ['photo', 'video', 'document'] as const;
export type MediaKind = (typeof MEDIA_KINDS)[number];
export const MEDIA_STAGES = ['before', 'during', 'after'] as const;
export type MediaStage = (typeof MEDIA_STAGES)[number];

export const REQUEST_STATES = ['new', 'accepted', 'declined', 'merged'] as const;
export type RequestState = (typeof REQUEST_STATES)[number];

/** Roles that may see shop cost, labour rate, budget and every money figure. */
export const MONEY_ROLES: readonly Role[] = ['owner', 'producer'];
/** Roles that may see retail prices (but, for marketing, not shop cost). */
export const RETAIL_ROLES: readonly Role[] = ['owner', 'producer', 'marketing'];

export function canSeeMoney(roles: readonly string[]): boolean {
  return roles.some((r) => (MONEY_ROLES as readonly string[]).includes(r));
}
export function canSeeRetail(roles: readonly string[]): boolean {
  return roles.some((r) => (RETAIL_ROLES as readonly string[]).includes(r));
}

// ---- Plain records as the API sends them (money fields absent for roles that may not see them) ----

// The build and backlog records are defined once, as contracts (shared/contracts/): these names
// are the record as a screen holds it (money fields present only for roles that may see them).
import type { BuildSeen } from './contracts/build';
import type { UpgradeSeen } from './contracts/upgrade';
import type { PartSeen } from './contracts/part';
import type { RemovedPartSeen } from './contracts/removedPart';
import type { LabourEntry } from './contracts/labour';
import type { Expense } from './contracts/expense';
export type BuildRecord = BuildSeen;
export type UpgradeRecord = UpgradeSeen;
export type PartRecord = PartSeen;
export type RemovedPartRecord = RemovedPartSeen;
export type LabourEntryRecord = LabourEntry;
export type ExpenseRecord = Expense;

// Episodes and chapters are defined once, as contracts (shared/contracts/episode.ts, publishing.ts).
import type { Episode } from './contracts/episode';
import type { Chapter } from './contracts/publishing';
export type EpisodeRecord = Episode;
/** A chapter as the server sends it, or as a form holds it before it has an id. */
export type ChapterRecord = Omit<Chapter, 'id'> & { id?: number };

/** An upgrade is done when it is installed and both of its segments are shot. */
export function isUpgradeDone(u: Pick<UpgradeRecord, 'installState' | 'installSegment' | 'demoSegment'>): boolean {
  return u.installState === 'installed' && u.installSegment === 'shot' && u.demoSegment === 'shot';
}
