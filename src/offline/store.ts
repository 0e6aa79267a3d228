// What the shop floor keeps on the phone (IndexedDB through idb): the last shop-floor answer per
// person and build, the outbox of actions made while they could not be sent (strictly ordered by
// `seq`), and the refusals the server gave to sent actions, kept until the person dismisses them.
import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { LabourKind, MediaStage } from '@shared/domain';
import type { InstallerChange } from '@/api/upgrades';
import type { Mark, ShopFloor } from '@/api/shopFloor';

interface QueuedBase {
  /** Order of sending; given by IndexedDB (auto-increment), never reused. */
  seq?: number;
  userId: number;
  buildId: number;
  upgradeId: number;
  upgradeTitle: string;
  /** The upgrade's record version the person saw when they acted. */
  version: number;
  /**
   * Sent as the Idempotency-Key header: when the network loses the answer to a change the server
   * saved, the resend gets that answer back instead of making the change twice. Given on enqueue.
   */
  key?: string;
  /** What the person did, in words ("Start", "1.5 h install", "Photo IMG_1.jpg"). */
  label: string;
  createdAt: string;
}
export interface QueuedMark extends QueuedBase {
  kind: 'mark';
  mark: Mark;
  change: InstallerChange;
}
export interface QueuedHours extends QueuedBase {
  kind: 'hours';
  hours: number;
  labourKind: LabourKind;
  workedOn: string;
}
export interface QueuedPhoto extends QueuedBase {
  kind: 'photo';
  blob: Blob;
  fileName: string;
  stage: MediaStage;
  episodeId: number | null;
}
export type QueuedAction = QueuedMark | QueuedHours | QueuedPhoto;
/** A queued action before IndexedDB numbered it. */
export type NewAction = Omit<QueuedMark, 'seq'> | Omit<QueuedHours, 'seq'> | Omit<QueuedPhoto, 'seq'>;

/** A sent action the server refused: what, on which upgrade, and the server's words. */
export interface Refusal {
  id?: number;
  userId: number;
  buildId: number;
  upgradeId: number;
  upgradeTitle: string;
  label: string;
  kind: QueuedAction['kind'];
  status: number;
  message: string;
  madeAt: string;
  refusedAt: string;
}

export interface Snapshot {
  key: string;
  userId: number;
  buildId: number;
  data: ShopFloor;
  savedAt: string;
}

interface OfflineSchema extends DBSchema {
  snapshots: { key: string; value: Snapshot };
  outbox: { key: number; value: QueuedAction; indexes: { byUser: number } };
  refusals: { key: number; value: Refusal; indexes: { byUser: number } };
}

export const DB_NAME = 'bayslate-offline';
let opening: Promise<IDBPDatabase<OfflineSchema>> | null = null;

function db() {
  opening ??= openDB<OfflineSchema>(DB_NAME, 1, {
    upgrade(d) {
      d.createObjectStore('snapshots', { keyPath: 'key' });
      d.createObjectStore('outbox', { keyPath: 'seq', autoIncrement: true }).createIndex('byUser', 'userId');
      d.createObjectStore('refusals', { keyPath: 'id', autoIncrement: true }).createIndex('byUser', 'userId');
    },
  });
  return opening;
}

/** Closes the connection (tests delete the database between cases). */
export async function closeStore() {
  if (!opening) return;
  (await opening).close();
  opening = null;
}

const snapshotKey = (userId: number, buildId: number) => `${userId}:${buildId}`;

/** A key no other action of this phone has: a random UUID where the browser has one. */
export function newActionKey(): string {
  if (typeof crypto !== 'undefined' && typeof crypto.randomUUID === 'function') return crypto.randomUUID();
  return `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 12)}-${Math.random().toString(36).slice(2, 12)}`;
}

export const offlineStore = {
  async saveSnapshot(userId: number, buildId: number, data: ShopFloor) {
    await (
      await db()
    ).put('snapshots', {
      key: snapshotKey(userId, buildId),
      userId,
      buildId,
      data: JSON.parse(JSON.stringify(data)) as ShopFloor,
      savedAt: new Date().toISOString(),
    });
  },
  async snapshot(userId: number, buildId: number): Promise<Snapshot | undefined> {
    return (await db()).get('snapshots', snapshotKey(userId, buildId));
  },
  /** Adds an action at the end of the outbox; answers its `seq`. */
  async enqueue(action: NewAction): Promise<number> {
    return (await db()).add('outbox', { ...action, key: action.key ?? newActionKey() } as QueuedAction);
  },
  /** This person's waiting actions, oldest first. */
  async queued(userId: number): Promise<QueuedAction[]> {
    const all = await (await db()).getAllFromIndex('outbox', 'byUser', userId);
    return all.sort((a, b) => a.seq! - b.seq!);
  },
  async first(userId: number): Promise<QueuedAction | undefined> {
    return (await offlineStore.queued(userId))[0];
  },
  /** Removes a waiting action; answers false when it was no longer there. */
  async remove(seq: number): Promise<boolean> {
    const tx = (await db()).transaction('outbox', 'readwrite');
    const found = (await tx.store.getKey(seq)) !== undefined;
    if (found) await tx.store.delete(seq);
    await tx.done;
    return found;
  },
  /** Moves a refused action from the outbox to the refusals, in one transaction (nothing lost between). */
  async refuse(action: QueuedAction, status: number, message: string): Promise<Refusal> {
    const tx = (await db()).transaction(['outbox', 'refusals'], 'readwrite');
    const refusal: Refusal = {
      userId: action.userId,
      buildId: action.buildId,
      upgradeId: action.upgradeId,
      upgradeTitle: action.upgradeTitle,
      label: action.label,
      kind: action.kind,
      status,
      message,
      madeAt: action.createdAt,
      refusedAt: new Date().toISOString(),
    };
    refusal.id = await tx.objectStore('refusals').add(refusal);
    await tx.objectStore('outbox').delete(action.seq!);
    await tx.done;
    return refusal;
  },
  async refusals(userId: number): Promise<Refusal[]> {
    const all = await (await db()).getAllFromIndex('refusals', 'byUser', userId);
    return all.sort((a, b) => a.id! - b.id!);
  },
  async dismiss(id: number) {
    await (await db()).delete('refusals', id);
  },
};
export type OfflineStore = typeof offlineStore;
