// The public build page's answer, kept as the bytes sent (plain and gzipped) until its build's
// change notice arrives. It rides on the overview cache's listening connection (one per process)
// and serves only while that connection is up, so a missed notice can never keep a stale page.
import { createHash } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import { changeNoticesLive, onBuildChanged } from './overviewCache';

export interface PublicEntry {
  buildId: number;
  body: Buffer;
  gzipped: Buffer | null;
  etag: string;
}

const bySlug = new Map<string, PublicEntry>();
/** Bumped by every notice: an answer computed while a change came in is sent but not kept. */
let generation = 0;
let subscribed = false;

function subscribe() {
  if (subscribed) return;
  subscribed = true;
  onBuildChanged((buildId) => {
    generation += 1;
    if (buildId === null) return bySlug.clear();
    for (const [slug, e] of bySlug) if (e.buildId === buildId) bySlug.delete(slug);
  });
}

export function cachedPublic(slug: string): PublicEntry | null {
  subscribe();
  if (!changeNoticesLive()) return null;
  return bySlug.get(slug) ?? null;
}

/** Taken before reading the database; `keepPublic` refuses an answer a change has overtaken. */
export function publicStamp(): number | null {
  subscribe();
  return changeNoticesLive() ? generation : null;
}

export function keepPublic(slug: string, buildId: number, stamp: number | null, value: unknown): PublicEntry {
  const body = Buffer.from(JSON.stringify(value));
  const entry: PublicEntry = {
    buildId,
    body,
    gzipped: body.length > 1024 ? gzipSync(body, { level: 6 }) : null,
    etag: `W/"${createHash('sha1').update(body).digest('base64url')}"`,
  };
  if (stamp !== null && stamp === generation && changeNoticesLive()) bySlug.set(slug, entry);
  return entry;
}
