import nodemailer, { type Transporter } from 'nodemailer';
import type { Db } from '../db/client';
import type { Config } from '../lib/config';

/** One outgoing message: always a plain-text and an HTML part. */
export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html: string;
  headers?: Record<string, string>;
}

export interface Mailer {
  /** True when messages really go to an SMTP server (the local one in development). */
  readonly enabled: boolean;
  send(message: MailMessage): Promise<void>;
  close(): void;
}

/**
 * Mail goes through nodemailer over SMTP in every mode: to the local development server when its
 * port is given, else to the production relay in SMTP_*. Without either, nothing is sent (and
 * nothing leaves the machine); the server says so once at start.
 */
/** Reserved top-level domains (RFC 2606, RFC 6761) that can never receive mail, like the demo's accounts. */
const UNDELIVERABLE = /\.(test|example|invalid|localhost)$/i;

export function createMailer(config: Pick<Config, 'smtp' | 'mailFrom' | 'env'>, devMailPort?: number): Mailer {
  let transport: Transporter | undefined;
  if (devMailPort) {
    transport = nodemailer.createTransport({ host: '127.0.0.1', port: devMailPort, secure: false, ignoreTLS: true });
  } else if (config.smtp.host) {
    transport = nodemailer.createTransport({
      host: config.smtp.host,
      port: config.smtp.port,
      secure: config.smtp.secure,
      auth: config.smtp.user ? { user: config.smtp.user, pass: config.smtp.pass ?? '' } : undefined,
    });
  }
  if (!transport) {
    if (config.env !== 'test') console.warn('E-mail is off: set SMTP_HOST (or SYCONIUM_DEV_MAIL=true) to send verification, reset and digest messages.');
    return { enabled: false, send: async () => {}, close: () => {} };
  }
  const live = transport;
  const toRelay = !devMailPort;
  return {
    enabled: true,
    async send(message) {
      // A real relay would only bounce these (the demo accounts use .test); the local server takes all.
      if (toRelay && UNDELIVERABLE.test(message.to.split('@').pop() ?? '')) return;
      await live.sendMail({ from: config.mailFrom, ...message });
    },
    close: () => live.close(),
  };
}

/** What a feature needs to send its messages. */
export interface MailDeps {
  db: Db;
  mailer: Mailer;
  /** Public base URL for links, without a trailing slash. */
  appUrl: string;
}
