import { describe, expect, it } from 'vitest';
import { reportFlags, reports, trees, varieties } from '../../server/db/schema';
import { appJobs } from '../../server/jobs/app-jobs';
import { findJob } from '../../server/jobs/jobs.repo';
import { createScheduler } from '../../server/jobs/scheduler';
import { createMailTestContext } from './email-helpers';

describe('editor alerts on the database-backed scheduler, through the local SMTP server', async () => {
  const ctx = await createMailTestContext();
  const editor = await ctx.signedIn('editor', 'ed@example.com');
  await ctx.signedIn('admin', 'ada@example.com');
  const grower = await ctx.signedIn('grower', 'gus@example.com');
  const treeId = ctx.db.insert(trees).values({ userId: grower.userId, label: 't' }).returning().get().id;
  const varietyId = ctx.db.insert(varieties).values({ name: 'Plum Lantern', isFictional: true }).returning().get().id;
  const reportId = ctx.db
    .insert(reports)
    .values({ userId: grower.userId, treeId, varietyId, lat: 40, lon: -3, gridLat: 40.025, gridLon: -2.975, form: 'ground', season: 2026, crop: 'main', outcome: 'ripened' })
    .returning()
    .get().id;
  const start = new Date();
  const minutes = (n: number) => new Date(start.getTime() + n * 60_000);
  // Two app instances sharing one database.
  const instanceA = createScheduler(ctx.db, appJobs(ctx.mail), { owner: 'instance-a' });
  const instanceB = createScheduler(ctx.db, appJobs(ctx.mail), { owner: 'instance-b' });

  // The first tick also runs the model-accuracy job (cross-validation in a worker thread): seconds on a busy machine.
  it('sends one message per editor for a burst of five flags and a proposed name', { timeout: 60_000 }, async () => {
    expect(await instanceA.runDue(start)).toEqual(['editor-alerts', 'nearby-digest', 'model-accuracy', 'rate-limit-prune']);
    expect(ctx.inbox()).toHaveLength(0);

    for (let i = 1; i <= 5; i++) ctx.db.insert(reportFlags).values({ reportId, userId: editor.userId, reason: `Flag number ${i}: the dates look odd` }).run();
    ctx.db.insert(varieties).values({ name: 'Brown Lantern of Tuesday', status: 'proposed', proposedByUserId: grower.userId }).run();

    // Not due yet (every 5 minutes): nothing runs, on either instance.
    expect(await instanceB.runDue(minutes(2))).toEqual([]);
    expect(await instanceB.runDue(minutes(5))).toEqual(['editor-alerts']);

    const toEditor = ctx.inbox('ed@example.com');
    expect(toEditor).toHaveLength(1);
    expect(ctx.inbox('ada@example.com')).toHaveLength(1);
    expect(ctx.inbox('gus@example.com')).toHaveLength(0);
    const [message] = toEditor;
    expect(message!.subject).toBe('Syconium editors: 5 flagged reports and 1 proposed variety name');
    for (let i = 1; i <= 5; i++) expect(message!.text).toContain(`Flag number ${i}`);
    expect(message!.html).toContain('Brown Lantern of Tuesday');
    expect(message!.text).toContain(`${ctx.config.appUrl}/editors`);

    // The watermark is in the database: the next run finds nothing new and sends nothing.
    expect(findJob(ctx.db, 'editor-alerts')!.state).toMatchObject({ flagId: 5 });
    await instanceA.runDue(minutes(10));
    expect(ctx.inbox('ed@example.com')).toHaveLength(1);
  });

  it('lets only one instance run a due job while its lease is held', { timeout: 60_000 }, async () => {
    ctx.db.insert(reportFlags).values({ reportId, userId: editor.userId, reason: 'One more' }).run();
    const [a, b] = await Promise.all([instanceA.runDue(minutes(15)), instanceB.runDue(minutes(15))]);
    expect([...a, ...b].filter((name) => name === 'editor-alerts')).toHaveLength(1);
    expect(ctx.inbox('ed@example.com')).toHaveLength(2);
    const job = findJob(ctx.db, 'editor-alerts')!;
    expect(job.leaseOwner).toBeNull();
    expect(job.nextRunAt).toBe(minutes(20).getTime());
  });
});
