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
/**
 * Refuse decompression bombs by their declared size, before decoding: 25 megapixels holds a 24 MP
 * camera (6000 x 4000) and a phone's usual 12 MP; a photo of a fig needs no more (we keep 2000 px).
 * A file that declares more is refused from its header. The worst accepted case measured, a 94 KB
 * PNG of 24 MP RGBA in one colour, costs about 0.6 s of one core and 100 MB while it is decoded
 * (README, reliability section).
 */
export const MAX_INPUT_PIXELS = 25_000_000;
/** A decode still running after this is stopped (sharp's timeout), whatever the file. */
const DECODE_TIMEOUT_SECONDS = 10;
/** Photos one account may send per hour: decoding is the costly part, so every file sent counts. */
export const PHOTO_UPLOAD_LIMIT = { limit: 60, windowMs: 60 * 60_000 };

// One libvips thread per image: a photo being decoded never holds more than one core, so the other
// keeps answering requests (libvips uses one per core by default).
sharp.concurrency(1);

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
    // limitInputPixels is checked against the header's width x height before any pixel is decoded;
    // pages: 1 decodes only the first frame of an animated WebP or PNG.
    const main = await sharp(buffer, { failOn: 'error', limitInputPixels: MAX_INPUT_PIXELS, pages: 1 })
      .timeout({ seconds: DECODE_TIMEOUT_SECONDS })
      .autoOrient()
      .resize({ width: MAIN_EDGE, height: MAIN_EDGE, fit: 'inside', withoutEnlargement: true })
      .webp({ quality: 82 })
      .toBuffer({ resolveWithObject: true });
    const thumb = await sharp(main.data).resize({ width: THUMB_EDGE, height: THUMB_EDGE, fit: 'inside', withoutEnlargement: true }).webp({ quality: 74 }).toBuffer();
    return { main: main.data, thumb, width: main.info.width, height: main.info.height };
  } catch (error) {
    const message = (error as Error).message;
    if (/pixel limit/i.test(message)) {
      throw new HttpError(400, 'image_too_large', `The photo is larger than ${MAX_INPUT_PIXELS / 1_000_000} megapixels`, {
        [field]: [`This image declares more than ${MAX_INPUT_PIXELS / 1_000_000} megapixels; send a smaller copy (2000 pixels on the long side is plenty)`],
      });
    }
    throw new HttpError(400, 'unreadable_image', 'The photo could not be read; it may be damaged', { [field]: [message] });
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
