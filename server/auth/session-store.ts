import session from 'express-session';
import { and, eq, lt } from 'drizzle-orm';
import type { Db } from '../db/client';
import { sessions } from '../db/schema';

/** A session's stored expiry may lag the cookie's by up to this much (of a 30-day life). */
const TOUCH_SLACK_MS = 60 * 60_000;

type Callback = (err?: unknown, data?: session.SessionData | null) => void;

/**
 * express-session store on the app's own SQLite database, so sessions survive restarts and are
 * shared by several app instances. Expired rows are ignored on read and swept on write.
 */
export class SqliteSessionStore extends session.Store {
  private writes = 0;

  constructor(private readonly db: Db) {
    super();
  }

  override get(sid: string, callback: Callback): void {
    try {
      const row = this.db.select().from(sessions).where(eq(sessions.sid, sid)).get();
      if (!row || row.expiresAt <= Date.now()) return callback(null, null);
      callback(null, JSON.parse(row.data));
    } catch (err) {
      callback(err);
    }
  }

  override set(sid: string, data: session.SessionData, callback?: (err?: unknown) => void): void {
    try {
      const expiresAt = data.cookie?.expires ? new Date(data.cookie.expires).getTime() : Date.now() + 86_400_000;
      const userId = typeof data.passport?.user === 'number' ? data.passport.user : null;
      const values = { sid, data: JSON.stringify(data), userId, expiresAt };
      this.db.insert(sessions).values(values).onConflictDoUpdate({ target: sessions.sid, set: values }).run();
      if (++this.writes % 100 === 0) this.db.delete(sessions).where(lt(sessions.expiresAt, Date.now())).run();
      callback?.();
    } catch (err) {
      callback?.(err);
    }
  }

  override destroy(sid: string, callback?: (err?: unknown) => void): void {
    try {
      this.db.delete(sessions).where(eq(sessions.sid, sid)).run();
      callback?.();
    } catch (err) {
      callback?.(err);
    }
  }

  override touch(sid: string, data: session.SessionData, callback?: () => void): void {
    const expiresAt = data.cookie?.expires ? new Date(data.cookie.expires).getTime() : Date.now() + 86_400_000;
    try {
      // Rolling sessions touch on every answer; only write when the expiry moves by more than the
      // slack, so signed-in reads do not write (and do not invalidate caches keyed by data version).
      this.db
        .update(sessions)
        .set({ expiresAt })
        .where(and(eq(sessions.sid, sid), lt(sessions.expiresAt, expiresAt - TOUCH_SLACK_MS)))
        .run();
    } catch {
      // A full or read-only disk must not hang the answer (express-session ends the response in
      // this callback); the session simply keeps its old expiry.
    }
    callback?.();
  }
}

declare module 'express-session' {
  interface SessionData {
    passport?: { user?: number };
  }
}
