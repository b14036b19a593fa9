import { describe, expect, it } from 'vitest';
import { digestSubscriptions } from '../../server/db/schema';
import { runNearbyDigest } from '../../server/email/digest';
import { runEditorAlerts } from '../../server/email/editor-alerts';
import { seedDatabase } from '../../server/seed';
import { createMailTestContext } from './email-helpers';

describe('e-mail in the demo scenario', async () => {
  const ctx = await createMailTestContext();

  it('subscribes the demo grower once, and the first digest and editor summary arrive', async () => {
    const seedConfig = { seedDemo: true, adminEmail: undefined, adminPassword: undefined };
    await seedDatabase(ctx.db, seedConfig);
    await seedDatabase(ctx.db, seedConfig);
    const subs = ctx.db.select().from(digestSubscriptions).all();
    expect(subs).toHaveLength(1);
    expect(subs[0]).toMatchObject({ active: true, radiusKm: 50 });

    expect((await runNearbyDigest(ctx.mail)).sent).toBe(1);
    const [digest] = ctx.inbox('grower@demo.syconium.test');
    expect(digest!.subject).toMatch(/^\d+ new ripening reports? near Home garden \(demo\)$/);
    expect(digest!.text).toContain('/unsubscribe?token=');

    await runEditorAlerts(ctx.mail, null);
    expect(ctx.inbox('editor@demo.syconium.test')).toHaveLength(1);
    expect(ctx.inbox('editor@demo.syconium.test')[0]!.subject).toMatch(/^Syconium editors: /);
    // Seeding the whole demo (hashing its passwords, building its stations) takes a while on a busy machine.
  }, 120_000);
});
