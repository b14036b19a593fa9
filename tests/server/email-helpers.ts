import { afterAll, expect } from 'vitest';
import { asc, eq } from 'drizzle-orm';
import { createTestContext, signUpAndIn, type TestAgent, type TestContext } from '../helpers/test-app';
import { devMailMessages } from '../../server/db/schema';
import { startDevMailServer } from '../../server/email/dev-mail-server';
import { createMailer, type Mailer } from '../../server/email/mailer';
import type { AppDeps } from '../../server/app';

export type MailTestContext = TestContext & {
  mailer: Mailer;
  /** Messages the local SMTP server stored, oldest first (optionally only those to one address). */
  inbox: (to?: string) => (typeof devMailMessages.$inferSelect)[];
  mail: { db: TestContext['db']; mailer: Mailer; appUrl: string };
};

/**
 * A test app whose mail goes through nodemailer over SMTP to the real local mail server, started
 * on a free port and storing into the test database. Closed after the file's tests.
 */
export async function createMailTestContext(deps: Partial<AppDeps> = {}): Promise<MailTestContext> {
  let live: Mailer | undefined;
  const mailer: Mailer = {
    enabled: true,
    send: (message) => live!.send(message),
    close: () => live?.close(),
  };
  const ctx = createTestContext({ ...deps, mailer });
  const server = await startDevMailServer(ctx.db, 0);
  live = createMailer(ctx.config, server.port);
  afterAll(async () => {
    mailer.close();
    await server.close();
  });
  const inbox = (to?: string) =>
    ctx.db
      .select()
      .from(devMailMessages)
      .where(to ? eq(devMailMessages.to, to) : undefined)
      .orderBy(asc(devMailMessages.id))
      .all();
  return Object.assign(ctx, { mailer, inbox, mail: { db: ctx.db, mailer, appUrl: ctx.config.appUrl } });
}

/** The token of the first link to `path` in a message's text part. */
export function linkToken(text: string | null, path: string): string {
  const match = new RegExp(`${path.replace(/[/?]/g, '\\$&')}\\?token=([A-Za-z0-9_-]+)`).exec(text ?? '');
  if (!match) throw new Error(`no ${path} link in:\n${text}`);
  return match[1]!;
}

/**
 * Join as the client does (sign-up, then sign-in with the same details; tests/helpers/test-app.ts)
 * and wait for the confirmation message, which is sent after the answer.
 */
export async function join(ctx: MailTestContext, agent: TestAgent, body: { email: string; displayName: string; password: string; acceptDataLicence?: boolean }) {
  const before = ctx.inbox(body.email.toLowerCase()).length;
  const signIn = await signUpAndIn(agent, body);
  await expect.poll(() => ctx.inbox(body.email.toLowerCase()).length, { timeout: 10_000 }).toBeGreaterThan(before);
  return signIn;
}
