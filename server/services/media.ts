// Media: storing an upload (object, thumbnail, row — all or nothing), listing with presigned
// URLs, editing, deleting, and the role rules (invoices only for roles that see money).
import { randomUUID } from 'node:crypto';
import { Op, type WhereOptions } from 'sequelize';
import { sequelize, Media, Upgrade, Episode, Part, User, type Build } from '../models';
import { AppError, badRequest, forbidden, notFound } from '../errors';
import { config } from '../config';
import { record } from './activity';
import { seesMoney } from './visibility';
import { putBuffer, putFile, presignGet, removeObjects } from '../storage';
import { zodFields } from '../zodFields';
import {
  contentDisposition,
  removeTemp,
  sanitizeName,
  storageUnavailable,
  type Detected,
  type ReceivedFile,
} from './mediaFiles';
import { mediaUploadFields, type MediaListQuery, type MediaPatch, type MediaRecord } from '../../shared/schemas/media';
import type { MediaKind, Role } from '../../shared/domain';

type Person = Express.User;

export const THUMB_SIZE = 400;

/** A document on a part is an invoice: only roles that see money may see it. */
const isInvoice = (m: { kind: string; partId: number | null; invoice?: boolean }) =>
  m.invoice === true || (m.kind === 'document' && m.partId !== null);
const hiddenInvoices: WhereOptions = {
  invoice: false,
  [Op.not]: { kind: 'document', partId: { [Op.ne]: null } },
} as WhereOptions;

/** Our own object names: build, year-month, a random id and the extension of the detected type. */
function newObjectKey(buildId: number, ext: string) {
  return `builds/${buildId}/${new Date().toISOString().slice(0, 7)}/${randomUUID()}.${ext}`;
}
const thumbKeyOf = (objectKey: string) => objectKey.replace(/\.[a-z0-9]+$/, '.thumb.webp');

/** A ~400 px WebP made once at upload; null for photos the bundled decoder cannot read (HEIC). */
async function makeThumbnail(file: string, mime: string): Promise<Buffer | null> {
  // Loaded on the first photo: a server that only receives footage never maps libvips.
  const sharp = (await import('sharp')).default;
  try {
    return await sharp(file, { limitInputPixels: 268_402_689 })
      .rotate()
      .resize({ width: THUMB_SIZE, height: THUMB_SIZE, fit: 'inside', withoutEnlargement: true })
      .webp({ quality: 72 })
      .toBuffer();
  } catch {
    if (mime === 'image/heic' || mime === 'image/heif') return null;
    throw new AppError(
      415,
      'unreadable_image',
      'This photo could not be read: its content is damaged or not really an image.',
    );
  }
}

async function checkAttachments(build: Build, f: { upgradeId?: number; episodeId?: number; partId?: number }) {
  let upgradeId = f.upgradeId ?? null;
  if (
    f.upgradeId !== undefined &&
    !(await Upgrade.findOne({ where: { id: f.upgradeId, buildId: build.id }, attributes: ['id'] }))
  )
    throw badRequest('There is no such upgrade in this build.', [
      { path: 'upgradeId', message: 'is not an upgrade of this build' },
    ]);
  if (
    f.episodeId !== undefined &&
    !(await Episode.findOne({ where: { id: f.episodeId, buildId: build.id }, attributes: ['id'] }))
  )
    throw badRequest('There is no such episode in this build.', [
      { path: 'episodeId', message: 'is not an episode of this build' },
    ]);
  if (f.partId !== undefined) {
    const part = await Part.findOne({ where: { id: f.partId, buildId: build.id }, attributes: ['id', 'upgradeId'] });
    if (!part)
      throw badRequest('There is no such part in this build.', [
        { path: 'partId', message: 'is not a part of this build' },
      ]);
    if (upgradeId !== null && upgradeId !== part.upgradeId)
      throw badRequest('That part belongs to another upgrade.', [{ path: 'partId', message: 'is on another upgrade' }]);
    upgradeId = part.upgradeId;
  }
  return { upgradeId, episodeId: f.episodeId ?? null, partId: f.partId ?? null };
}

/** The checked form fields of an upload whose content turned out to be `detected`. */
async function checkUpload(build: Build, person: Person, detected: Detected, rawFields: unknown) {
  const parsed = mediaUploadFields.safeParse({ ...(rawFields as object) });
  if (!parsed.success) {
    const fields = zodFields(parsed.error);
    throw new AppError(400, 'bad_request', `Check these fields: ${fields.map((x) => x.path).join(', ')}.`, fields);
  }
  const f = parsed.data;
  const kind: MediaKind = f.kind ?? detected.kind;
  // A photographed paper invoice is a document; otherwise the content decides the kind.
  if (kind !== detected.kind && !(kind === 'document' && detected.kind === 'photo'))
    throw badRequest(`The file is a ${detected.label}, so it cannot be stored as a ${kind}.`, [
      { path: 'kind', message: `does not match the file (${detected.label})` },
    ]);
  const links = await checkAttachments(build, f);
  if (isInvoice({ kind, partId: links.partId }) && !seesMoney(person))
    throw forbidden('Invoices are kept by the owner and the producer; your role cannot add one.');
  return { f, kind, links };
}

/**
 * The upload engine's hook once the type is known: with the fields sent before the file valid,
 * the file streams into storage under this key while it arrives (videos need no second pass).
 */
export async function prepareStream(
  build: Build,
  person: Person,
  fieldsSoFar: unknown,
  detected: Detected,
): Promise<string> {
  await checkUpload(build, person, detected, fieldsSoFar);
  return newObjectKey(build.id, detected.ext);
}

/** Stores one received upload: object, thumbnail, row — all or nothing. The temporary file is always removed. */
export async function storeUpload(
  build: Build,
  person: Person,
  file: ReceivedFile | undefined,
  rawFields: unknown,
): Promise<MediaRecord> {
  // Objects written for this upload so far; removed again if anything below fails.
  const written: string[] = file?.stored ? [file.stored.key] : [];
  let m: Media;
  try {
    if (!file)
      throw badRequest('Attach the file as multipart/form-data in the field "file".', [
        { path: 'file', message: 'is required' },
      ]);
    const detected = file.detected;
    // Checked again with every field (some may have come after the file).
    const { f, kind, links } = await checkUpload(build, person, detected, rawFields);
    const originalName = sanitizeName(file.originalname);
    const thumb = detected.kind === 'photo' ? await makeThumbnail(file.path, detected.mime) : null;
    const objectKey = file.stored?.key ?? newObjectKey(build.id, detected.ext);
    const thumbKey = thumbKeyOf(objectKey);
    try {
      if (!file.stored) {
        await putFile(objectKey, file.path, detected.mime);
        written.push(objectKey);
      }
      if (thumb) {
        await putBuffer(thumbKey, thumb, 'image/webp');
        written.push(thumbKey);
      }
    } catch {
      throw storageUnavailable();
    }
    m = await sequelize.transaction(async (t) => {
      const row = await Media.create(
        {
          buildId: build.id,
          ...links,
          kind,
          invoice: isInvoice({ kind, partId: links.partId }),
          stage: f.stage ?? null,
          caption: f.caption ?? null,
          objectKey,
          thumbKey: thumb ? thumbKey : null,
          originalName,
          contentType: detected.mime,
          sizeBytes: file.size,
          sha256: file.sha256,
          uploadedBy: person.id,
        },
        { transaction: t },
      );
      await record(t, {
        actor: person,
        buildId: build.id,
        entity: 'media',
        entityId: row.id,
        action: 'uploaded',
        summary: `${person.name} uploaded ${kind} “${originalName}”`,
        after: {
          kind,
          stage: row.stage,
          caption: row.caption,
          upgradeId: row.upgradeId,
          episodeId: row.episodeId,
          partId: row.partId,
        },
      });
      return row;
    });
  } catch (err) {
    // No object without its row.
    await cleanUp(written);
    throw err;
  } finally {
    await removeTemp(file);
  }
  return toRecord(m, person.name);
}

async function cleanUp(keys: string[]) {
  if (!keys.length) return;
  await removeObjects(keys).catch((err) => {
    // The store is down: `npm run media:sweep` removes these later.
    if (!config().isTest) console.warn(`[media] could not remove ${keys.join(', ')}: ${err?.message ?? err}`);
  });
}

async function toRecord(m: Media, uploaderName: string | null): Promise<MediaRecord> {
  const ttl = config().MEDIA_URL_TTL_SECONDS;
  const [url, thumbUrl] = await Promise.all([
    presignGet(m.objectKey, {
      expiresIn: ttl,
      disposition: contentDisposition(m.originalName, 'inline'),
      contentType: m.contentType,
    }),
    m.thumbKey ? presignGet(m.thumbKey, { expiresIn: ttl, contentType: 'image/webp' }) : Promise.resolve(null),
  ]);
  return {
    id: m.id,
    buildId: m.buildId,
    upgradeId: m.upgradeId,
    episodeId: m.episodeId,
    partId: m.partId,
    kind: m.kind,
    stage: m.stage,
    caption: m.caption,
    originalName: m.originalName,
    contentType: m.contentType,
    sizeBytes: m.sizeBytes,
    sha256: m.sha256,
    uploadedBy: m.uploadedBy,
    uploadedByName: uploaderName,
    createdAt: new Date(m.createdAt).toISOString(),
    thumbUrl,
    url,
    downloadUrl: `/api/builds/${m.buildId}/media/${m.id}/download`,
  };
}

const withUploader = { model: User, as: 'uploader', attributes: ['name'] };
const uploaderName = (m: Media) => (m as Media & { uploader?: User | null }).uploader?.name ?? null;

export async function listMedia(build: Build, person: Person, q: MediaListQuery) {
  const where: WhereOptions[] = [{ buildId: build.id }];
  for (const k of ['upgradeId', 'episodeId', 'partId', 'stage', 'kind'] as const)
    if (q[k] !== undefined) where.push({ [k]: q[k] });
  if (!seesMoney(person)) where.push(hiddenInvoices);
  const { rows, count } = await Media.findAndCountAll({
    where: { [Op.and]: where },
    include: [withUploader],
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  return {
    media: await Promise.all(rows.map((m) => toRecord(m, uploaderName(m)))),
    total: count,
    page: q.page,
    pageSize: q.pageSize,
  };
}

/** One media row of this build that this person may see (invoices: money roles only), else 404. */
export async function findVisible(build: Build, person: Person, mediaId: number) {
  const m = await Media.findOne({ where: { id: mediaId, buildId: build.id }, include: [withUploader] });
  if (!m || (isInvoice(m) && !seesMoney(person))) throw notFound('Media');
  return m;
}

const SAME_DAY_MS = 24 * 3600 * 1000;
/** The owner may do what any role may. */
const hasRole = (p: Person, role: Role) => p.roles.some((r) => r === 'owner' || r === role);

/** Owner and producer change anything; an installer changes their own uploads. */
function mayChange(person: Person, m: Media, action: 'edit' | 'delete') {
  if (hasRole(person, 'producer')) return;
  if (hasRole(person, 'installer') && m.uploadedBy === person.id) {
    if (action === 'edit') return;
    if (Date.now() - new Date(m.createdAt).getTime() < SAME_DAY_MS) return;
    throw forbidden('You can delete your own uploads only on the day you made them; ask the producer.');
  }
  throw forbidden(
    action === 'edit'
      ? 'Only the producer, the owner or the person who uploaded it can change this.'
      : 'Only the producer or the owner can delete this.',
  );
}

export async function updateMedia(build: Build, person: Person, m: Media, patch: MediaPatch) {
  mayChange(person, m, 'edit');
  const before = { caption: m.caption, stage: m.stage };
  await sequelize.transaction(async (t) => {
    if (patch.caption !== undefined) m.caption = patch.caption;
    if (patch.stage !== undefined) m.stage = patch.stage;
    await m.save({ transaction: t });
    await record(t, {
      actor: person,
      buildId: build.id,
      entity: 'media',
      entityId: m.id,
      action: 'updated',
      summary: `${person.name} changed “${m.originalName}”`,
      before,
      after: { caption: m.caption, stage: m.stage },
    });
  });
  return toRecord(m, uploaderName(m));
}

export async function deleteMedia(build: Build, person: Person, m: Media) {
  mayChange(person, m, 'delete');
  const keys = [m.objectKey, ...(m.thumbKey ? [m.thumbKey] : [])];
  // Row first: if removing the objects then fails, they are leftovers the sweep removes —
  // never a row whose object is gone.
  await sequelize.transaction(async (t) => {
    await m.destroy({ transaction: t });
    await record(t, {
      actor: person,
      buildId: build.id,
      entity: 'media',
      entityId: m.id,
      action: 'deleted',
      summary: `${person.name} deleted ${m.kind} “${m.originalName}”`,
      before: { kind: m.kind, caption: m.caption, objectKey: m.objectKey },
    });
  });
  await cleanUp(keys);
}

/** A short-lived URL that downloads the object under its original name. */
export async function downloadUrl(m: Media) {
  return presignGet(m.objectKey, {
    expiresIn: Math.min(300, config().MEDIA_URL_TTL_SECONDS),
    disposition: contentDisposition(m.originalName),
    contentType: m.contentType,
  });
}
