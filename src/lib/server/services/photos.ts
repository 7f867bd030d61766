import { and, count, eq, inArray } from 'drizzle-orm';
import sharp from 'sharp';
import { z, type ZodType } from 'zod';
import { getDb, type Db } from '~/lib/server/db';
import { inspectionItems, inspections, photos } from '~/db/schema';
import type { Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError, notFound, parseForm } from '~/lib/server/http';
import { IMAGE_EXTENSION, sniffImageType, type ImageType } from '~/lib/server/image-sniff';
import { storage, type ObjectStorage } from '~/lib/server/storage';
import { BodyTooLarge, readCapped } from '~/lib/server/body';

/** The largest photo accepted: a full-resolution phone picture fits comfortably. */
export const MAX_PHOTO_BYTES = 8 * 1024 * 1024;
/** Room for the multipart envelope around the photo. */
const MULTIPART_OVERHEAD = 64 * 1024;
/** Enough to show every side of a worn element; a cap keeps one line from filling the store. */
export const MAX_PHOTOS_PER_ITEM = 12;
/**
 * The most pixels a photo may have (width × height), read from its header before anything is
 * decoded: a small file can declare a huge picture (a 31 KB PNG of 16000 × 16000 takes seconds of
 * CPU and a gigabyte to decode). 40 megapixels is above any phone camera's normal output.
 * `CAGEWRIGHT_MAX_PHOTO_PIXELS` changes it.
 */
export const DEFAULT_MAX_PHOTO_PIXELS = 40_000_000;
export function maxPhotoPixels(env: NodeJS.ProcessEnv = process.env): number {
  const n = Number(env.CAGEWRIGHT_MAX_PHOTO_PIXELS);
  return Number.isInteger(n) && n > 0 ? n : DEFAULT_MAX_PHOTO_PIXELS;
}
/** Thumbnails fit in this box (pixels), JPEG. */
const THUMB_BOX = 480;

const megabytes = (n: number) => `${Math.round(n / (1024 * 1024))} MB`;
const tooLarge = () =>
  new HttpError(413, `The photo is larger than ${megabytes(MAX_PHOTO_BYTES)}. Take it at a lower resolution or crop it.`, 'photo');
const notAnImage = () => new HttpError(415, 'That file is not a JPEG, PNG or WebP photo.', 'photo');
const tooManyPixels = (w: number, h: number, max: number) =>
  new HttpError(
    413,
    `photo: the picture is ${w} × ${h} pixels; at most ${Math.floor(max / 1e6)} megapixels are accepted. Take it at a lower resolution.`,
    'photo',
    {
      width: w,
      height: h,
      maxPixels: max,
    },
  );

/** The fields of a photo upload: the picture itself, as a file, in a field named "photo". */
export const photoUploadSchema = z.object({
  photo: z
    .instanceof(Blob, { error: 'attach the picture in a field named "photo".' })
    .refine((file) => file.size > 0, 'the file is empty.'),
});

export interface UploadedPhoto {
  bytes: Uint8Array;
  type: ImageType;
  width: number;
  height: number;
}

/**
 * Reads a multipart/form-data upload with a `photo` field, refusing early: a declared length
 * over the limit is refused before reading, and reading stops as soon as the body passes it.
 * The type comes from the file's bytes; the size in pixels from the image's header, before
 * anything is decoded; then the image is decoded and re-encoded without metadata.
 */
export async function readPhotoUpload(request: Request, schema: ZodType<{ photo: Blob }> = photoUploadSchema): Promise<UploadedPhoto> {
  const type = request.headers.get('content-type') ?? '';
  if (!/^multipart\/form-data;\s*boundary=/i.test(type)) {
    throw new HttpError(415, 'Send the photo as multipart/form-data in a field named "photo".', 'content-type');
  }
  let body: Uint8Array<ArrayBuffer>;
  try {
    body = await readCapped(request, MAX_PHOTO_BYTES + MULTIPART_OVERHEAD);
  } catch (err) {
    if (err instanceof BodyTooLarge) throw tooLarge();
    throw new HttpError(400, 'The upload could not be read.', 'body');
  }

  let form: FormData;
  try {
    form = await new Response(body, { headers: { 'content-type': type } }).formData();
  } catch {
    throw new HttpError(400, 'The upload could not be read as multipart/form-data.', 'body');
  }
  const { photo: file } = parseForm(form, schema);
  if (file.size > MAX_PHOTO_BYTES) throw tooLarge();
  const bytes = new Uint8Array(await file.arrayBuffer());
  return checkedPhoto(bytes);
}

/** The checks on a photo's bytes (type, pixels, decoding) and its metadata-free re-encoding. */
export async function checkedPhoto(bytes: Uint8Array, maxPixels = maxPhotoPixels()): Promise<UploadedPhoto> {
  const sniffed = sniffImageType(bytes);
  if (!sniffed) throw notAnImage();
  let meta: sharp.Metadata;
  try {
    // Reads the header only; nothing is decoded yet.
    meta = await sharp(bytes, { failOn: 'error', limitInputPixels: false }).metadata();
  } catch {
    throw notAnImage();
  }
  if (!meta.width || !meta.height) throw notAnImage();
  if (meta.width * meta.height > maxPixels) throw tooManyPixels(meta.width, meta.height, maxPixels);
  return withoutMetadata(bytes, sniffed, maxPixels);
}

/**
 * Phones write where a picture was taken (GPS), when, and with what device into its metadata;
 * files can also carry comments and text blocks (JPEG COM segments, PNG tEXt/iTXt/zTXt chunks)
 * with anything in them. Every photo is therefore decoded and stored re-encoded by sharp, in its
 * own format: turned upright (the turn was in EXIF), colour profile kept, nothing else carried
 * over. Decoding also proves the file is a whole image.
 */
async function withoutMetadata(bytes: Uint8Array, type: ImageType, maxPixels: number): Promise<UploadedPhoto> {
  try {
    const upright = sharp(bytes, { failOn: 'error', limitInputPixels: maxPixels }).rotate().keepIccProfile();
    const encoded =
      type === 'image/jpeg' ? upright.jpeg({ quality: 92 }) : type === 'image/png' ? upright.png() : upright.webp({ quality: 92 });
    const { data, info } = await encoded.toBuffer({ resolveWithObject: true });
    return { bytes: new Uint8Array(data), type, width: info.width, height: info.height };
  } catch {
    throw notAnImage();
  }
}

/** A thumbnail upright (phones store the turn in EXIF), without metadata, as JPEG. */
export async function makeThumbnail(bytes: Uint8Array): Promise<Uint8Array> {
  const out = await sharp(bytes, { limitInputPixels: maxPhotoPixels() })
    .rotate()
    .resize(THUMB_BOX, THUMB_BOX, { fit: 'inside', withoutEnlargement: true })
    .flatten({ background: '#ffffff' })
    .jpeg({ quality: 78, mozjpeg: true })
    .toBuffer();
  return new Uint8Array(out);
}

export const photoKeys = (inspectionId: string, photoId: string, type: ImageType) => ({
  original: `inspections/${inspectionId}/${photoId}.${IMAGE_EXTENSION[type]}`,
  thumb: `inspections/${inspectionId}/${photoId}-thumb.jpg`,
});

/** The line of an inspection the actor may see, with its inspection's status and organisation. */
async function itemForActor(actor: Actor, inspectionId: string, itemId: string, db: Db) {
  const [row] = await db
    .select({
      itemId: inspectionItems.id,
      inspectionId: inspections.id,
      orgId: inspections.orgId,
      status: inspections.status,
      placeKey: inspectionItems.placeKey,
    })
    .from(inspectionItems)
    .innerJoin(inspections, eq(inspections.id, inspectionItems.inspectionId))
    .where(and(eq(inspectionItems.id, itemId), eq(inspections.id, inspectionId), inArray(inspections.orgId, actor.visibleOrgIds)))
    .limit(1);
  if (!row) throw notFound('Inspection line not found', 'itemId');
  return row;
}

/**
 * The line a photo would go to, checked before the upload is read: not found for another
 * organisation, 409 when the inspection is finished or the line has its fill of photos.
 */
export async function photoTarget(actor: Actor, inspectionId: string, itemId: string, dbArg?: Db) {
  const db = dbArg ?? (await getDb());
  const item = await itemForActor(actor, inspectionId, itemId, db);
  if (item.status !== 'open') throw new HttpError(409, 'This inspection is finished; photos can no longer be added.', 'status');
  const [{ n }] = (await db.select({ n: count() }).from(photos).where(eq(photos.itemId, item.itemId))) as { n: number }[];
  if (n >= MAX_PHOTOS_PER_ITEM) throw new HttpError(409, `A line takes at most ${MAX_PHOTOS_PER_ITEM} photos; remove one first.`, 'photo');
  return item;
}

/** What the user hears when the object store is away; the details go to the server log. */
function storeAway(
  err: unknown,
  what: string,
  words = 'The photo store did not answer in time, so nothing was saved. Try again in a moment.',
): HttpError {
  console.error(`cagewright: ${what}:`, err instanceof Error ? err.message : err);
  return new HttpError(503, words, 'photo');
}

/** Removes objects in the background: the store is away, the user hears at once, and the orphan sweep catches what this misses. */
function removeLater(store: ObjectStorage, keys: string[]) {
  void Promise.allSettled(keys.map((k) => store.delete(k)));
}

/**
 * Inside the transaction that inserts a photo row: locks the line's row (so uploads to one line
 * take turns, on the embedded store and on a PostgreSQL server alike) and counts its photos, so
 * parallel uploads can never pass the cap. 409 when the line is full.
 */
export async function reservePhotoPlace(tx: Pick<Db, 'select'>, itemId: string) {
  await tx.select({ id: inspectionItems.id }).from(inspectionItems).where(eq(inspectionItems.id, itemId)).for('update');
  const [{ n }] = (await tx.select({ n: count() }).from(photos).where(eq(photos.itemId, itemId))) as { n: number }[];
  if (n >= MAX_PHOTOS_PER_ITEM) throw new HttpError(409, `A line takes at most ${MAX_PHOTOS_PER_ITEM} photos; remove one first.`, 'photo');
}

/**
 * Stores a photo and its thumbnail for a line of an open inspection. The objects are stored
 * first, outside any database transaction (a slow object store must never hold the store's
 * connection), and the row is written after both are in place. If anything fails the objects
 * are removed again; if the process dies between the two, the orphan sweep
 * (`services/maintenance.ts`) removes objects no row names.
 */
export async function addPhoto(
  actor: Actor,
  inspectionId: string,
  itemId: string,
  photo: UploadedPhoto,
  opts: { db?: Db; store?: ObjectStorage } = {},
) {
  const db = opts.db ?? (await getDb());
  const store = opts.store ?? storage();
  const item = await photoTarget(actor, inspectionId, itemId, db);

  const thumb = await makeThumbnail(photo.bytes);
  const photoId = crypto.randomUUID();
  const keys = photoKeys(item.inspectionId, photoId, photo.type);
  try {
    await store.put(keys.original, photo.bytes, photo.type);
    await store.put(keys.thumb, thumb, 'image/jpeg');
  } catch (err) {
    removeLater(store, [keys.original, keys.thumb]);
    if (err instanceof HttpError) throw err;
    throw storeAway(err, `storing photo ${photoId} failed`);
  }
  try {
    return await db.transaction(async (tx) => {
      // The line's cap is checked with the row written, under a lock on the line.
      await reservePhotoPlace(tx, item.itemId);
      const [row] = await tx
        .insert(photos)
        .values({
          id: photoId,
          itemId: item.itemId,
          orgId: item.orgId,
          storageKey: keys.original,
          thumbKey: keys.thumb,
          contentType: photo.type,
          bytes: photo.bytes.byteLength,
          createdBy: actor.id,
        })
        .returning();
      await audit(
        tx,
        actor,
        'add-photo',
        'inspection',
        item.inspectionId,
        { photoId, itemId: item.itemId, placeKey: item.placeKey, bytes: photo.bytes.byteLength, type: photo.type },
        item.orgId,
      );
      return {
        id: row!.id,
        itemId: row!.itemId,
        contentType: row!.contentType,
        bytes: row!.bytes,
        width: photo.width,
        height: photo.height,
        url: `/api/photos/${row!.id}`,
        thumbUrl: `/api/photos/${row!.id}?thumb=1`,
        createdAt: row!.createdAt,
      };
    });
  } catch (err) {
    // The store answered a moment ago: remove the objects before answering.
    await Promise.allSettled([store.delete(keys.original), store.delete(keys.thumb)]);
    throw err;
  }
}

/** A photo the actor may see (the inspection's organisation is visible to them), else not found. */
export async function photoForActor(actor: Actor, photoId: string, db?: Db) {
  const d = db ?? (await getDb());
  const [row] = await d
    .select({
      id: photos.id,
      storageKey: photos.storageKey,
      thumbKey: photos.thumbKey,
      contentType: photos.contentType,
      bytes: photos.bytes,
      inspectionId: inspections.id,
      status: inspections.status,
      orgId: inspections.orgId,
    })
    .from(photos)
    .innerJoin(inspectionItems, eq(inspectionItems.id, photos.itemId))
    .innerJoin(inspections, eq(inspections.id, inspectionItems.inspectionId))
    .where(and(eq(photos.id, photoId), inArray(inspections.orgId, actor.visibleOrgIds)))
    .limit(1);
  if (!row) throw notFound('Photo not found', 'id');
  return row;
}

/** The photo (or its thumbnail) as a response streamed from storage. */
export async function photoResponse(actor: Actor, photoId: string, thumb: boolean): Promise<Response> {
  const row = await photoForActor(actor, photoId);
  const key = thumb && row.thumbKey ? row.thumbKey : row.storageKey;
  let obj;
  try {
    obj = await storage().get(key);
  } catch (err) {
    throw storeAway(err, `reading photo ${row.id} failed`, 'The photo store did not answer in time. Try again in a moment.');
  }
  if (!obj) throw notFound('The photo file is missing from storage', 'id');
  const type = thumb && row.thumbKey ? 'image/jpeg' : row.contentType;
  const headers: Record<string, string> = {
    'content-type': type,
    'x-content-type-options': 'nosniff',
    // Private: only people who may see the inspection get it; ids never change their content.
    'cache-control': 'private, max-age=86400, immutable',
    'content-disposition': `inline; filename="photo-${row.id}${thumb ? '-thumb' : ''}.${type === 'image/jpeg' ? 'jpg' : type.split('/')[1]}"`,
    'content-security-policy': "default-src 'none'; sandbox",
  };
  if (obj.size !== null) headers['content-length'] = String(obj.size);
  return new Response(obj.body, { status: 200, headers });
}

/** Removes a photo from an open inspection (row first, then the files; the orphan sweep catches a miss). */
export async function deletePhoto(actor: Actor, photoId: string) {
  const db = await getDb();
  const row = await photoForActor(actor, photoId, db);
  if (row.status !== 'open') throw new HttpError(409, 'This inspection is finished; its photos are kept with it.', 'status');
  await db.transaction(async (tx) => {
    await tx.delete(photos).where(eq(photos.id, row.id));
    await audit(tx, actor, 'delete-photo', 'inspection', row.inspectionId, { photoId: row.id }, row.orgId);
  });
  // The row is gone, so the photo is gone for everyone; the files follow (outside any
  // transaction, each call bounded by the store's deadline; the orphan sweep catches a miss).
  const store = storage();
  await Promise.allSettled([store.delete(row.storageKey), row.thumbKey ? store.delete(row.thumbKey) : Promise.resolve()]);
  return { deleted: row.id };
}
