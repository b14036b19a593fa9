import { and, asc, count, eq, sql } from 'drizzle-orm';
import type { CurrentUser } from '../../shared/schemas/auth';
import type { Role } from '../../shared/domain/codes';
import type { Db } from '../db/client';
import { perDb } from '../db/prepared';
import { users } from '../db/schema';

type UserRow = typeof users.$inferSelect;

export function toCurrentUser(row: UserRow): CurrentUser {
  return {
    id: row.id,
    email: row.email,
    displayName: row.displayName,
    role: row.role,
    emailVerified: row.emailVerifiedAt !== null,
    createdAt: row.createdAt,
  };
}

const userByEmail = perDb((db) => db.select().from(users).where(eq(users.email, sql.placeholder('email'))).prepare());
// Every signed-in request loads its user (passport's deserializeUser).
const userById = perDb((db) => db.select().from(users).where(eq(users.id, sql.placeholder('id'))).prepare());

export function findUserByEmail(db: Db, email: string): UserRow | undefined {
  return userByEmail(db).get({ email: email.toLowerCase() });
}

export function findUserById(db: Db, id: number): UserRow | undefined {
  return userById(db).get({ id });
}

export function insertUser(
  db: Db,
  values: { email: string; displayName: string; passwordHash: string; role?: Role; emailVerifiedAt?: string | null; isDemo?: boolean; dataLicenceAgreedAt?: string | null },
): UserRow {
  // Demo accounts are invented: they count as having agreed to the data licence.
  const dataLicenceAgreedAt = values.dataLicenceAgreedAt ?? (values.isDemo ? new Date().toISOString() : null);
  return db.insert(users).values({ ...values, email: values.email.toLowerCase(), dataLicenceAgreedAt }).returning().get();
}

/** One page of accounts, by name or e-mail containing q (case-insensitive), oldest first. */
export function listUsers(db: Db, options: { q?: string; role?: Role; page: number; pageSize: number }): { rows: UserRow[]; total: number } {
  const conditions = [];
  if (options.q) {
    const pattern = `%${options.q.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    conditions.push(sql`(lower(${users.displayName}) LIKE ${pattern} ESCAPE '\\' OR ${users.email} LIKE ${pattern} ESCAPE '\\')`);
  }
  if (options.role) conditions.push(eq(users.role, options.role));
  const where = and(...conditions);
  const total = db.select({ n: count() }).from(users).where(where).get()!.n;
  const rows = db
    .select()
    .from(users)
    .where(where)
    .orderBy(asc(users.id))
    .limit(options.pageSize)
    .offset((options.page - 1) * options.pageSize)
    .all();
  return { rows, total };
}

export function setUserRole(db: Db, id: number, role: Role): UserRow | undefined {
  return db.update(users).set({ role, updatedAt: new Date().toISOString() }).where(eq(users.id, id)).returning().get();
}
