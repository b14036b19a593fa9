import { eq } from 'drizzle-orm';
import { modelAccuracySchema, type ModelAccuracy } from '../../shared/schemas/accuracy';
import type { Db } from '../db/client';
import { modelAccuracy } from '../db/schema';

export function readModelAccuracy(db: Db): (ModelAccuracy & { dataVersion: number }) | null {
  const row = db.select().from(modelAccuracy).where(eq(modelAccuracy.id, 1)).get();
  return row ? { ...modelAccuracySchema.parse(JSON.parse(row.body)), dataVersion: row.dataVersion } : null;
}

export function storeModelAccuracy(db: Db, body: ModelAccuracy, dataVersion: number): void {
  const values = { id: 1, computedAt: body.computedAt ?? new Date().toISOString(), dataVersion, body: JSON.stringify(body) };
  db.insert(modelAccuracy).values(values).onConflictDoUpdate({ target: modelAccuracy.id, set: values }).run();
}
