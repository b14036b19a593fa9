import session from 'express-session';
import type { Db } from '../db/client';
import { statement } from '../db/prepared';

/** A session's stored expiry may lag the cookie's by up to this much (of a 30-day life). */
const TOUCH_SLACK_MS = 60 * 60_000;

type Callback = (err?: unknown, data?: session.SessionData | null) => void;

// Plain SQL prepared once per database: every signed-in request reads its session and touches it.
const GET_SQL = 'SELECT data, expires_at AS expiresAt FROM sessions WHERE sid = ?';
const SET_SQL = `INSERT INTO sessions (sid, data, user_id, expires_at) VALUES (?, ?, ?, ?)
  ON CONFLICT (sid) DO UPDATE SET data = excluded.data, user_id = excluded.user_id, expires_at = excluded.expires_at`;
const SWEEP_SQL = 'DELETE FROM sessions WHERE expires_at < ?';
const DESTROY_SQL = 'DELETE FROM sessions WHERE sid = ?';
const TOUCH_SQL = 'UPDATE sessions SET expires_at = ? WHERE sid = ? AND expires_at < ?';

/**
 * express-session store on the app's own SQLite database, so sessions survive restarts and are
 * shared by several app instances. Expired rows are ignored on read and swept on write.
 */
export class SqliteSessionStore extends session.Store {
  private writes = 0;
  /**
   * The stored expiry of sessions this instance read or wrote lately. Expiries only move forward,
   * so when the one seen is already within the slack, a touch would change nothing: skip the
   * UPDATE (which still takes SQLite's write lock when it matches no row).
   */
  private readonly knownExpiry = new Map<string, number>();

  private remember(sid: string, expiresAt: number): void {
    if (this.knownExpiry.size >= 10_000) this.knownExpiry.clear();
    this.knownExpiry.set(sid, expiresAt);
  }

  constructor(private readonly db: Db) {
    super();
  }

  override get(sid: string, callback: Callback): void {
    try {
      const row = statement(this.db, GET_SQL).get(sid) as { data: string; expiresAt: number } | undefined;
      if (!row || row.expiresAt <= Date.now()) return callback(null, null);
      const data = JSON.parse(row.data) as session.SessionData;
      this.remember(sid, row.expiresAt);
      callback(null, data);
    } catch (err) {
      callback(err);
    }
  }

  override set(sid: string, data: session.SessionData, callback?: (err?: unknown) => void): void {
    try {
      const expiresAt = data.cookie?.expires ? new Date(data.cookie.expires).getTime() : Date.now() + 86_400_000;
      const userId = typeof data.passport?.user === 'number' ? data.passport.user : null;
      statement(this.db, SET_SQL).run(sid, JSON.stringify(data), userId, expiresAt);
      this.remember(sid, expiresAt);
      if (++this.writes % 100 === 0) statement(this.db, SWEEP_SQL).run(Date.now());
      callback?.();
    } catch (err) {
      callback?.(err);
    }
  }

  override destroy(sid: string, callback?: (err?: unknown) => void): void {
    try {
      this.knownExpiry.delete(sid);
      statement(this.db, DESTROY_SQL).run(sid);
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
      const known = this.knownExpiry.get(sid);
      if (known === undefined || known < expiresAt - TOUCH_SLACK_MS) {
        if (statement(this.db, TOUCH_SQL).run(expiresAt, sid, expiresAt - TOUCH_SLACK_MS).changes) this.remember(sid, expiresAt);
      }
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
