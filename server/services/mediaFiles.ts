// Receiving an uploaded file: a multer storage engine that writes to UPLOAD_DIR on disk (never
// the whole file in memory), hashes it while streaming, checks its type by its first bytes
// against our allow-list, and enforces the size limit of the kind it turns out to be.
import { createHash, randomUUID } from 'node:crypto';
import { createWriteStream, mkdirSync } from 'node:fs';
import { unlink } from 'node:fs/promises';
import path from 'node:path';
import { PassThrough, Transform, type TransformCallback } from 'node:stream';
import { pipeline } from 'node:stream/promises';
// eslint-disable-next-line no-restricted-imports -- issue 13: the multer engine belongs in the route or middleware (media owner to move it)
import type { Request } from 'express';
// eslint-disable-next-line no-restricted-imports -- issue 13: as above
import multer, { type StorageEngine } from 'multer';
import { fileTypeFromBuffer } from 'file-type';
import { config } from '../config';
import { AppError } from '../errors';
import type { MediaKind } from '../../shared/domain';
import { putStream, removeObject, type StreamUpload } from '../storage/s3';

export interface AllowedType {
  kind: MediaKind;
  ext: string;
  label: string;
}

/** What we store, by the type the content shows (not its name or the browser's claim). */
export const ALLOWED_TYPES: Record<string, AllowedType> = {
  'image/jpeg': { kind: 'photo', ext: 'jpg', label: 'JPEG photo' },
  'image/png': { kind: 'photo', ext: 'png', label: 'PNG image' },
  'image/webp': { kind: 'photo', ext: 'webp', label: 'WebP image' },
  'image/heic': { kind: 'photo', ext: 'heic', label: 'HEIC photo' },
  'image/heif': { kind: 'photo', ext: 'heif', label: 'HEIF photo' },
  'video/mp4': { kind: 'video', ext: 'mp4', label: 'MP4 video' },
  'video/quicktime': { kind: 'video', ext: 'mov', label: 'QuickTime video' },
  'video/webm': { kind: 'video', ext: 'webm', label: 'WebM video' },
  'application/pdf': { kind: 'document', ext: 'pdf', label: 'PDF document' },
};

export const ACCEPTED_DESCRIPTION = 'JPEG, PNG, WebP or HEIC photos, MP4, MOV or WebM video, and PDF documents';

/** Bytes allowed per kind, from config. */
export function limitBytes(kind: MediaKind): number {
  const c = config();
  const mb = kind === 'photo' ? c.UPLOAD_MAX_PHOTO_MB : kind === 'video' ? c.UPLOAD_MAX_VIDEO_MB : c.UPLOAD_MAX_DOCUMENT_MB;
  return Math.floor(mb * 1024 * 1024);
}
const largestLimit = () => Math.max(limitBytes('photo'), limitBytes('video'), limitBytes('document'));

const KIND_WORD: Record<MediaKind, string> = { photo: 'photos', video: 'videos', document: 'documents' };

export const tooLarge = (kind: MediaKind) =>
  new AppError(413, 'too_large', `The file is larger than ${Math.round(limitBytes(kind) / 1024 / 1024)} MB, the limit for ${KIND_WORD[kind]}.`);

/** The original name as something safe to keep and to send back: no folders, no control characters. */
export function sanitizeName(raw: string | undefined): string {
  const base = (raw ?? '').replace(/\\/g, '/').split('/').pop() ?? '';
  // eslint-disable-next-line no-control-regex
  const clean = base.replace(/[\u0000-\u001f\u007f"<>|*?:]/g, '_').replace(/^\.+/, '').trim().slice(-200);
  return clean || 'file';
}

/** A Content-Disposition header value with an ASCII fallback and the exact UTF-8 name. */
export function contentDisposition(name: string, type: 'attachment' | 'inline' = 'attachment'): string {
  const ascii = name.replace(/[^\x20-\x7e]/g, '_').replace(/["\\%]/g, '_');
  return `${type}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name).replace(/['()*]/g, (c) => '%' + c.charCodeAt(0).toString(16).toUpperCase())}`;
}

export type Detected = AllowedType & { mime: string };

export const storageUnavailable = () =>
  new AppError(503, 'storage_unavailable', 'The file store cannot be reached right now, so nothing was saved. Try again in a minute.');

/** What the engine adds to req.file. */
export interface ReceivedFile extends Express.Multer.File {
  sha256: string;
  detected: Detected;
  /** Set when the file was streamed into the object store while it arrived. */
  stored?: { key: string };
}

/**
 * Called once the type is known, before any byte goes to storage: checks the form fields read
 * so far and answers the object key to stream to (or null to store it after the upload ends).
 */
export type OnDetected = (req: Request, detected: Detected) => Promise<string | null>;

const SNIFF_BYTES = 4100; // file-type reads at most this many bytes for the formats we accept

/** Hashes and counts bytes, sniffs the type from the head, and stops past the kind's limit. */
class Inspector extends Transform {
  constructor(private onDetected?: (t: Detected) => Promise<void>) {
    super();
  }
  hash = createHash('sha256');
  size = 0;
  detected: (AllowedType & { mime: string }) | null = null;
  private head: Buffer[] = [];
  private headLength = 0;

  override _transform(chunk: Buffer, _enc: BufferEncoding, cb: TransformCallback) {
    this.hash.update(chunk);
    this.size += chunk.length;
    if (this.detected) {
      if (this.size > limitBytes(this.detected.kind)) return cb(tooLarge(this.detected.kind));
      return cb(null, chunk);
    }
    this.head.push(chunk);
    this.headLength += chunk.length;
    if (this.headLength < SNIFF_BYTES) return cb();
    this.release(cb);
  }

  override _flush(cb: TransformCallback) {
    if (this.size === 0) return cb(new AppError(400, 'empty_file', 'The file is empty (0 bytes). Choose the file again.'));
    if (this.detected) return cb();
    this.release(cb);
  }

  private release(cb: TransformCallback) {
    const head = Buffer.concat(this.head);
    this.head = [];
    sniff(head)
      .then(async (t) => {
        this.detected = t;
        if (this.size > limitBytes(t.kind)) throw tooLarge(t.kind);
        await this.onDetected?.(t);
        cb(null, head);
      })
      .catch((err) => cb(err));
  }
}

/** The allowed type of these first bytes, or a 415 naming what they are. */
export async function sniff(head: Buffer): Promise<AllowedType & { mime: string }> {
  const t = await fileTypeFromBuffer(head);
  const allowed = t && ALLOWED_TYPES[t.mime];
  if (!t || !allowed) {
    const what = t ? `a ${t.ext.toUpperCase()} file (${t.mime})` : 'not a type we can recognise from its content';
    throw new AppError(415, 'unsupported_type', `This file is ${what}. Bayslate accepts ${ACCEPTED_DESCRIPTION}.`);
  }
  return { ...allowed, mime: t.mime };
}

type UploadRequest = Request & { uploadSettled?: Promise<unknown> };

class InspectingDiskStorage implements StorageEngine {
  constructor(private onDetected?: OnDetected) {}

  _handleFile(req: Request, file: Express.Multer.File, cb: (error?: unknown, info?: Partial<ReceivedFile>) => void) {
    const dir = path.resolve(config().UPLOAD_DIR);
    mkdirSync(dir, { recursive: true });
    // Our own name on disk; the person's name is kept only as data.
    const dest = path.join(dir, `${randomUUID()}.part`);
    let upload: StreamUpload | null = null;
    // Once the type is known and the fields check out, the same bytes also stream to storage,
    // so a large video is stored by the time its last byte arrives.
    const toStore = new PassThrough({ highWaterMark: 1024 * 1024 });
    const inspector: Inspector = new Inspector(async (t) => {
      const key = this.onDetected ? await this.onDetected(req, t) : null;
      if (!key) return;
      upload = putStream(key, toStore, t.mime);
      upload.done.catch(() => inspector.destroy(storageUnavailable()));
      inspector.pipe(toStore);
    });
    const out = createWriteStream(dest, { flags: 'wx' });
    // multer answers an aborted upload at once; receiveOneFile waits for this so the temporary
    // file is gone before the person hears of the error.
    (req as UploadRequest).uploadSettled = pipeline(file.stream, inspector, out)
      .then(async () => {
        const u = upload as StreamUpload | null;
        if (u) await u.done.catch(() => Promise.reject(storageUnavailable()));
        cb(null, { path: dest, size: inspector.size, sha256: inspector.hash.digest('hex'), detected: inspector.detected!, stored: u ? { key: u.key } : undefined });
      })
      .catch(async (err) => {
        const u = upload as StreamUpload | null;
        toStore.destroy();
        if (u) await u.abort();
        // The file may still be opening when the pipeline fails early; remove it once closed,
        // or the open would create it again after the unlink.
        if (!out.closed) await new Promise<void>((r) => out.once('close', () => r()));
        await unlink(dest).catch(() => undefined);
        cb(err);
      });
  }

  // multer calls this for files already received when the upload fails later (a second file, too
  // many fields): the object streamed to storage goes too, before the person hears of the error.
  _removeFile(_req: Request, file: Express.Multer.File, cb: (error: Error | null) => void) {
    const stored = (file as Partial<ReceivedFile>).stored;
    Promise.all([
      file.path ? unlink(file.path).catch(() => undefined) : undefined,
      stored ? removeObject(stored.key).catch((err) => console.error(`[media] could not remove ${stored.key}; the sweep will:`, err?.message ?? err)) : undefined,
    ]).then(() => cb(null));
  }
}

/** The multer middleware for one file in field `file`; its errors become our JSON errors. */
export function receiveOneFile(onDetected?: OnDetected) {
  const upload = multer({
    storage: new InspectingDiskStorage(onDetected),
    // Browsers send UTF-8 file names.
    defParamCharset: 'utf8',
    limits: { files: 1, fields: 12, fieldSize: 2000, parts: 14, fileSize: largestLimit() },
  }).single('file');
  return (req: Request, res: Parameters<typeof upload>[1], next: (err?: unknown) => void) => {
    upload(req, res, async (err?: unknown) => {
      if (!err) return next();
      await (req as UploadRequest).uploadSettled?.catch(() => undefined);
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(new AppError(413, 'too_large', `The file is larger than the largest upload allowed (${Math.round(largestLimit() / 1024 / 1024)} MB).`));
        if (err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT') return next(new AppError(400, 'bad_request', 'Send one file per upload, in the form field "file".'));
        return next(new AppError(400, 'bad_request', `The upload form is not valid: ${err.message}.`));
      }
      next(err);
    });
  };
}

export async function removeTemp(file: { path?: string } | undefined) {
  if (file?.path) await unlink(file.path).catch(() => undefined);
}
