// Leftover objects: keys in the bucket that no media row names (an upload whose row was never
// written, a deleted build's files, a removal that failed while the store was down).
import { readdir, stat, unlink } from 'node:fs/promises';
import path from 'node:path';
import { Op } from 'sequelize';
import { config } from '../config';
import { Media } from '../models';
import { listKeys, removeObjects } from '../storage';

export interface SweepResult {
  scanned: number;
  orphans: { key: string; size: number }[];
  removed: number;
}

/**
 * Lists (and with `remove`, deletes) objects under builds/ that no row references. Objects newer
 * than `graceMs` are left alone: an upload in progress has its object before its row.
 */
export async function sweepOrphans(opts: { remove?: boolean; graceMs?: number } = {}): Promise<SweepResult> {
  const grace = opts.graceMs ?? 3600_000;
  const cutoff = Date.now() - grace;
  const orphans: { key: string; size: number }[] = [];
  let scanned = 0;
  let batch: { key: string; size: number }[] = [];
  const check = async () => {
    if (!batch.length) return;
    const keys = batch.map((b) => b.key);
    const rows = await Media.findAll({
      attributes: ['objectKey', 'thumbKey'],
      where: { [Op.or]: [{ objectKey: { [Op.in]: keys } }, { thumbKey: { [Op.in]: keys } }] },
    });
    const known = new Set(rows.flatMap((r) => [r.objectKey, r.thumbKey]));
    orphans.push(...batch.filter((b) => !known.has(b.key)));
    batch = [];
  };
  for await (const o of listKeys('builds/')) {
    scanned += 1;
    if (o.lastModified && o.lastModified.getTime() > cutoff) continue;
    batch.push({ key: o.key, size: o.size });
    if (batch.length >= 500) await check();
  }
  await check();
  if (opts.remove) await removeObjects(orphans.map((o) => o.key));
  return { scanned, orphans, removed: opts.remove ? orphans.length : 0 };
}

/** Temporary upload files (UPLOAD_DIR/*.part) older than `graceMs`: left by a crash mid-upload. */
export async function sweepTempFiles(opts: { remove?: boolean; graceMs?: number } = {}): Promise<string[]> {
  const dir = path.resolve(config().UPLOAD_DIR);
  const cutoff = Date.now() - (opts.graceMs ?? 3600_000);
  const names = await readdir(dir).catch(() => [] as string[]);
  const old: string[] = [];
  for (const n of names.filter((x) => x.endsWith('.part'))) {
    const f = path.join(dir, n);
    const st = await stat(f).catch(() => null);
    if (st && st.mtimeMs <= cutoff) old.push(f);
  }
  if (opts.remove) await Promise.all(old.map((f) => unlink(f).catch(() => undefined)));
  return old;
}

let sweepTimer: NodeJS.Timeout | null = null;
let sweeping: Promise<unknown> | null = null;

export interface SweeperOptions {
  intervalMs?: number;
  /** How old an object no row names must be before it goes (an upload's object exists before its row). */
  objectGraceMs?: number;
  /** How old a temporary upload file must be before it goes (a large upload may take hours). */
  tempGraceMs?: number;
  /** Called after each pass (tests). */
  onPass?: (r: { objects: number; tempFiles: number }) => void;
}

/**
 * Sweeps leftover objects and temporary upload files every MEDIA_SWEEP_MINUTES (0: never), leaving
 * anything younger than MEDIA_SWEEP_GRACE_MINUTES. The server starts it; stopMediaSweeper() waits
 * for a pass in progress. With several instances each sweeps; removing twice is harmless.
 */
export function startMediaSweeper(opts: SweeperOptions = {}) {
  const c = config();
  const intervalMs = opts.intervalMs ?? c.MEDIA_SWEEP_MINUTES * 60_000;
  if (sweepTimer || intervalMs <= 0) return;
  const grace = c.MEDIA_SWEEP_GRACE_MINUTES * 60_000;
  const pass = async () => {
    const objects = await sweepOrphans({ remove: true, graceMs: opts.objectGraceMs ?? grace });
    const temps = await sweepTempFiles({ remove: true, graceMs: opts.tempGraceMs ?? grace });
    if (objects.removed || temps.length)
      console.log(`[media] swept ${objects.removed} leftover object(s) and ${temps.length} temporary file(s)`);
    opts.onPass?.({ objects: objects.removed, tempFiles: temps.length });
  };
  const tick = () => {
    sweeping = pass()
      .catch((err) => console.error('[media] sweep failed:', err?.message ?? err))
      .finally(() => {
        sweeping = null;
        if (sweepTimer) sweepTimer = setTimeout(tick, intervalMs).unref();
      });
  };
  sweepTimer = setTimeout(tick, intervalMs).unref();
}

export async function stopMediaSweeper() {
  if (sweepTimer) clearTimeout(sweepTimer);
  sweepTimer = null;
  await sweeping;
}
