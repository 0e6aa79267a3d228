// Receiving an uploaded file, without HTTP: the allowed types, sniffing the type from the first
// bytes, hashing and counting while streaming, the size limit of the kind it turns out to be.
// The multer engine that feeds these lives at the HTTP edge (server/middleware/upload.ts).
import { createHash } from 'node:crypto';
import { unlink } from 'node:fs/promises';
import { Transform, type TransformCallback } from 'node:stream';
import { fileTypeFromBuffer } from 'file-type';
import { config } from '../config';
import { AppError } from '../errors';
import type { MediaKind } from '../../shared/domain';

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
  const mb =
    kind === 'photo' ? c.UPLOAD_MAX_PHOTO_MB : kind === 'video' ? c.UPLOAD_MAX_VIDEO_MB : c.UPLOAD_MAX_DOCUMENT_MB;
  return Math.floor(mb * 1024 * 1024);
}
export const largestLimit = () => Math.max(limitBytes('photo'), limitBytes('video'), limitBytes('document'));

const KIND_WORD: Record<MediaKind, string> = { photo: 'photos', video: 'videos', document: 'documents' };

export const tooLarge = (kind: MediaKind) =>
  new AppError(
    413,
    'too_large',
    `The file is larger than ${Math.round(limitBytes(kind) / 1024 / 1024)} MB, the limit for ${KIND_WORD[kind]}.`,
  );

// Control characters and the characters file systems refuse.
// eslint-disable-next-line no-control-regex
const UNSAFE_IN_NAME = /[\u0000-\u001f\u007f"<>|*?:]/g;

/** The original name as something safe to keep and to send back: no folders, no control characters. */
export function sanitizeName(raw: string | undefined): string {
  const base = (raw ?? '').replace(/\\/g, '/').split('/').pop() ?? '';
  const clean = base.replace(UNSAFE_IN_NAME, '_').replace(/^\.+/, '').trim().slice(-200);
  return clean || 'file';
}

/** A Content-Disposition header value with an ASCII fallback and the exact UTF-8 name. */
export function contentDisposition(name: string, type: 'attachment' | 'inline' = 'attachment'): string {
  const ascii = name.replace(/[^\x20-\x7e]/g, '_').replace(/["\\%]/g, '_');
  return `${type}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name).replace(/['()*]/g, (c) => '%' + c.charCodeAt(0).toString(16).toUpperCase())}`;
}

export type Detected = AllowedType & { mime: string };

export const storageUnavailable = () =>
  new AppError(
    503,
    'storage_unavailable',
    'The file store cannot be reached right now, so nothing was saved. Try again in a minute.',
  );

/** A file the upload engine (server/middleware/upload.ts) received. */
export interface ReceivedFile {
  /** The name the person's device gave it (kept only as data). */
  originalname: string;
  /** Where it waits on disk. */
  path: string;
  size: number;
  sha256: string;
  detected: Detected;
  /** Set when the file was streamed into the object store while it arrived. */
  stored?: { key: string };
}

const SNIFF_BYTES = 4100; // file-type reads at most this many bytes for the formats we accept

/** Hashes and counts bytes, sniffs the type from the head, and stops past the kind's limit. */
export class Inspector extends Transform {
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
    if (this.size === 0)
      return cb(new AppError(400, 'empty_file', 'The file is empty (0 bytes). Choose the file again.'));
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

export async function removeTemp(file: { path?: string } | undefined) {
  if (file?.path) await unlink(file.path).catch(() => undefined);
}
