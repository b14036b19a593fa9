import { describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { nearResponseSchema } from '../../shared/schemas/atlas';
import { pinsResponseSchema } from '../../shared/schemas/pins';
import { auditLog, reports, users, varieties } from '../../server/db/schema';
import { createMailTestContext, join, linkToken } from './email-helpers';

/*
 * The draft notice says a draft "will be published once your e-mail address is verified":
 * following the link publishes every draft of that grower, in the same transaction.
 */
describe('confirming the e-mail address publishes the grower’s drafts', async () => {
  const ctx = await createMailTestContext();
  const variety = ctx.db.insert(varieties).values({ name: 'Verifier’s Violet', isFictional: true }).returning().get().id;
  const body = (lat: number, lon: number) => ({ varietyId: variety, newTreeLabel: 'by the wall', lat, lon, form: 'ground', season: 2026, crop: 'main', outcome: 'ripened', firstRipeDate: '2026-08-20' });
  const row = (id: number) => ctx.db.select().from(reports).where(eq(reports.id, id)).get()!;
  const publicCount = async () => {
    const near = nearResponseSchema.parse((await ctx.agent().get('/api/atlas/near?lat=44&lon=4&radiusKm=50')).body);
    const pins = pinsResponseSchema.parse((await ctx.agent().get(`/api/atlas/pins?bbox=-180,-90,180,90&zoom=3&varietyId=${variety}`)).body);
    return { near: near.varieties.find((v) => v.varietyId === variety)?.all.reports ?? 0, pins: pins.totalReports };
  };

  // A second grower, also unconfirmed, whose draft must stay a draft.
  const other = await ctx.signedIn('grower', 'other@example.com');
  ctx.db.update(users).set({ emailVerifiedAt: null }).where(eq(users.id, other.userId)).run();
  let otherDraft: number;

  it('turns every draft into a published report with published_at, an audit entry, and a place on the atlas', async () => {
    const grower = ctx.agent();
    expect((await join(ctx, grower, { email: 'drafts@example.com', displayName: 'Dora', acceptDataLicence: true, password: 'a long enough password' })).status).toBe(200);
    const token = linkToken(ctx.inbox('drafts@example.com')[0]!.text, '/verify');
    expect(ctx.inbox('drafts@example.com')[0]!.text).toMatch(/published as soon as\s+the address is\s+confirmed/);

    const ids: number[] = [];
    for (const [lat, lon] of [[44.01, 4.02], [44.05, 3.97]] as const) {
      const res = await grower.post('/api/reports').send(body(lat, lon));
      expect(res.status).toBe(201);
      expect(res.body.report.status).toBe('draft');
      expect(res.body.notice).toMatch(/published once your e-mail address is verified/);
      ids.push(res.body.report.id);
    }
    const res = await other.post('/api/reports').send(body(44.02, 4.01));
    expect(res.body.report.status).toBe('draft');
    otherDraft = res.body.report.id;
    expect(await publicCount()).toEqual({ near: 0, pins: 0 });

    const before = new Date().toISOString();
    const verify = await ctx.agent().post('/api/auth/verify').send({ token });
    expect(verify.status).toBe(200);
    expect(verify.body.message).toBe('Your e-mail address is confirmed, and your 2 draft reports are now published. New reports are published as soon as you save them.');

    const userId = ctx.db.select().from(users).where(eq(users.email, 'drafts@example.com')).get()!;
    for (const id of ids) {
      const r = row(id);
      expect(r.status).toBe('published');
      expect(r.publishedAt! >= before).toBe(true);
      // Published in the same transaction as the confirmation: the same instant.
      expect(r.publishedAt).toBe(userId.emailVerifiedAt);
      expect(r.updatedById).toBe(userId.id);
      const audit = ctx.db.select().from(auditLog).where(and(eq(auditLog.entityId, id), eq(auditLog.action, 'report.publish'))).all();
      expect(audit).toHaveLength(1);
      expect(audit[0]!.actorId).toBe(userId.id);
      expect(audit[0]!.after).toEqual({ status: 'published', via: 'email-verified' });
    }
    // Both now count on the atlas (near: trees within 50 km; pins: the whole world).
    expect(await publicCount()).toEqual({ near: 2, pins: 2 });
    // Seen by a visitor too.
    expect((await ctx.agent().get(`/api/reports/${ids[0]}`)).status).toBe(200);
    // A report saved after confirmation is published at once.
    expect((await grower.post('/api/reports').send(body(44.03, 4.03))).body.report.status).toBe('published');
  });

  it('leaves another grower’s drafts alone, and a second confirmation does nothing', async () => {
    expect(row(otherDraft).status).toBe('draft');
    expect(row(otherDraft).publishedAt).toBeNull();
    expect((await ctx.agent().get(`/api/reports/${otherDraft}`)).status).toBe(404);

    // The grower asks for another link (already confirmed: refused) ...
    const grower = ctx.agent();
    await grower.post('/api/auth/sign-in').send({ email: 'drafts@example.com', password: 'a long enough password' });
    expect((await grower.post('/api/auth/verify/resend')).status).toBe(409);
    // ... and an earlier, unused link of an already confirmed grower publishes nothing new.
    const other2 = await ctx.signedIn('grower', 'twice@example.com');
    ctx.db.update(users).set({ emailVerifiedAt: null }).where(eq(users.id, other2.userId)).run();
    const first = await other2.post('/api/auth/verify/resend');
    expect(first.status).toBe(200);
    const second = await other2.post('/api/auth/verify/resend');
    expect(second.status).toBe(200);
    const [link1, link2] = ctx.inbox('twice@example.com').map((m) => linkToken(m.text, '/verify'));
    expect((await ctx.agent().post('/api/auth/verify').send({ token: link1 })).status).toBe(200);
    // A draft that exists after the confirmation (as the demo seed makes) is not touched by a later link.
    const posted = await other2.post('/api/reports').send(body(44.2, 4.2));
    expect(posted.body.report.status).toBe('published');
    const late = ctx.db.update(reports).set({ status: 'draft', publishedAt: null }).where(eq(reports.id, posted.body.report.id)).returning().get();
    const auditsBefore = ctx.db.select().from(auditLog).all().length;
    const again = await ctx.agent().post('/api/auth/verify').send({ token: link2 });
    expect(again.status).toBe(200);
    expect(again.body.message).toBe('Your e-mail address is confirmed. New reports are published as soon as you save them.');
    expect(row(late.id).status).toBe('draft');
    expect(ctx.db.select().from(auditLog).all().length).toBe(auditsBefore);
    expect(row(otherDraft).status).toBe('draft');
  });
});
