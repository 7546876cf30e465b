import { and, eq } from 'drizzle-orm';
import sharp from 'sharp';
import { fileTypeFromBuffer } from 'file-type';
import type { Db } from '../db/client.ts';
import { partMedia, parts } from '../db/schema/index.ts';
import type { FileStore } from '../storage/files.ts';
import type { PartsIndex } from '../search/parts-index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { AppError, NotFoundError, ValidationError } from '../errors.ts';

export const IMAGE_LIMIT = 5 * 1024 * 1024;
export const DATASHEET_LIMIT = 20 * 1024 * 1024;
const IMAGE_TYPES = new Map([
  ['image/jpeg', 'jpg'],
  ['image/png', 'png'],
  ['image/webp', 'webp'],
]);

export interface Upload {
  buffer: Buffer;
  originalname: string;
  size: number;
}

/** Decides what a file is from its bytes, never from its name or the browser's claim. */
async function classify(file: Upload) {
  if (file.size === 0) throw new ValidationError('The file is empty.');
  const type = await fileTypeFromBuffer(file.buffer);
  if (type?.mime === 'application/pdf') {
    if (file.size > DATASHEET_LIMIT) throw new AppError(413, 'file_too_large', 'Datasheets can be at most 20 MB.');
    return { kind: 'datasheet' as const, contentType: 'application/pdf', extension: 'pdf' };
  }
  const ext = type && IMAGE_TYPES.get(type.mime);
  if (!type || !ext)
    throw new AppError(415, 'unsupported_file_type', 'Upload a JPEG, PNG or WebP photo, or a PDF datasheet. This file is neither.');
  if (file.size > IMAGE_LIMIT) throw new AppError(413, 'file_too_large', 'Photos can be at most 5 MB.');
  return { kind: 'image' as const, contentType: type.mime, extension: ext };
}

/**
 * Photos and datasheets. An upload or removal and the part's search document (its thumbnail)
 * change in one transaction: a refused index update rolls the row back.
 */
export function createMediaService({ db, files, partsIndex }: { db: Db; files: FileStore; partsIndex: PartsIndex }) {
  async function partId(sku: string) {
    const [p] = await db.select({ id: parts.id }).from(parts).where(eq(parts.sku, sku.toUpperCase()));
    if (!p) throw new NotFoundError('That part');
    return p.id;
  }

  return {
    async upload(actor: Actor, sku: string, file: Upload | undefined) {
      authorize(actor, 'catalogue.edit');
      if (!file) throw new ValidationError('Choose a file to upload (form field "file").');
      const id = await partId(sku);
      const what = await classify(file);
      let thumbnail: Buffer | null = null;
      if (what.kind === 'image') {
        try {
          thumbnail = await sharp(file.buffer, { limitInputPixels: 40_000_000 }).rotate().resize(320, 320, { fit: 'inside', withoutEnlargement: true }).webp({ quality: 80 }).toBuffer();
        } catch {
          throw new ValidationError('That image could not be read: it may be damaged. Try exporting it again.');
        }
      }
      const storageKey = await files.put(file.buffer, what.extension);
      const thumbnailKey = thumbnail ? await files.put(thumbnail, 'webp') : null;
      try {
        return await db.transaction(async (tx) => {
          const [row] = await tx
            .insert(partMedia)
            .values({ partId: id, kind: what.kind, contentType: what.contentType, fileName: safeName(file.originalname, what.extension), bytes: file.size, storageKey, thumbnailKey })
            .returning();
          await partsIndex.sync(tx, [id]);
          return row!;
        });
      } catch (e) {
        await files.remove(storageKey);
        if (thumbnailKey) await files.remove(thumbnailKey);
        throw e;
      }
    },

    async remove(actor: Actor, sku: string, mediaId: string) {
      authorize(actor, 'catalogue.edit');
      const id = await partId(sku);
      const row = await db.transaction(async (tx) => {
        const [removed] = await tx.delete(partMedia).where(and(eq(partMedia.id, mediaId), eq(partMedia.partId, id))).returning();
        if (!removed) throw new NotFoundError('That file');
        await partsIndex.sync(tx, [id]);
        return removed;
      });
      // The files go once the row is gone for good; a failed removal leaves only an orphan file.
      await files.remove(row.storageKey);
      if (row.thumbnailKey) await files.remove(row.thumbnailKey);
    },

    /** The bytes of a file (or its thumbnail) for anyone who may see the catalogue. */
    async read(actor: Actor, mediaId: string, variant: 'original' | 'thumbnail') {
      authorize(actor, 'catalogue.view');
      const [row] = await db.select().from(partMedia).where(eq(partMedia.id, mediaId));
      if (!row) throw new NotFoundError('That file');
      const key = variant === 'thumbnail' ? row.thumbnailKey : row.storageKey;
      const bytes = key ? await files.get(key) : null;
      if (!bytes) throw new NotFoundError('That file');
      return { bytes, contentType: variant === 'thumbnail' ? 'image/webp' : row.contentType, fileName: row.fileName };
    },
  };
}

export type MediaService = ReturnType<typeof createMediaService>;

function safeName(name: string, extension: string) {
  const base = name.replace(/\.[^.]*$/, '').replace(/[^\w .-]+/g, '_').slice(0, 80).trim() || 'file';
  return `${base}.${extension}`;
}
