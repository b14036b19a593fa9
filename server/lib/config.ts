import { randomBytes } from 'node:crypto';
import path from 'node:path';

/** Everything the server reads from its environment, in one place. */
export interface Config {
  env: 'development' | 'production' | 'test';
  port: number;
  host: string;
  /** Server processes sharing the port (node:cluster); 1 runs the app in this process. */
  instances: number;
  dbFile: string;
  uploadsDir: string;
  tilesDir: string;
  clientDir: string;
  /**
   * Signs session cookies: SESSION_SECRET, or (tests) a random one. Unset otherwise until
   * withSessionSecret (server/lib/session-secret.ts) requires it in production or makes a local one.
   */
  sessionSecret?: string;
  seedDemo: boolean;
  adminEmail?: string;
  adminPassword?: string;
  /** Public base URL used in e-mailed links. */
  appUrl: string;
  /** Outgoing mail (production): the SMTP relay; unset host means no mail leaves the machine. */
  smtp: { host?: string; port: number; user?: string; pass?: string; secure: boolean };
  mailFrom: string;
  /** Start the local development mail server and send all mail to it (default: outside production). */
  devMail: boolean;
  /** Its port; 0 picks a free one. */
  devMailPort: number;
  /** Contributions through the payment provider (Stripe): its secret API key and webhook signing secret. */
  payments: { secretKey?: string; webhookSecret?: string };
  /** Without a secret key: start the local test provider (default: outside production), else contributions are off. */
  devPayments: boolean;
  /** Its port; 0 picks a free one. */
  devPaymentsPort: number;
  /** Request log level (pino): `info` logs every request; `silent` in tests. */
  logLevel: string;
  /** Lets /metrics answer a scraper that is not on this machine (`Authorization: Bearer <token>`). */
  metricsToken?: string;
}

export function readConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const mode = env.NODE_ENV === 'production' ? 'production' : env.NODE_ENV === 'test' ? 'test' : 'development';
  return {
    env: mode,
    port: Number(env.PORT ?? 3030),
    instances: Math.max(1, Math.floor(Number(env.SYCONIUM_INSTANCES ?? 1)) || 1),
    host: env.HOST ?? '127.0.0.1',
    dbFile: env.SYCONIUM_DB ?? 'data/syconium.db',
    uploadsDir: env.SYCONIUM_UPLOADS ?? 'data/uploads',
    tilesDir: env.SYCONIUM_TILES ?? path.resolve('tiles'),
    clientDir: path.resolve('dist'),
    sessionSecret: env.SESSION_SECRET || (mode === 'test' ? randomBytes(32).toString('hex') : undefined),
    seedDemo: env.SYCONIUM_SEED_DEMO !== 'false',
    adminEmail: env.SYCONIUM_ADMIN_EMAIL,
    adminPassword: env.SYCONIUM_ADMIN_PASSWORD,
    appUrl: (env.APP_URL ?? `http://${env.HOST ?? '127.0.0.1'}:${env.PORT ?? 3030}`).replace(/\/+$/, ''),
    smtp: {
      host: env.SMTP_HOST || undefined,
      port: Number(env.SMTP_PORT ?? (env.SMTP_SECURE === 'true' ? 465 : 587)),
      user: env.SMTP_USER || undefined,
      pass: env.SMTP_PASS || undefined,
      secure: env.SMTP_SECURE === 'true',
    },
    mailFrom: env.MAIL_FROM ?? 'Syconium <atlas@syconium.invalid>',
    devMail: env.SYCONIUM_DEV_MAIL ? env.SYCONIUM_DEV_MAIL === 'true' : mode !== 'production',
    devMailPort: Number(env.SYCONIUM_DEV_MAIL_PORT ?? 0),
    payments: { secretKey: env.STRIPE_SECRET_KEY || undefined, webhookSecret: env.STRIPE_WEBHOOK_SECRET || undefined },
    devPayments: env.SYCONIUM_DEV_PAYMENTS ? env.SYCONIUM_DEV_PAYMENTS === 'true' : mode !== 'production',
    devPaymentsPort: Number(env.SYCONIUM_DEV_PAYMENTS_PORT ?? 0),
    logLevel: env.LOG_LEVEL ?? (mode === 'test' ? 'silent' : 'info'),
    metricsToken: env.SYCONIUM_METRICS_TOKEN || undefined,
  };
}
