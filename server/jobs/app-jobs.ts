import { ACCURACY_CHECK_EVERY_MS, runModelAccuracy } from '../accuracy/accuracy-job';
import { pruneExpiredRateLimits } from '../auth/rate-limit-store';
import { runNearbyDigest } from '../email/digest';
import { EDITOR_ALERT_EVERY_MS, runEditorAlerts, type AlertWatermark } from '../email/editor-alerts';
import type { MailDeps } from '../email/mailer';
import type { JobDefinition } from './scheduler';

/** Syconium's scheduled jobs. */
export function appJobs(deps: MailDeps): JobDefinition<any>[] {
  const editorAlerts: JobDefinition<AlertWatermark> = {
    name: 'editor-alerts',
    everyMs: EDITOR_ALERT_EVERY_MS,
    run: ({ state }) => runEditorAlerts(deps, state),
  };
  const nearbyDigest: JobDefinition = {
    name: 'nearby-digest',
    // Hourly: each subscription is due a week after its own last digest.
    everyMs: 60 * 60_000,
    run: async ({ now }) => {
      await runNearbyDigest(deps, now);
    },
  };
  const modelAccuracy: JobDefinition = {
    name: 'model-accuracy',
    everyMs: ACCURACY_CHECK_EVERY_MS,
    // Cross-validation of the chance, in a worker thread; only when reports changed (a large atlas: at most nightly).
    leaseMs: 60 * 60_000,
    run: async ({ now }) => {
      await runModelAccuracy(deps.db, now);
    },
  };
  const rateLimitPrune: JobDefinition = {
    name: 'rate-limit-prune',
    // Every sign-in attempt and rate-limited request leaves a row keyed by its address: forget the spent ones.
    everyMs: 60 * 60_000,
    run: async ({ now }) => {
      pruneExpiredRateLimits(deps.db, now.getTime());
    },
  };
  return [editorAlerts, nearbyDigest, modelAccuracy, rateLimitPrune];
}
