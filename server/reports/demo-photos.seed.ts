import { and, desc, eq, inArray } from 'drizzle-orm';
import sharp from 'sharp';
import type { Db } from '../db/client';
import { reportPhotos, reports, users } from '../db/schema';
import { processPhoto, storePhoto } from '../photos/photos';

/** A plain drawn fig (our own illustration), in a few colourings: demo photos, not real pictures. */
function figIllustration(skin: string, flesh: string, ground: string): Buffer {
  return Buffer.from(`<svg xmlns="http://www.w3.org/2000/svg" width="800" height="600" viewBox="0 0 800 600">
  <rect width="800" height="600" fill="${ground}"/>
  <path d="M250 120c20 0 34 14 35 32 70 27 113 102 113 176 0 88-64 142-148 142s-148-54-148-142c0-74 43-149 113-176 1-18 15-32 35-32z" fill="${skin}"/>
  <path d="M250 140c8 0 14 6 16 14" stroke="#5e8a57" stroke-width="10" fill="none" stroke-linecap="round"/>
  <path d="M560 170c50 17 82 64 82 118 0 54-37 88-82 88s-82-34-82-88c0-54 32-101 82-118z" fill="${skin}"/>
  <path d="M560 205c34 12 55 44 55 82 0 37-25 60-55 60s-55-23-55-60c0-38 21-70 55-82z" fill="${flesh}"/>
  <g fill="#f3d9a4">
    <circle cx="545" cy="280" r="6"/><circle cx="575" cy="300" r="6"/><circle cx="560" cy="255" r="6"/>
    <circle cx="540" cy="315" r="6"/><circle cx="585" cy="268" r="6"/>
  </g>
  <text x="400" y="560" font-family="sans-serif" font-size="22" fill="#2b2230" fill-opacity="0.6" text-anchor="middle">Demo illustration</text>
</svg>`);
}

const COLOURINGS = [
  ['#6b3a5b', '#e9a0a8', '#e4eedf'],
  ['#a9c79d', '#d9646f', '#faf6ef'],
  ['#8e4f73', '#f0b27a', '#efdfe8'],
] as const;

/**
 * Give the demo grower's three latest reports one drawn photo each, made and cleaned by
 * the same pipeline as uploads. Skipped when those reports already have photos (idempotent).
 */
export async function seedDemoPhotos(db: Db, uploadsDir: string): Promise<void> {
  const grower = db.select({ id: users.id }).from(users).where(eq(users.email, 'grower@demo.syconium.test')).get();
  if (!grower) return;
  const targets = db
    .select({ id: reports.id })
    .from(reports)
    .where(and(eq(reports.userId, grower.id), eq(reports.status, 'published')))
    .orderBy(desc(reports.season), desc(reports.id))
    .limit(COLOURINGS.length)
    .all();
  if (targets.length === 0) return;
  const existing = db.select({ id: reportPhotos.id }).from(reportPhotos).where(inArray(reportPhotos.reportId, targets.map((t) => t.id))).get();
  if (existing) return;
  for (const [i, target] of targets.entries()) {
    const [skin, flesh, ground] = COLOURINGS[i]!;
    // Uploads never accept SVG, so the drawing is rasterised first, then cleaned like any upload.
    const photo = await processPhoto(await sharp(figIllustration(skin, flesh, ground)).png().toBuffer());
    const names = await storePhoto(uploadsDir, photo);
    db.insert(reportPhotos).values({ reportId: target.id, ...names, mime: 'image/webp', width: photo.width, height: photo.height, bytes: photo.main.length, position: 0 }).run();
  }
}
