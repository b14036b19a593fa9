import { randomBytes } from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import { HttpError } from '../lib/http-error';

/** What a photo may be, judged by its bytes (never by its name or the browser's content type). */
export const ACCEPTED_PHOTO_TYPES = new Set(['image/jpeg', 'image/png', 'image/webp']);

const MAIN_EDGE = 2000;
const THUMB_EDGE = 400;
/** Refuse decompression bombs: 50 megapixels is well above any phone camera. */
const MAX_INPUT_PIXELS = 50_000_000;

export interface ProcessedPhoto {
  main: Buffer;
  thumb: Buffer;
  width: number;
  height: number;
}

/**
 * Check a photo's content and re-encode it: turned upright from its EXIF orientation, then written
 * anew as WebP without any metadata (sharp keeps none unless asked; we never ask), so EXIF, GPS,
 * XMP and IPTC are gone. A small thumbnail is made from the cleaned image.
 */
export async function processPhoto(buffer: Buffer, field = 'photos'): Promise<ProcessedPhoto> {
  const type = await fileTypeFromBuffer(buffer);
  if (!type || !ACCEPTED_PHOTO_TYPES.has(type.mime)) {
    throw new HttpError(400, 'unsupported_image', 'Only JPEG, PNG or WebP photos are accepted', {
      [field]: [`This file is ${type ? `a ${type.ext.toUpperCase()} file` : 'not an image we can read'}; send a JPEG, PNG or WebP photo`],
    });
  }
  try {
    const main = await sharp(buffer, { failOn: 'error', limitInputPixels: MAX_INPUT_PIXELS })
      .autoOrient()
      .resize({ width: MAIN_EDGE, height: MAIN_EDGE, fit: 'inside', withoutEnlargement: true })
      .webp({ quality: 82 })
      .toBuffer({ resolveWithObject: true });
    const thumb = await sharp(main.data).resize({ width: THUMB_EDGE, height: THUMB_EDGE, fit: 'inside', withoutEnlargement: true }).webp({ quality: 74 }).toBuffer();
    return { main: main.data, thumb, width: main.info.width, height: main.info.height };
  } catch (error) {
    throw new HttpError(400, 'unreadable_image', 'The photo could not be read; it may be damaged', { [field]: [(error as Error).message] });
  }
}

/** Where report photos live under the uploads folder. */
export const photoDir = (uploadsDir: string) => path.resolve(uploadsDir, 'reports');

/** File names are random and made here; the client's file name is never used. */
export const PHOTO_NAME_PATTERN = /^[a-f0-9]{32}(-thumb)?\.webp$/;

export async function storePhoto(uploadsDir: string, photo: ProcessedPhoto): Promise<{ fileName: string; thumbName: string }> {
  const dir = photoDir(uploadsDir);
  await fs.mkdir(dir, { recursive: true });
  const stem = randomBytes(16).toString('hex');
  const fileName = `${stem}.webp`;
  const thumbName = `${stem}-thumb.webp`;
  await fs.writeFile(path.join(dir, fileName), photo.main, { flag: 'wx' });
  await fs.writeFile(path.join(dir, thumbName), photo.thumb, { flag: 'wx' });
  return { fileName, thumbName };
}

/** Remove stored files (after their rows are gone); missing files are fine. */
export async function removePhotoFiles(uploadsDir: string, names: string[]): Promise<void> {
  const dir = photoDir(uploadsDir);
  await Promise.all(names.filter((n) => PHOTO_NAME_PATTERN.test(n)).map((n) => fs.rm(path.join(dir, n), { force: true })));
}

export const photoUrl = (fileName: string) => `/uploads/reports/${fileName}`;
