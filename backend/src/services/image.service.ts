import { createReadStream } from 'node:fs';
import { assertPrintEditable } from './print-lock';
import { mkdtemp, rm, stat } from 'node:fs/promises';
import { randomUUID } from 'node:crypto';
import os from 'node:os';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { createWriteStream } from 'node:fs';
import sharp from 'sharp';
import { Op, QueryTypes } from 'sequelize';
import type { ObjectStore } from '@toneledger/storage/object-store';
import { can, type Role } from '@toneledger/common/domain/roles';
import type { PrintImage, FixityResult } from '@toneledger/common/schemas/images';
import { db } from '../db';
import { FixityCheck, Image, ImageAlignment, Print } from '../models';
import { AppError, notFound, serviceUnavailable, validationFailed } from '../errors';
import { recordAudit, type AuditActor } from './audit.service';
import { staleEdit } from './versioning';
import { MAX_IMAGE_PIXELS, inspectImage, readExif, sha256Of, type ExifSummary, type ReceivedFile } from './image-ingest';
import type { JobQueue } from '../jobs/queue';
import { QUEUES } from '../jobs/queue';
import { dropIiifCache } from './iiif-image.service';

export const DERIVATIVES = { thumb: 320, screen: 1600 } as const;

const keyFor = (printId: string, imageId: string, variant: 'original' | 'thumb' | 'screen') =>
  `images/${printId}/${imageId}/${variant}${variant === 'original' ? '' : '.webp'}`;

export function presentFixity(f: FixityCheck): FixityResult {
  return { id: String(f.id), checkedAt: f.checkedAt.toISOString(), ok: f.outcome === 'match', outcome: f.outcome, expected: f.expected, actual: f.actual, detail: f.detail };
}

export function presentImage(i: Image, role: Role | null, lastFixity: FixityCheck | null): PrintImage {
  const base = `/api/images/${i.id}/file`;
  const ready = i.derivatives === 'ready' && !i.purgedAt;
  const e = i.exif as Partial<PrintImage['exif']>;
  return {
    id: i.id, printId: i.printId, viewType: i.viewType as PrintImage['viewType'], capturedOn: i.capturedOn, notes: i.notes,
    fileName: i.fileName, contentType: i.contentType, sizeBytes: Number(i.sizeBytes), width: i.width, height: i.height, sha256: i.sha256,
    exif: {
      capturedAt: e.capturedAt ?? null, make: e.make ?? null, model: e.model ?? null, lens: e.lens ?? null,
      exposureTime: e.exposureTime ?? null, fNumber: e.fNumber ?? null, iso: e.iso ?? null, focalLength: e.focalLength ?? null,
    },
    derivatives: i.derivatives,
    urls: {
      thumb: ready ? `${base}/thumb` : null,
      screen: ready ? `${base}/screen` : null,
      original: can(role, 'images.original') && !i.purgedAt ? `${base}/original` : null,
    },
    lastFixity: lastFixity ? presentFixity(lastFixity) : null,
    uploadedAt: i.uploadedAt.toISOString(), uploadedBy: i.uploadedByName,
    withdrawn: i.withdrawnAt ? { at: i.withdrawnAt.toISOString(), by: i.withdrawnByName, reason: i.withdrawnReason ?? '', purgeAfter: i.purgeAfter!.toISOString() } : null,
    version: i.version,
  };
}

async function latestFixity(ids: string[]) {
  if (!ids.length) return new Map<string, FixityCheck>();
  const latest = await db().query<{ id: string }>(
    'SELECT DISTINCT ON (image_id) id FROM fixity_checks WHERE image_id = ANY($1) ORDER BY image_id, checked_at DESC, id DESC',
    { bind: [ids], type: QueryTypes.SELECT },
  );
  const rows = await FixityCheck.findAll({ where: { id: latest.map((r) => r.id) } });
  return new Map(rows.map((r) => [r.imageId, r]));
}

/** Stores the received file as the image's original, then records it; nothing is half-written. */
export async function storeImage(
  deps: { store: ObjectStore; queue: JobQueue | null },
  printId: string,
  file: ReceivedFile,
  fields: { viewType: string; capturedOn?: string; notes?: string },
  actor: AuditActor,
  requestId: string | null,
): Promise<Image> {
  const print = await Print.findByPk(printId, { attributes: ['id', 'accessionNumber'] });
  if (!print) throw notFound('The print');
  await assertPrintEditable(printId);
  const id = randomUUID();
  const key = keyFor(printId, id, 'original');
  // Storing and the full decode check (which renders the screen copy) run side by side; whichever fails, nothing is kept.
  const screenPath = path.join(file.tempDir, 'screen.webp');
  const screenKey = keyFor(printId, id, 'screen');
  const [put, inspected, exif] = await Promise.allSettled([
    deps.store.put(key, createReadStream(file.path), { contentType: file.contentType, contentLength: file.sizeBytes }),
    inspectImage(file.path, { path: screenPath, size: DERIVATIVES.screen }),
    readExif(file.path),
  ]);
  if (inspected.status === 'rejected') {
    if (put.status === 'fulfilled') await deps.store.delete(key).catch(() => {});
    throw inspected.reason;
  }
  if (put.status === 'rejected') throw serviceUnavailable('Image storage is not available; nothing was saved. Try again shortly.');
  try {
    const { size } = await stat(screenPath);
    await deps.store.put(screenKey, createReadStream(screenPath), { contentType: 'image/webp', contentLength: size });
  } catch {
    await deps.store.delete(key).catch(() => {});
    throw serviceUnavailable('Image storage is not available; nothing was saved. Try again shortly.');
  }
  const { width, height } = inspected.value;
  const exifSummary: ExifSummary = exif.status === 'fulfilled' ? exif.value : { capturedAt: null, make: null, model: null, lens: null, exposureTime: null, fNumber: null, iso: null, focalLength: null };
  let image: Image;
  try {
    image = await db().transaction(async (t) => {
      await assertPrintEditable(printId, t);
      const row = await Image.create(
        {
          id, printId, viewType: fields.viewType, capturedOn: fields.capturedOn ?? (exifSummary.capturedAt ? exifSummary.capturedAt.slice(0, 10) : null),
          notes: fields.notes ?? null, fileName: file.originalName, contentType: file.contentType, sizeBytes: file.sizeBytes,
          width, height, sha256: file.sha256, originalKey: key, thumbKey: null, screenKey,
          exif: exifSummary as unknown as Record<string, unknown>, uploadedBy: actor.id, uploadedByName: actor.name,
          withdrawnAt: null, withdrawnByName: null, withdrawnReason: null, purgeAfter: null, purgedAt: null,
        },
        { transaction: t },
      );
      await recordAudit(
        { actor, action: 'image.uploaded', entityType: 'image', entityId: id, after: { printId, accessionNumber: print.accessionNumber, viewType: fields.viewType, sha256: file.sha256, sizeBytes: file.sizeBytes, fileName: file.originalName }, requestId },
        t,
      );
      return row;
    });
  } catch (err) {
    await deps.store.delete(key).catch(() => {});
    await deps.store.delete(screenKey).catch(() => {});
    throw err;
  }
  if (deps.queue) await deps.queue.send(QUEUES.derivatives, { imageId: id });
  else await makeDerivatives(deps.store, id);
  return image;
}

/**
 * The display copies. An upload already stored the screen copy (made by its decode check), so the
 * job makes the thumbnail from it; without one (or to remake both) it decodes the original.
 */
export async function makeDerivatives(store: ObjectStore, imageId: string, options: { remake?: boolean } = {}): Promise<void> {
  const image = await Image.findByPk(imageId);
  if (!image || image.purgedAt) return;
  if (image.screenKey && !options.remake) {
    try {
      const chunks: Buffer[] = [];
      for await (const chunk of await store.get(image.screenKey)) chunks.push(chunk as Buffer);
      const thumb = await sharp(Buffer.concat(chunks)).resize(DERIVATIVES.thumb, DERIVATIVES.thumb, { fit: 'inside', withoutEnlargement: true }).webp({ quality: 70 }).toBuffer();
      await store.put(keyFor(image.printId, image.id, 'thumb'), thumb, { contentType: 'image/webp', contentLength: thumb.length });
      await image.update({ thumbKey: keyFor(image.printId, image.id, 'thumb'), derivatives: 'ready' });
      return;
    } catch {
      // The screen copy is missing or unreadable: make both from the original below.
    }
  }
  const dir = await mkdtemp(path.join(os.tmpdir(), 'toneledger-derive-'));
  try {
    const local = path.join(dir, 'original');
    await pipeline(await store.get(image.originalKey), createWriteStream(local));
    // Decode the original once, for the screen copy; the thumbnail is made from that copy.
    const screen = await sharp(local, { limitInputPixels: MAX_IMAGE_PIXELS })
      .rotate()
      .resize(DERIVATIVES.screen, DERIVATIVES.screen, { fit: 'inside', withoutEnlargement: true })
      .webp({ quality: 82 })
      .toBuffer();
    const thumb = await sharp(screen).resize(DERIVATIVES.thumb, DERIVATIVES.thumb, { fit: 'inside', withoutEnlargement: true }).webp({ quality: 70 }).toBuffer();
    for (const [variant, out] of [['screen', screen], ['thumb', thumb]] as const) {
      await store.put(keyFor(image.printId, image.id, variant), out, { contentType: 'image/webp', contentLength: out.length });
    }
    await image.update({ thumbKey: keyFor(image.printId, image.id, 'thumb'), screenKey: keyFor(image.printId, image.id, 'screen'), derivatives: 'ready' });
  } catch (err) {
    await image.update({ derivatives: 'failed' });
    throw err;
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

export async function listImages(printId: string, role: Role | null, includeWithdrawn: boolean) {
  if ((await Print.count({ where: { id: printId } })) === 0) throw notFound('The print');
  const staff = can(role, 'catalogue.read_restricted');
  const where: Record<string, unknown> = { printId };
  if (!(includeWithdrawn && staff)) where.withdrawnAt = null;
  const rows = await Image.findAll({ where, order: [['capturedOn', 'ASC NULLS LAST'], ['uploadedAt', 'ASC']] });
  const fixity = await latestFixity(rows.map((r) => r.id));
  const voids = await voidedCaptureDates(rows.map((r) => r.id));
  return rows.map((r) => ({ ...presentImage(r, role, fixity.get(r.id) ?? null), voidedCaptureDates: voids.get(r.id) ?? [] }));
}

/** The capture dates voided as mistaken, per image, oldest first (`void.service.ts`). */
export async function voidedCaptureDates(ids: string[]): Promise<Map<string, NonNullable<PrintImage['voidedCaptureDates']>>> {
  const out = new Map<string, NonNullable<PrintImage['voidedCaptureDates']>>();
  if (!ids.length) return out;
  const rows = await db().query<{ image_id: string; captured_on: string; voided_at: Date; voided_by_name: string; reason: string }>(
    `SELECT image_id, to_char(captured_on, 'YYYY-MM-DD') AS captured_on, voided_at, voided_by_name, reason FROM image_capture_date_voids WHERE image_id = ANY($1::uuid[]) ORDER BY voided_at, id`,
    { bind: [ids], type: QueryTypes.SELECT },
  );
  for (const r of rows) {
    const list = out.get(r.image_id) ?? [];
    list.push({ capturedOn: r.captured_on, at: new Date(r.voided_at).toISOString(), by: r.voided_by_name, reason: r.reason });
    out.set(r.image_id, list);
  }
  return out;
}

export async function getImage(id: string, role: Role | null) {
  const row = await Image.findByPk(id);
  if (!row || (row.withdrawnAt && !can(role, 'catalogue.read_restricted'))) throw notFound('The image');
  const fixity = await latestFixity([id]);
  return { row, dto: presentImage(row, role, fixity.get(id) ?? null) };
}

export async function openVariant(store: ObjectStore, id: string, variant: 'thumb' | 'screen' | 'original', role: Role | null) {
  const { row } = await getImage(id, role);
  if (variant === 'original' && !can(role, 'images.original')) throw new AppError('forbidden', 403, 'Your role may see display copies, not originals.');
  if (row.purgedAt) throw notFound('The image file');
  const key = variant === 'original' ? row.originalKey : variant === 'thumb' ? row.thumbKey : row.screenKey;
  if (!key) throw notFound(`The ${variant} of this image (still being made)`);
  try {
    return { stream: await store.get(key), contentType: variant === 'original' ? row.contentType : 'image/webp', row };
  } catch {
    throw serviceUnavailable('Image storage is not available.');
  }
}

export async function updateImage(id: string, body: { viewType?: string; capturedOn?: string | null; notes?: string | null; version: number }, actor: AuditActor & { role: Role }, requestId: string | null) {
  return db().transaction(async (t) => {
    const row = await Image.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
    if (!row || row.withdrawnAt) throw notFound('The image');
    await assertPrintEditable(row.printId, t);
    if (row.version !== body.version) throw await staleEdit('image', id, presentImage(row, actor.role, null), t);
    const before = { viewType: row.viewType, capturedOn: row.capturedOn, notes: row.notes };
    const { version: _v, ...changes } = body;
    await row.update({ ...changes, version: row.version + 1 } as never, { transaction: t });
    await recordAudit({ actor, action: 'image.updated', entityType: 'image', entityId: id, before, after: { viewType: row.viewType, capturedOn: row.capturedOn, notes: row.notes, printId: row.printId }, requestId }, t);
    return presentImage(row, actor.role, null);
  });
}

/**
 * Withdrawing keeps the files for the retention period (`retentionDays`, env IMAGE_RETENTION_DAYS);
 * the purge job removes them later, and says so in the audit trail.
 */
export async function withdrawImage(
  id: string,
  body: { reason: string; version: number },
  actor: AuditActor & { role: Role },
  requestId: string | null,
  retentionDays: number,
) {
  return db().transaction(async (t) => {
    const row = await Image.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE });
    if (!row || row.withdrawnAt) throw notFound('The image');
    await assertPrintEditable(row.printId, t);
    if (row.version !== body.version) throw await staleEdit('image', id, presentImage(row, actor.role, null), t);
    const purgeAfter = new Date(Date.now() + retentionDays * 86_400_000);
    await row.update({ withdrawnAt: new Date(), withdrawnByName: actor.name, withdrawnReason: body.reason, purgeAfter, version: row.version + 1 }, { transaction: t });
    await recordAudit({ actor, action: 'image.withdrawn', entityType: 'image', entityId: id, after: { printId: row.printId, reason: body.reason, purgeAfter: purgeAfter.toISOString(), sha256: row.sha256 }, requestId }, t);
    return presentImage(row, actor.role, null);
  });
}

/** Re-reads one stored original and compares its SHA-256 with the value kept at upload. */
export async function checkFixity(store: ObjectStore, image: Image): Promise<FixityCheck> {
  let outcome: FixityCheck['outcome'] = 'match';
  let actual: string | null = null;
  let detail: string | null = null;
  try {
    const head = await store.head(image.originalKey);
    if (!head) {
      outcome = 'missing';
      detail = 'The stored original is missing.';
    } else {
      actual = await sha256Of(await store.get(image.originalKey));
      if (actual !== image.sha256) {
        outcome = 'mismatch';
        detail = `The stored original changed: ${head.size} bytes now, ${image.sizeBytes} at upload.`;
      }
    }
  } catch (err) {
    outcome = 'error';
    detail = `Storage could not be read: ${(err as Error).name}`;
  }
  const check = await FixityCheck.create({ imageId: image.id, outcome, expected: image.sha256, actual, detail });
  if (outcome !== 'match') {
    await recordAudit({ actor: null, action: `image.fixity_${outcome}`, entityType: 'image', entityId: image.id, after: { printId: image.printId, expected: image.sha256, actual, detail }, requestId: 'fixity' });
  }
  return check;
}

export async function fixitySweep(store: ObjectStore): Promise<{ checked: number; problems: number }> {
  const images = await Image.findAll({ where: { purgedAt: null }, order: [['uploadedAt', 'ASC']] });
  let problems = 0;
  for (const image of images) if ((await checkFixity(store, image)).outcome !== 'match') problems += 1;
  return { checked: images.length, problems };
}

/** Latest check per image where it did not match: the admin's alert list. */
export async function fixityAlerts() {
  const rows = await db().query<{ id: string }>(
    `SELECT f.id FROM (SELECT DISTINCT ON (image_id) id, outcome FROM fixity_checks ORDER BY image_id, checked_at DESC, id DESC) f WHERE f.outcome <> 'match'`,
    { type: QueryTypes.SELECT },
  );
  const checks = await FixityCheck.findAll({ where: { id: rows.map((r) => r.id) } });
  const images = await Image.findAll({ where: { id: checks.map((c) => c.imageId) } });
  const prints = await Print.findAll({ where: { id: images.map((i) => i.printId) }, attributes: ['id', 'accessionNumber'] });
  return checks.map((c) => {
    const image = images.find((i) => i.id === c.imageId)!;
    return {
      imageId: image.id, printId: image.printId, accessionNumber: prints.find((p) => p.id === image.printId)?.accessionNumber ?? '',
      viewType: image.viewType as PrintImage['viewType'], result: presentFixity(c),
    };
  });
}

/** Purges the files of images withdrawn longer ago than their retention; `retentionDays` is recorded in the audit trail. */
export async function purgeWithdrawn(store: ObjectStore, retentionDays: number): Promise<number> {
  const due = await Image.findAll({ where: { purgedAt: null, purgeAfter: { [Op.lt]: new Date() } } });
  for (const image of due) {
    for (const key of [image.originalKey, image.thumbKey, image.screenKey]) if (key) await store.delete(key);
    await dropIiifCache(store, image.id);
    await image.update({ purgedAt: new Date() });
    await recordAudit({ actor: null, action: 'image.purged', entityType: 'image', entityId: image.id, before: { sha256: image.sha256, printId: image.printId }, after: { purgedAfterRetentionDays: retentionDays }, requestId: 'purge' });
  }
  return due.length;
}

export async function saveAlignment(body: { baseImageId: string; otherImageId: string; offsetX: number; offsetY: number; scale: number; rotationDeg: number }, actor: AuditActor) {
  if (body.baseImageId === body.otherImageId) throw validationFailed([{ path: 'otherImageId', message: 'Choose two different images', code: 'same' }]);
  const [a, b] = await Promise.all([Image.findByPk(body.baseImageId), Image.findByPk(body.otherImageId)]);
  if (!a || !b) throw notFound('An image');
  if (a.printId !== b.printId) throw validationFailed([{ path: 'otherImageId', message: 'Both images must be of the same print', code: 'other_print' }]);
  await assertPrintEditable(a.printId);
  const [row] = await ImageAlignment.upsert({ ...body, savedByName: actor.name, savedAt: new Date() } as never, { conflictFields: ['base_image_id', 'other_image_id'] as never });
  return { id: row.id, ...body, savedBy: actor.name, savedAt: new Date(row.savedAt ?? Date.now()).toISOString() };
}

export async function getAlignment(baseImageId: string, otherImageId: string) {
  const row = await ImageAlignment.findOne({ where: { baseImageId, otherImageId } });
  if (!row) return null;
  return {
    id: row.id, baseImageId, otherImageId, offsetX: row.offsetX, offsetY: row.offsetY, scale: row.scale, rotationDeg: row.rotationDeg,
    savedBy: row.savedByName, savedAt: row.savedAt.toISOString(),
  };
}

/** A stored upload as the uploader sees it. */
export async function uploadImage(...args: Parameters<typeof storeImage>): Promise<PrintImage> {
  const actor = args[4] as AuditActor & { role: Role };
  return presentImage(await storeImage(...args), actor.role, null);
}

/** One image as the given role may see it. */
export async function imageFor(id: string, role: Role | null): Promise<PrintImage> {
  return (await getImage(id, role)).dto;
}

/** Every fixity check of one image, newest first. */
export async function fixityHistory(id: string, role: Role | null): Promise<FixityResult[]> {
  await getImage(id, role);
  const rows = await FixityCheck.findAll({ where: { imageId: id }, order: [['checkedAt', 'DESC'], ['id', 'DESC']] });
  return rows.map(presentFixity);
}

/** Checks one image now. */
export async function checkFixityNow(store: ObjectStore, id: string, role: Role | null): Promise<FixityResult> {
  const { row } = await getImage(id, role);
  return presentFixity(await checkFixity(store, row));
}
