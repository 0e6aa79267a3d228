// The HTTP edge of an upload: a multer storage engine that writes the one file of a multipart
// form to UPLOAD_DIR on disk (never the whole file in memory), inspecting it on the way
// (services/mediaFiles.ts: type by content, hash, size limit per kind) and, once its type is
// known and the fields check out, streaming the same bytes into object storage.
import { randomUUID } from 'node:crypto';
import { createWriteStream, mkdirSync } from 'node:fs';
import { unlink } from 'node:fs/promises';
import path from 'node:path';
import { PassThrough } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Request } from 'express';
import multer, { type StorageEngine } from 'multer';
import { config } from '../config';
import { AppError } from '../errors';
import { putStream, removeObject, type StreamUpload } from '../storage/s3';
import { Inspector, largestLimit, storageUnavailable, type Detected, type ReceivedFile } from '../services/mediaFiles';

/**
 * Called once the type is known, before any byte goes to storage: checks the form fields read
 * so far and answers the object key to stream to (or null to store it after the upload ends).
 */
export type OnDetected = (req: Request, detected: Detected) => Promise<string | null>;

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
        cb(null, {
          path: dest,
          size: inspector.size,
          sha256: inspector.hash.digest('hex'),
          detected: inspector.detected!,
          stored: u ? { key: u.key } : undefined,
        });
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
      stored
        ? removeObject(stored.key).catch((err) =>
            console.error(`[media] could not remove ${stored.key}; the sweep will:`, err?.message ?? err),
          )
        : undefined,
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
        if (err.code === 'LIMIT_FILE_SIZE')
          return next(
            new AppError(
              413,
              'too_large',
              `The file is larger than the largest upload allowed (${Math.round(largestLimit() / 1024 / 1024)} MB).`,
            ),
          );
        if (err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT')
          return next(new AppError(400, 'bad_request', 'Send one file per upload, in the form field "file".'));
        return next(new AppError(400, 'bad_request', `The upload form is not valid: ${err.message}.`));
      }
      next(err);
    });
  };
}
