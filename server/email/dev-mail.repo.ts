import { desc, eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { devMailMessages } from '../db/schema';

type DevMailRow = typeof devMailMessages.$inferSelect;

export function insertDevMail(db: Db, values: Omit<typeof devMailMessages.$inferInsert, 'id' | 'receivedAt'>): DevMailRow {
  return db.insert(devMailMessages).values(values).returning().get();
}

export function listDevMail(db: Db, limit = 200): DevMailRow[] {
  return db.select().from(devMailMessages).orderBy(desc(devMailMessages.id)).limit(limit).all();
}

export function findDevMail(db: Db, id: number): DevMailRow | undefined {
  return db.select().from(devMailMessages).where(eq(devMailMessages.id, id)).get();
}

export function clearDevMail(db: Db): void {
  db.delete(devMailMessages).run();
}
