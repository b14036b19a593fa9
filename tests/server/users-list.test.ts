import { describe, expect, it } from 'vitest';
import { hashPassword } from '../../server/auth/password';
import { insertUser } from '../../server/users/users.repo';
import { auditPageSchema } from '../../shared/schemas/audit';
import { userListSchema } from '../../shared/schemas/auth';
import { createTestContext } from '../helpers/test-app';

const ctx = createTestContext();

describe('GET /api/users: search and pages on the server', () => {
  it('finds by name or e-mail, filters by role, pages, and counts the whole match', async () => {
    const admin = await ctx.signedIn('admin');
    const passwordHash = await hashPassword('a long enough password');
    for (let i = 1; i <= 30; i++) insertUser(ctx.db, { email: `orchard${i}@example.com`, displayName: `Orchard Keeper ${i}`, passwordHash });
    insertUser(ctx.db, { email: 'quince@example.com', displayName: 'Quincy Editor', passwordHash, role: 'editor' });

    const first = userListSchema.parse((await admin.get('/api/users?q=orchard&pageSize=10')).body);
    expect(first.total).toBe(30);
    expect(first.users).toHaveLength(10);
    expect(first.users[0]!.displayName).toBe('Orchard Keeper 1');
    const last = userListSchema.parse((await admin.get('/api/users?q=orchard&pageSize=10&page=3')).body);
    expect(last.users.map((u) => u.displayName)).toContain('Orchard Keeper 30');

    const byMail = userListSchema.parse((await admin.get('/api/users?q=QUINCE@')).body);
    expect(byMail.users.map((u) => u.email)).toEqual(['quince@example.com']);
    const editors = userListSchema.parse((await admin.get('/api/users?role=editor')).body);
    expect(editors.users.every((u) => u.role === 'editor')).toBe(true);
    // A % in the search is a letter, not a wildcard.
    expect(userListSchema.parse((await admin.get('/api/users?q=%25')).body).total).toBe(0);
  });

  it('refuses a bad page or role, naming the field', async () => {
    const admin = await ctx.signedIn('admin');
    expect((await admin.get('/api/users?page=0')).body.error.fields).toHaveProperty('page');
    expect((await admin.get('/api/users?role=overlord')).body.error.fields).toHaveProperty('role');
  });
});

describe('the audit log in words', () => {
  it('names the record and the people and varieties its changes refer to', async () => {
    const admin = await ctx.signedIn('admin');
    const grower = await ctx.signedIn('grower', 'named-grower@example.com');
    expect((await admin.patch(`/api/users/${grower.userId}/role`).send({ role: 'editor' })).status).toBe(200);
    const page = auditPageSchema.parse((await admin.get('/api/audit?action=user.role')).body);
    const entry = page.items.find((e) => e.entityId === grower.userId)!;
    expect(entry.entityName).toBeTruthy();
    expect(entry.entityName).not.toMatch(/^\d+$/);
  });
});
