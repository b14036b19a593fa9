import type { MailDeps } from '../email/mailer';
import { verifyEmailMessage } from '../email/templates';
import { issueEmailToken } from './email-tokens.repo';

export const VERIFY_TTL_HOURS = 48;

/**
 * Send a fresh verification link. A failure to send is logged, never thrown: the account exists
 * either way and the grower can ask for another link from the banner.
 */
export async function sendVerificationEmail(deps: MailDeps, user: { id: number; email: string; displayName: string }): Promise<boolean> {
  const token = issueEmailToken(deps.db, user.id, 'verify', VERIFY_TTL_HOURS * 3_600_000);
  const message = verifyEmailMessage({ displayName: user.displayName, url: `${deps.appUrl}/verify?token=${token}`, expiresHours: VERIFY_TTL_HOURS });
  try {
    await deps.mailer.send({ to: user.email, ...message });
    return true;
  } catch (err) {
    console.error(`verification e-mail to user ${user.id} not sent:`, err);
    return false;
  }
}
