import { createAccuracyRouter } from './accuracy/accuracy.router';
import express, { type Express } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import type { Config } from './lib/config';
import type { Db } from './db/client';
import { createAuthRouter, type AuthRouterDeps } from './auth/auth.router';
import { createPasswordResetRouter, type PasswordResetDeps } from './auth/password-reset.router';
import { sendVerificationEmail } from './auth/verification';
import { createVerificationRouter } from './auth/verification.router';
import { createDevMailRouter } from './email/dev-mail.router';
import { createDigestRouter } from './email/digest.router';
import { createMailer, type Mailer } from './email/mailer';
import { createPassport } from './auth/passport';
import { SqliteSessionStore } from './auth/session-store';
import { createUsersRouter } from './users/users.router';
import { createVarietiesRouter } from './varieties/varieties.router';
import { createCatalogueRouter } from './varieties/catalogue.router';
import { createModerationRouter } from './moderation/moderation.router';
import { createAuditRouter } from './audit/audit.router';
import { createWaspAreasRouter } from './wasp-areas/wasp-areas.router';
import { createReportsRouter, type ReportsRouterDeps } from './reports/reports.router';
import { createUploadsRouter } from './photos/uploads.router';
import { createSavedPlacesRouter } from './saved-places/saved-places.router';
import { createGuidanceRouter } from './guidance/guidance.router';
import { createPinsRouter } from './atlas-pins/pins.router';
import { createPlacesRouter } from './places/places.router';
import { createTilesRouter } from './tiles/tiles.router';
import { createAtlasRouter } from './atlas/atlas.router';
import { createStationsRouter } from './stations/stations.router';
import { PAYMENTS_OFF, type Payments } from './support/payments';
import { createSupportRouter, createSupportWebhookRouter } from './support/support.router';
import { createFollowsRouter } from './follows/follows.router';
import { createUnitsRouter } from './account/units.router';
import { csrfGuard } from './middleware/csrf';
import { jsonOrMultipartOnly } from './middleware/json-only';
import { loginSession, SESSION_COOKIE } from './middleware/login-session';
import { refuseLargeJson } from './middleware/refuse-large-body';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { appShellScriptHashes } from './client/inline-scripts';
import { serveClient } from './client/serve-client';
import { createHealthRouter, createMetricsRouter } from './ops/ops.router';
import { createLogger, requestLogger } from './ops/request-log';
import type { Logger } from 'pino';

export interface AppDeps {
  db: Db;
  config: Config;
  signInLimit?: AuthRouterDeps['signInLimit'];
  signUpLimit?: AuthRouterDeps['signUpLimit'];
  /** Outgoing mail (server/email/index.ts starts it); without one, mail follows the SMTP settings. */
  mailer?: Mailer;
  forgotLimit?: PasswordResetDeps['forgotLimit'];
  photoUploadLimit?: ReportsRouterDeps['photoUploadLimit'];
  /** The payment provider for contributions (server/support/payments.ts starts it); without one, contributions are off. */
  payments?: Payments;
  /** Where request logs go (tests capture them); by default stdout at `config.logLevel`. */
  logger?: Logger;
}

/** Build the Express app (no listen): middleware, API routers, /api 404, the client, errors last. */
export function createApp(deps: AppDeps): Express {
  const { db, config } = deps;
  // server/index.ts settles the secret first (withSessionSecret); never sign cookies with a default.
  if (!config.sessionSecret) throw new Error('createApp needs config.sessionSecret (see server/lib/session-secret.ts)');
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(requestLogger(deps.logger ?? createLogger(config.logLevel)));

  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // The app shell's own inline script (the first pins request), allowed by its hash alone.
          'script-src': ["'self'", ...appShellScriptHashes(config.clientDir)],
          // MapLibre runs its worker from a blob/same-origin URL and draws images from blobs.
          'worker-src': ["'self'", 'blob:'],
          'child-src': ["'self'", 'blob:'],
          'img-src': ["'self'", 'data:', 'blob:'],
          'connect-src': ["'self'"],
          'font-src': ["'self'", 'data:'],
          'style-src': ["'self'", "'unsafe-inline'"],
          'upgrade-insecure-requests': null,
        },
      },
      crossOriginEmbedderPolicy: false,
    }),
  );

  const mailer = deps.mailer ?? createMailer(config);
  const support = { db, payments: deps.payments ?? PAYMENTS_OFF, mailer, appUrl: config.appUrl };
  // The provider signs the raw bytes: its webhook goes before the JSON parser (and outside the CSRF guard).
  app.use('/api/support/webhook', createSupportWebhookRouter(support));

  app.use(refuseLargeJson(1024 * 1024), express.json({ limit: '1mb' }));

  const passport = createPassport(db);
  app.use(
    loginSession(
      session({
        name: SESSION_COOKIE,
        secret: config.sessionSecret,
        store: new SqliteSessionStore(db),
        resave: false,
        saveUninitialized: false,
        rolling: true,
        cookie: { httpOnly: true, sameSite: 'lax', secure: config.env === 'production' && process.env.SYCONIUM_HTTPS === 'true', maxAge: 30 * 86_400_000 },
      }),
      passport.session(),
    ),
  );

  const api = express.Router();
  api.use(csrfGuard, jsonOrMultipartOnly);
  api.use('/health', createHealthRouter({ db }));
  const mail = { db, mailer, appUrl: config.appUrl };
  const onSignedUp = async (user: Express.User) => void (await sendVerificationEmail(mail, user));
  api.use('/auth', createAuthRouter({ db, passport, signInLimit: deps.signInLimit, signUpLimit: deps.signUpLimit, onSignedUp, mail }));
  api.use('/auth', createVerificationRouter(mail), createPasswordResetRouter({ ...mail, forgotLimit: deps.forgotLimit }));
  api.use('/email', createDigestRouter({ db }));
  if (config.devMail) api.use('/dev/mail', createDevMailRouter({ db }));
  api.use('/users', createUsersRouter({ db }));
  api.use(createAtlasRouter({ db })); // /atlas/near and /varieties/:id/fit
  api.use('/varieties', createCatalogueRouter({ db }));
  api.use('/varieties', createVarietiesRouter({ db }));
  api.use('/wasp-areas', createWaspAreasRouter({ db }));
  api.use('/stations', createStationsRouter({ db }));
  api.use('/reports', createReportsRouter({ db, config, photoUploadLimit: deps.photoUploadLimit }));
  api.use('/saved-places', createSavedPlacesRouter({ db }));
  api.use('/guidance', createGuidanceRouter({ db }));
  api.use('/atlas/pins', createPinsRouter({ db }));
  api.use('/places', createPlacesRouter());
  api.use('/follows', createFollowsRouter({ db }));
  api.use('/account', createUnitsRouter({ db }));
  api.use('/accuracy', createAccuracyRouter({ db }));
  api.use('/moderation', createModerationRouter({ db }));
  api.use('/audit', createAuditRouter({ db }));
  api.use('/support', createSupportRouter(support));
  api.use(apiNotFound);
  app.use('/api', api);
  app.use(createMetricsRouter({ metricsToken: config.metricsToken }));
  app.use('/uploads', createUploadsRouter({ db, config }));
  app.use('/tiles', createTilesRouter({ tilesDir: config.tilesDir }));

  // The built client, precompressed; client-side routes get the app shell (not unknown /uploads or /tiles paths: those are 404s).
  if (config.env !== 'test') serveClient(app, config.clientDir);

  app.use(errorHandler);
  return app;
}
