import { sql } from 'drizzle-orm';
import { index, integer, primaryKey, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';
import {
  CROPS,
  FIG_TYPES,
  FLAG_STATUSES,
  GROWING_FORMS,
  OUTCOMES,
  PLANT_ORIGINS,
  REPORT_STATUSES,
  RIPENING_CLASSES,
  ROLES,
  VARIETY_STATUSES,
  WASP_AREA_STATUSES,
} from '../../shared/domain/codes';
import { MEMBERSHIP_STATUSES, MEMBERSHIP_TIERS, SUPPORT_CURRENCIES, SUPPORT_KINDS } from '../../shared/domain/support';
import { DISTANCE_UNITS, TEMPERATURE_UNITS } from '../../shared/domain/units';

/*
 * One file for the whole schema: drizzle.config.ts points here and `npm run db:generate` writes
 * migrations to drizzle/. Keys are camelCase in TypeScript, columns snake_case in SQLite.
 * Timestamps are ISO-8601 text in UTC; calendar dates are 'YYYY-MM-DD' text.
 * Reports have an R*Tree virtual table on their exact place (reports_rtree) kept in step by
 * triggers in a custom migration, since drizzle-kit does not model virtual tables; public code
 * never reads it (nor lat/lon): it finds reports by their grid cell (reports_grid_idx,
 * server/reports/public-position.ts). Stations are
 * found through the in-memory station snapshot (server/stations/station-snapshot.ts); their
 * R*Tree was dropped by drizzle/0011.
 */

const createdAt = () => text('created_at').notNull().default(sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`);
const updatedAt = () => text('updated_at').notNull().default(sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`);

export const users = sqliteTable('users', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  email: text('email').notNull().unique(),
  displayName: text('display_name').notNull(),
  passwordHash: text('password_hash').notNull(),
  role: text('role', { enum: ROLES }).notNull().default('grower'),
  emailVerifiedAt: text('email_verified_at'),
  isDemo: integer('is_demo', { mode: 'boolean' }).notNull().default(false),
  /** Opt-in: show a supporter mark beside this grower's name on their reports while a membership is paid up. */
  supporterMark: integer('supporter_mark', { mode: 'boolean' }).notNull().default(false),
  /** Units and date language the grower chose (null: the browser's language decides). drizzle/0017. */
  temperatureUnit: text('temperature_unit', { enum: TEMPERATURE_UNITS }),
  distanceUnit: text('distance_unit', { enum: DISTANCE_UNITS }),
  dateLocale: text('date_locale'),
  /** When the grower agreed to share published reports under the data licence (shared/domain/data-licence.ts); null = never. */
  dataLicenceAgreedAt: text('data_licence_agreed_at'),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
});

export const sessions = sqliteTable(
  'sessions',
  {
    sid: text('sid').primaryKey(),
    data: text('data').notNull(),
    userId: integer('user_id'),
    expiresAt: integer('expires_at').notNull(),
  },
  (t) => [index('sessions_expires_idx').on(t.expiresAt), index('sessions_user_idx').on(t.userId)],
);

/** Rate-limit counters live in the database so several app instances share them. */
export const rateLimitHits = sqliteTable('rate_limit_hits', {
  key: text('key').primaryKey(),
  hits: integer('hits').notNull(),
  resetAt: integer('reset_at').notNull(),
});

export const savedPlaces = sqliteTable(
  'saved_places',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    lat: real('lat').notNull(),
    lon: real('lon').notNull(),
    form: text('form', { enum: GROWING_FORMS }).notNull().default('ground'),
    isHome: integer('is_home', { mode: 'boolean' }).notNull().default(false),
    createdAt: createdAt(),
  },
  (t) => [index('saved_places_user_idx').on(t.userId)],
);

export const varieties = sqliteTable(
  'varieties',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    name: text('name').notNull(),
    figType: text('fig_type', { enum: FIG_TYPES }).notNull().default('unknown'),
    bearsBreba: integer('bears_breba', { mode: 'boolean' }).notNull().default(false),
    bearsMain: integer('bears_main', { mode: 'boolean' }).notNull().default(true),
    ripeningClass: text('ripening_class', { enum: RIPENING_CLASSES }),
    /** Typical days from the last spring frost to the first ripe main-crop fig, where known. */
    typicalDaysToRipen: integer('typical_days_to_ripen'),
    notes: text('notes').notNull().default(''),
    /** Where each claim comes from (free text, one source per line). */
    sources: text('sources').notNull().default(''),
    status: text('status', { enum: VARIETY_STATUSES }).notNull().default('accepted'),
    proposedByUserId: integer('proposed_by_user_id').references(() => users.id, { onDelete: 'set null' }),
    reviewNote: text('review_note'),
    mergedIntoId: integer('merged_into_id'),
    isFictional: integer('is_fictional', { mode: 'boolean' }).notNull().default(false),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex('varieties_name_idx').on(sql`lower(${t.name})`), index('varieties_status_idx').on(t.status)],
);

export const varietySynonyms = sqliteTable(
  'variety_synonyms',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    varietyId: integer('variety_id')
      .notNull()
      .references(() => varieties.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
  },
  (t) => [uniqueIndex('variety_synonyms_name_idx').on(sql`lower(${t.name})`), index('variety_synonyms_variety_idx').on(t.varietyId)],
);

/** A tree (or one planting) keeps its identity across seasons: its reports count as one tree. */
export const trees = sqliteTable(
  'trees',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    label: text('label').notNull(),
    createdAt: createdAt(),
  },
  (t) => [index('trees_user_idx').on(t.userId)],
);

export const reports = sqliteTable(
  'reports',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    treeId: integer('tree_id')
      .notNull()
      .references(() => trees.id),
    /** Null while the grower's proposed name waits for an editor. */
    varietyId: integer('variety_id').references(() => varieties.id),
    proposedVarietyName: text('proposed_variety_name'),
    /** Exact place: only the owner and editors ever see it. */
    lat: real('lat').notNull(),
    lon: real('lon').notNull(),
    /** Public grid cell centre (shared/domain/public-grid.ts). */
    gridLat: real('grid_lat').notNull(),
    gridLon: real('grid_lon').notNull(),
    form: text('form', { enum: GROWING_FORMS }).notNull(),
    origin: text('origin', { enum: PLANT_ORIGINS }).notNull().default('unknown'),
    yearPlanted: integer('year_planted'),
    season: integer('season').notNull(),
    crop: text('crop', { enum: CROPS }).notNull(),
    outcome: text('outcome', { enum: OUTCOMES }).notNull(),
    firstRipeDate: text('first_ripe_date'),
    lastHarvestDate: text('last_harvest_date'),
    springFrostDate: text('spring_frost_date'),
    fallFrostDate: text('fall_frost_date'),
    pinched: integer('pinched', { mode: 'boolean' }).notNull().default(false),
    pinchedDate: text('pinched_date'),
    winterProtection: text('winter_protection').notNull().default(''),
    feeding: text('feeding').notNull().default(''),
    watering: text('watering').notNull().default(''),
    notes: text('notes').notNull().default(''),
    status: text('status', { enum: REPORT_STATUSES }).notNull().default('published'),
    hiddenReason: text('hidden_reason'),
    hiddenById: integer('hidden_by_id').references(() => users.id, { onDelete: 'set null' }),
    hiddenAt: text('hidden_at'),
    /**
     * When the report first became public: at creation for a verified grower, else when its draft
     * was published. Hiding and restoring keep it (a restored report is not news). Null for drafts.
     * A row inserted as non-draft without it takes created_at (trigger in the published-at migration).
     */
    publishedAt: text('published_at'),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
    updatedById: integer('updated_by_id').references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [
    index('reports_user_idx').on(t.userId),
    index('reports_tree_idx').on(t.treeId),
    index('reports_variety_idx').on(t.varietyId),
    index('reports_status_created_idx').on(t.status, t.createdAt),
    index('reports_grid_idx').on(t.gridLat, t.gridLon),
    // Covers the map pins' count per grid cell and its filters: SQLite reads the index alone, in cell order.
    index('reports_pins_idx').on(t.status, t.gridLat, t.gridLon, t.varietyId, t.crop, t.outcome, t.form, t.season),
  ],
);

export const reportPhotos = sqliteTable(
  'report_photos',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    reportId: integer('report_id')
      .notNull()
      .references(() => reports.id, { onDelete: 'cascade' }),
    /** File names under the uploads folder, generated by the server (never from the client). */
    fileName: text('file_name').notNull(),
    thumbName: text('thumb_name').notNull(),
    mime: text('mime').notNull(),
    width: integer('width').notNull(),
    height: integer('height').notNull(),
    bytes: integer('bytes').notNull(),
    position: integer('position').notNull().default(0),
    createdAt: createdAt(),
  },
  (t) => [index('report_photos_report_idx').on(t.reportId)],
);

export const reportFlags = sqliteTable(
  'report_flags',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    reportId: integer('report_id')
      .notNull()
      .references(() => reports.id, { onDelete: 'cascade' }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    reason: text('reason').notNull(),
    status: text('status', { enum: FLAG_STATUSES }).notNull().default('open'),
    resolvedById: integer('resolved_by_id').references(() => users.id, { onDelete: 'set null' }),
    resolvedAt: text('resolved_at'),
    createdAt: createdAt(),
  },
  (t) => [index('report_flags_status_idx').on(t.status), index('report_flags_report_idx').on(t.reportId)],
);

/** Every editor and admin action, and every change to a report: who, when, what, before and after. */
export const auditLog = sqliteTable(
  'audit_log',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    actorId: integer('actor_id').references(() => users.id, { onDelete: 'set null' }),
    action: text('action').notNull(),
    entityType: text('entity_type').notNull(),
    entityId: integer('entity_id'),
    before: text('before', { mode: 'json' }),
    after: text('after', { mode: 'json' }),
    createdAt: createdAt(),
  },
  (t) => [index('audit_log_entity_idx').on(t.entityType, t.entityId), index('audit_log_created_idx').on(t.createdAt)],
);

/** An area where editors recorded the fig wasp as established. Retired areas stay for history. */
export const waspAreas = sqliteTable(
  'wasp_areas',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    name: text('name').notNull(),
    /** GeoJSON Polygon or MultiPolygon geometry, lon/lat. */
    geometry: text('geometry', { mode: 'json' }).notNull(),
    minLat: real('min_lat').notNull(),
    maxLat: real('max_lat').notNull(),
    minLon: real('min_lon').notNull(),
    maxLon: real('max_lon').notNull(),
    source: text('source').notNull(),
    observedOn: text('observed_on').notNull(),
    status: text('status', { enum: WASP_AREA_STATUSES }).notNull().default('active'),
    retiredAt: text('retired_at'),
    createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('wasp_areas_status_idx').on(t.status)],
);

export const stations = sqliteTable('stations', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  /** The station's own identifier where it has one (for example a GHCN id). */
  code: text('code').unique(),
  name: text('name').notNull(),
  lat: real('lat').notNull(),
  lon: real('lon').notNull(),
  elevationM: real('elevation_m'),
  firstDate: text('first_date'),
  lastDate: text('last_date'),
  dayCount: integer('day_count').notNull().default(0),
  /** Mean yearly growing degree days base 50 °F over `gddYears` years with maxima and minima. */
  gdd50F: real('gdd50_f'),
  gddYears: integer('gdd_years').notNull().default(0),
  /** Average annual extreme minimum (°C) over `extremeMinWinters` winters: the hardiness zone's basis. */
  extremeMinC: real('extreme_min_c'),
  extremeMinWinters: integer('extreme_min_winters').notNull().default(0),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
});

export const stationDays = sqliteTable(
  'station_days',
  {
    stationId: integer('station_id')
      .notNull()
      .references(() => stations.id, { onDelete: 'cascade' }),
    date: text('date').notNull(),
    tminC: real('tmin_c').notNull(),
    tmaxC: real('tmax_c'),
  },
  (t) => [primaryKey({ columns: [t.stationId, t.date] })],
);

/** Per-year freeze dates of a station at each threshold, computed when its data is loaded. */
export const stationFreezeYears = sqliteTable(
  'station_freeze_years',
  {
    stationId: integer('station_id')
      .notNull()
      .references(() => stations.id, { onDelete: 'cascade' }),
    thresholdF: integer('threshold_f').notNull(),
    year: integer('year').notNull(),
    /** Day of year of the last spring freeze; null when the year had none. */
    lastSpringDoy: integer('last_spring_doy'),
    firstFallDoy: integer('first_fall_doy'),
    seasonDays: integer('season_days'),
    /** Why the year is left out of the summaries (missing days); null when it counts. */
    leftOutReason: text('left_out_reason'),
  },
  (t) => [primaryKey({ columns: [t.stationId, t.thresholdF, t.year] })],
);

/** A release of NOAA's climate normals (reference data, shipped and loaded on every start). */
export const normalsReleases = sqliteTable('normals_releases', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  /** "1981-2010", "1991-2020". */
  name: text('name').notNull().unique(),
  periodStart: integer('period_start').notNull(),
  periodEnd: integer('period_end').notNull(),
  source: text('source').notNull(),
  /** SHA-256 of the files the release was read from: the same files are not loaded twice. */
  fingerprint: text('fingerprint'),
  stationCount: integer('station_count').notNull().default(0),
  loadedAt: text('loaded_at').notNull().default(sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`),
});

/** One normals station's 32 °F figures and heat, from the release named by releaseId. */
export const normalsStations = sqliteTable(
  'normals_stations',
  {
    code: text('code').primaryKey(),
    releaseId: integer('release_id')
      .notNull()
      .references(() => normalsReleases.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    state: text('state'),
    lat: real('lat').notNull(),
    lon: real('lon').notNull(),
    elevationM: real('elevation_m'),
    lastSpringDoy50: integer('last_spring_doy50'),
    lastSpringDoy90: integer('last_spring_doy90'),
    firstFallDoy50: integer('first_fall_doy50'),
    firstFallDoy90: integer('first_fall_doy90'),
    seasonDays50: integer('season_days50'),
    seasonDays90: integer('season_days90'),
    /** 'never' (-6666: frost-free all year) or 'any-month' (-4444: no season defined). */
    freezeNote: text('freeze_note', { enum: ['never', 'any-month'] }),
    gdd50F: real('gdd50_f'),
    flag: text('flag'),
  },
  (t) => [index('normals_stations_release_idx').on(t.releaseId)],
);

/** Across-years summary of a station: dates and lengths at 10/50/90 % probability. */
export const stationSummaries = sqliteTable(
  'station_summaries',
  {
    stationId: integer('station_id')
      .notNull()
      .references(() => stations.id, { onDelete: 'cascade' }),
    thresholdF: integer('threshold_f').notNull(),
    probability: integer('probability').notNull(),
    lastSpringDoy: integer('last_spring_doy'),
    firstFallDoy: integer('first_fall_doy'),
    seasonDays: integer('season_days'),
    years: integer('years').notNull(),
  },
  (t) => [primaryKey({ columns: [t.stationId, t.thresholdF, t.probability] })],
);

/** Single-use e-mail links (verify an address, reset a password). Only a SHA-256 of the token is kept. */
export const emailTokens = sqliteTable(
  'email_tokens',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    purpose: text('purpose', { enum: ['verify', 'reset'] }).notNull(),
    tokenHash: text('token_hash').notNull().unique(),
    expiresAt: text('expires_at').notNull(),
    usedAt: text('used_at'),
    createdAt: createdAt(),
  },
  (t) => [index('email_tokens_user_idx').on(t.userId, t.purpose)],
);

/**
 * Scheduled jobs: every app instance ticks, but only the one that takes the lease runs a job.
 * Times are epoch milliseconds; `state` holds a job's own watermark (JSON).
 */
export const jobs = sqliteTable('jobs', {
  name: text('name').primaryKey(),
  nextRunAt: integer('next_run_at').notNull(),
  leaseUntil: integer('lease_until'),
  leaseOwner: text('lease_owner'),
  lastRunAt: text('last_run_at'),
  lastError: text('last_error'),
  state: text('state', { mode: 'json' }),
});

/** A grower's weekly digest of ripening reports near their home place. */
export const digestSubscriptions = sqliteTable('digest_subscriptions', {
  userId: integer('user_id')
    .primaryKey()
    .references(() => users.id, { onDelete: 'cascade' }),
  radiusKm: real('radius_km').notNull().default(50),
  active: integer('active', { mode: 'boolean' }).notNull().default(true),
  /** End of the window the last digest covered; the next one lists reports after it. */
  lastSentAt: text('last_sent_at'),
  /** Random, per user: the unsubscribe link works without signing in. */
  unsubscribeToken: text('unsubscribe_token').notNull().unique(),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
});

/** Every message the development mail server received (development and tests only). */
export const devMailMessages = sqliteTable('dev_mail_messages', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  messageId: text('message_id'),
  from: text('from').notNull(),
  to: text('to').notNull(),
  subject: text('subject').notNull().default(''),
  text: text('text'),
  html: text('html'),
  receivedAt: createdAt(),
});

/** Varieties a grower follows: new reports of them anywhere go into the weekly digest (drizzle/0017). */
export const followedVarieties = sqliteTable(
  'followed_varieties',
  {
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    varietyId: integer('variety_id')
      .notNull()
      .references(() => varieties.id, { onDelete: 'cascade' }),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.varietyId] }), index('followed_varieties_variety_idx').on(t.varietyId)],
);

/** Places a grower follows (private to them): ripened reports around them go into the weekly digest. */
export const followedPlaces = sqliteTable(
  'followed_places',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    lat: real('lat').notNull(),
    lon: real('lon').notNull(),
    createdAt: createdAt(),
  },
  (t) => [index('followed_places_user_idx').on(t.userId)],
);

/*
 * Supporters (drizzle/0020_supporters.sql). Memberships and contributions change only on the payment
 * provider's signed events (server/support/webhook.ts); payment_events makes each event count once.
 * No card data is ever stored: the provider's hosted checkout takes the card.
 */
export const memberships = sqliteTable(
  'memberships',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    providerSubscriptionId: text('provider_subscription_id').notNull(),
    tier: text('tier', { enum: MEMBERSHIP_TIERS }).notNull(),
    amountMinor: integer('amount_minor').notNull(),
    currency: text('currency', { enum: SUPPORT_CURRENCIES }).notNull(),
    status: text('status', { enum: MEMBERSHIP_STATUSES }).notNull(),
    startedAt: text('started_at').notNull(),
    renewsOn: text('renews_on'),
    cancelledAt: text('cancelled_at'),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex('memberships_subscription_unique').on(t.providerSubscriptionId), index('memberships_user_idx').on(t.userId)],
);

/** Money received: a first payment (checkout), a renewal (invoice) or a one-off gift. */
export const contributions = sqliteTable(
  'contributions',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    userId: integer('user_id').references(() => users.id, { onDelete: 'set null' }),
    kind: text('kind', { enum: SUPPORT_KINDS }).notNull(),
    /** The provider's checkout session or invoice id: one contribution each. */
    providerRef: text('provider_ref').notNull(),
    amountMinor: integer('amount_minor').notNull(),
    currency: text('currency', { enum: SUPPORT_CURRENCIES }).notNull(),
    paidAt: text('paid_at').notNull(),
  },
  (t) => [uniqueIndex('contributions_provider_ref_unique').on(t.providerRef)],
);

/** Each checkout we started, so the thank-you page can answer from our own records. */
export const checkoutAttempts = sqliteTable('checkout_attempts', {
  sessionId: text('session_id').primaryKey(),
  userId: integer('user_id').references(() => users.id, { onDelete: 'set null' }),
  kind: text('kind', { enum: SUPPORT_KINDS }).notNull(),
  tier: text('tier', { enum: MEMBERSHIP_TIERS }),
  amountMinor: integer('amount_minor').notNull(),
  currency: text('currency', { enum: SUPPORT_CURRENCIES }).notNull(),
  state: text('state', { enum: ['waiting', 'paid', 'unpaid'] }).notNull().default('waiting'),
  createdAt: createdAt(),
});

/** Provider events already handled (by event id): a redelivered event changes nothing. */
export const paymentEvents = sqliteTable('payment_events', {
  eventId: text('event_id').primaryKey(),
  type: text('type').notNull(),
  receivedAt: text('received_at').notNull().default(sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`),
});

/** The local test provider's own objects (development and tests only), shared by every server instance. */
export const devPaymentObjects = sqliteTable('dev_payment_objects', {
  id: text('id').primaryKey(),
  kind: text('kind').notNull(),
  data: text('data', { mode: 'json' }).notNull(),
  createdAt: createdAt(),
});

/** The chance model's leave-one-grower-out accuracy as last computed (one row, id 1; drizzle/0015_model-accuracy.sql). */
export const modelAccuracy = sqliteTable('model_accuracy', {
  id: integer('id').primaryKey(),
  computedAt: text('computed_at').notNull(),
  dataVersion: integer('data_version').notNull(),
  /** The ModelAccuracy answer (shared/schemas/accuracy.ts) as JSON. */
  body: text('body').notNull(),
});

/** The id a phone gave a report it sent from its outbox (drizzle/0019): a re-send gets the stored report back. */
export const reportClientIds = sqliteTable(
  'report_client_ids',
  {
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    clientId: text('client_id').notNull(),
    reportId: integer('report_id')
      .notNull()
      .references(() => reports.id, { onDelete: 'cascade' }),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.clientId] }), index('report_client_ids_report').on(t.reportId)],
);
