import {
  bigint,
  bigserial,
  boolean,
  check,
  customType,
  date,
  doublePrecision,
  integer,
  index,
  jsonb,
  pgEnum,
  pgSequence,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  type PgColumnBuilderBase,
} from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import type { FitMethod } from '../lib/analysis/types';
import type { ProcessParameters } from '../lib/contracts/batches';
import type { StoredAnalysisOptions, StoredAnalysisResult } from '../lib/contracts/drops';
import type {
  StoredDynamicOptions,
  StoredDynamicResult,
  StoredSeries,
} from '../lib/contracts/dynamic';
import type { Signature } from '../lib/contracts/reviews';
import type { WebhookEventType } from '../lib/contracts/webhooks';
import type { SurfaceEnergyInputs } from '../lib/contracts/surface-energy';
import type { TensiometryInputs, TensiometryOutputs } from '../lib/contracts/tensiometry';
import type { SurfaceEnergyOutputs } from '../lib/surface-energy/compute';

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'bytea' });

/** The four roles of the brief; what each may do is decided in lib/auth/permissions.ts. */
export const roleEnum = pgEnum('role', ['admin', 'analyst', 'reviewer', 'viewer']);

const createdAt = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow();

export const users = pgTable(
  'users',
  {
    id: text('id').primaryKey(),
    /** Stored lower-cased and trimmed; unique across the installation. */
    email: text('email').notNull(),
    name: text('name').notNull(),
    passwordHash: text('password_hash').notNull(),
    emailVerifiedAt: timestamp('email_verified_at', { withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('users_email_unique').on(t.email)],
);

export const organizations = pgTable(
  'organizations',
  {
    id: text('id').primaryKey(),
    name: text('name').notNull(),
    slug: text('slug').notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('organizations_slug_unique').on(t.slug)],
);

/** Lucia's session table, with the organization the user is working in. */
export const sessions = pgTable(
  'sessions',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
    activeOrganizationId: text('active_organization_id').references(() => organizations.id, {
      onDelete: 'set null',
    }),
    /** When the user signed in: a session ends SESSION_ABSOLUTE_LIFETIME later however it is used. */
    createdAt: createdAt(),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

export const memberships = pgTable(
  'memberships',
  {
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    organizationId: text('organization_id')
      .notNull()
      .references(() => organizations.id, { onDelete: 'cascade' }),
    role: roleEnum('role').notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    primaryKey({ columns: [t.userId, t.organizationId] }),
    index('memberships_org_idx').on(t.organizationId),
  ],
);

export const invitations = pgTable(
  'invitations',
  {
    id: text('id').primaryKey(),
    organizationId: text('organization_id')
      .notNull()
      .references(() => organizations.id, { onDelete: 'cascade' }),
    email: text('email').notNull(),
    role: roleEnum('role').notNull(),
    /** SHA-256 of the single-use token; the token itself is only ever in the e-mail. */
    tokenHash: text('token_hash').notNull(),
    invitedByUserId: text('invited_by_user_id').references(() => users.id, {
      onDelete: 'set null',
    }),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    acceptedAt: timestamp('accepted_at', { withTimezone: true }),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex('invitations_token_hash_unique').on(t.tokenHash),
    index('invitations_org_idx').on(t.organizationId),
  ],
);

/** Append-only record of who changed what. Nothing in the app updates or deletes these rows. */
export const auditEvents = pgTable(
  'audit_events',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    actorUserId: text('actor_user_id').references(() => users.id, { onDelete: 'set null' }),
    organizationId: text('organization_id').references(() => organizations.id, {
      onDelete: 'cascade',
    }),
    action: text('action').notNull(),
    entityType: text('entity_type').notNull(),
    entityId: text('entity_id'),
    before: jsonb('before'),
    after: jsonb('after'),
    createdAt: createdAt(),
  },
  (t) => [
    index('audit_events_org_time_idx').on(t.organizationId, t.createdAt),
    index('audit_events_entity_idx').on(t.entityType, t.entityId),
  ],
);

/** Every sign-in attempt, kept for rate limiting per account and per network address. */
export const signInAttempts = pgTable(
  'sign_in_attempts',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    email: text('email').notNull(),
    ipAddress: text('ip_address').notNull(),
    succeeded: boolean('succeeded').notNull(),
    /** 'password' (sign-in and signing a review, one budget) or 'sign-up' (lib/auth/throttle.ts). */
    kind: text('kind').notNull().default('password'),
    createdAt: createdAt(),
  },
  (t) => [
    index('sign_in_attempts_email_time_idx').on(t.email, t.createdAt),
    index('sign_in_attempts_ip_time_idx').on(t.ipAddress, t.createdAt),
  ],
);

export type Role = (typeof roleEnum.enumValues)[number];
export type User = typeof users.$inferSelect;
export type Organization = typeof organizations.$inferSelect;
export type Membership = typeof memberships.$inferSelect;

// ---------------------------------------------------------------------------------------------
// Lab records: probe liquids, coatings and specs, batches, samples, sessions, photos, drops and
// their analyses. Every organization-owned row carries organization_id; nothing crosses them.
// `version` supports optimistic concurrency (a stale update gets 409); `archived_at` replaces
// deletion once results exist.
// ---------------------------------------------------------------------------------------------

const updatedAt = () => timestamp('updated_at', { withTimezone: true }).notNull().defaultNow();
const version = () => integer('version').notNull().default(1);
const archivedAt = () => timestamp('archived_at', { withTimezone: true });
const orgRef = () =>
  text('organization_id')
    .notNull()
    .references(() => organizations.id, { onDelete: 'cascade' });
const userRef = (name: string) => text(name).references(() => users.id, { onDelete: 'set null' });
/** The columns every lab record has after its own: version, archive mark and timestamps. */
const recordTail = () => ({
  version: version(),
  archivedAt: archivedAt(),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
});
/** The same, for a record that names who created it. */
const createdRecordTail = () => ({
  ...recordTail(),
  createdByUserId: userRef('created_by_user_id'),
});

export const specScopeEnum = pgEnum('spec_scope', ['each-drop', 'mean']);

/** How an analysis revision was obtained: one of the engine's fits, or angles read by hand. */
export const analysisMethodEnum = pgEnum('analysis_method', [
  'young-laplace',
  'circle',
  'polynomial',
  'ellipse',
  'height-width',
  'manual',
]);
// A fit method the engine adds needs a value above (and a migration): this stops compiling.
const _everyFitMethod: Exclude<
  FitMethod,
  (typeof analysisMethodEnum.enumValues)[number]
> extends never
  ? true
  : never = true;
export const reviewStatusEnum = pgEnum('review_status', [
  'draft',
  'submitted',
  'approved',
  'rejected',
]);

/**
 * Probe liquids with their surface tension components (mN/m). organization_id null marks the
 * built-in library seeded from published values; labs add their own.
 */
export const probeLiquids = pgTable(
  'probe_liquids',
  {
    id: text('id').primaryKey(),
    organizationId: text('organization_id').references(() => organizations.id, {
      onDelete: 'cascade',
    }),
    name: text('name').notNull(),
    totalMnM: doublePrecision('total_mn_m').notNull(),
    dispersiveMnM: doublePrecision('dispersive_mn_m'),
    polarMnM: doublePrecision('polar_mn_m'),
    lifshitzVanDerWaalsMnM: doublePrecision('lw_mn_m'),
    acidMnM: doublePrecision('acid_mn_m'),
    baseMnM: doublePrecision('base_mn_m'),
    densityGPerCm3: doublePrecision('density_g_per_cm3'),
    /** Where each value comes from, e.g. { total: 'Ström et al. 1987', density: '…' }. */
    sources: jsonb('sources').$type<Record<string, string>>().notNull().default({}),
    hazardNote: text('hazard_note'),
    ...recordTail(),
  },
  (t) => [index('probe_liquids_org_idx').on(t.organizationId)],
);

export const coatings = pgTable(
  'coatings',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    code: text('code').notNull(),
    name: text('name').notNull(),
    description: text('description').notNull().default(''),
    ...createdRecordTail(),
  },
  (t) => [uniqueIndex('coatings_org_code_unique').on(t.organizationId, t.code)],
);

/** Acceptance limits of a coating for one probe liquid. */
export const specs = pgTable(
  'specs',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    coatingId: text('coating_id')
      .notNull()
      .references(() => coatings.id, { onDelete: 'cascade' }),
    probeLiquidId: text('probe_liquid_id')
      .notNull()
      .references(() => probeLiquids.id),
    minDeg: doublePrecision('min_deg'),
    maxDeg: doublePrecision('max_deg'),
    scope: specScopeEnum('scope').notNull(),
    minSurfaceEnergyMnM: doublePrecision('min_surface_energy_mn_m'),
    maxSurfaceEnergyMnM: doublePrecision('max_surface_energy_mn_m'),
    /** Results count only within this many days of treatment (e.g. plasma-treated film). */
    maxDaysSinceTreatment: doublePrecision('max_days_since_treatment'),
    /** Limits on dynamic wetting (series of frames): advancing, receding, hysteresis, roll-off (°). */
    minAdvancingDeg: doublePrecision('min_advancing_deg'),
    maxAdvancingDeg: doublePrecision('max_advancing_deg'),
    minRecedingDeg: doublePrecision('min_receding_deg'),
    maxRecedingDeg: doublePrecision('max_receding_deg'),
    minHysteresisDeg: doublePrecision('min_hysteresis_deg'),
    maxHysteresisDeg: doublePrecision('max_hysteresis_deg'),
    minRollOffDeg: doublePrecision('min_roll_off_deg'),
    maxRollOffDeg: doublePrecision('max_roll_off_deg'),
    note: text('note').notNull().default(''),
    ...recordTail(),
  },
  (t) => [index('specs_coating_idx').on(t.coatingId)],
);

export type { ProcessParameters };

export const batches = pgTable(
  'batches',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    coatingId: text('coating_id')
      .notNull()
      .references(() => coatings.id),
    lotCode: text('lot_code').notNull(),
    producedOn: date('produced_on', { mode: 'string' }).notNull(),
    process: jsonb('process').$type<ProcessParameters>().notNull().default({}),
    notes: text('notes').notNull().default(''),
    ...createdRecordTail(),
  },
  (t) => [
    uniqueIndex('batches_org_lot_unique').on(t.organizationId, t.lotCode),
    index('batches_coating_idx').on(t.coatingId, t.producedOn),
  ],
);

export const samples = pgTable(
  'samples',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    batchId: text('batch_id')
      .notNull()
      .references(() => batches.id),
    label: text('label').notNull(),
    substrate: text('substrate').notNull().default(''),
    position: text('position').notNull().default(''),
    treatedAt: timestamp('treated_at', { withTimezone: true }),
    notes: text('notes').notNull().default(''),
    ...createdRecordTail(),
  },
  (t) => [
    uniqueIndex('samples_batch_label_unique').on(t.batchId, t.label),
    index('samples_org_idx').on(t.organizationId),
  ],
);

/** One sitting at the instrument. */
export const measurementSessions = pgTable(
  'measurement_sessions',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    operatorName: text('operator_name').notNull(),
    measuredAt: timestamp('measured_at', { withTimezone: true }).notNull(),
    probeLiquidId: text('probe_liquid_id').references(() => probeLiquids.id),
    temperatureC: doublePrecision('temperature_c'),
    humidityPct: doublePrecision('humidity_pct'),
    dropVolumeUl: doublePrecision('drop_volume_ul'),
    scalePxPerMm: doublePrecision('scale_px_per_mm'),
    instrumentNotes: text('instrument_notes').notNull().default(''),
    /** The probe liquid's lot or bottle number, for the certificate. */
    liquidLot: text('liquid_lot').notNull().default(''),
    ...createdRecordTail(),
  },
  (t) => [index('measurement_sessions_org_time_idx').on(t.organizationId, t.measuredAt)],
);

/** An uploaded drop photo, as checked on the server. */
export const photoPurposeEnum = pgEnum('photo_purpose', [
  'sessile-drop',
  'pendant-drop',
  'series-frame',
]);

/** The columns of a file stored through the upload service, in the order of its table. */
const storedFileColumns = () => ({
  id: text('id').primaryKey(),
  organizationId: orgRef(),
  uploadedByUserId: userRef('uploaded_by_user_id'),
  fileKey: text('file_key').notNull(),
  url: text('url').notNull(),
  originalName: text('original_name').notNull(),
  sizeBytes: integer('size_bytes').notNull(),
});

export const photos = pgTable(
  'photos',
  {
    ...storedFileColumns(),
    format: text('format').notNull(),
    width: integer('width').notNull(),
    height: integer('height').notNull(),
    bitDepth: integer('bit_depth').notNull(),
    sha256: text('sha256').notNull(),
    thumbnailPng: bytea('thumbnail_png').notNull(),
    /** Lossless PNG for the browser when it cannot decode the original (TIFF, 16-bit, BMP). */
    workingPng: bytea('working_png'),
    /** What the photo was uploaded for; the measurement workspace offers sessile drops only. */
    purpose: photoPurposeEnum('purpose').notNull().default('sessile-drop'),
    /** Set when its uploader removed it from the workspace before saving it; the row stays. */
    removedAt: timestamp('removed_at', { withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [
    index('photos_org_time_idx').on(t.organizationId, t.createdAt),
    index('photos_uploader_sha_idx').on(t.uploadedByUserId, t.sha256),
    uniqueIndex('photos_file_key_unique').on(t.fileKey),
  ],
);

/** One drop of one probe liquid on one sample: a photo, or an angle read by hand (import). */
export const drops = pgTable(
  'drops',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    sampleId: text('sample_id')
      .notNull()
      .references(() => samples.id),
    probeLiquidId: text('probe_liquid_id')
      .notNull()
      .references(() => probeLiquids.id),
    sessionId: text('session_id').references(() => measurementSessions.id),
    photoId: text('photo_id').references(() => photos.id),
    source: text('source').$type<'photo' | 'import'>().notNull().default('photo'),
    measuredAt: timestamp('measured_at', { withTimezone: true }).notNull().defaultNow(),
    archivedAt: archivedAt(),
    createdByUserId: userRef('created_by_user_id'),
    createdAt: createdAt(),
  },
  (t) => [
    index('drops_sample_idx').on(t.sampleId),
    index('drops_org_time_idx').on(t.organizationId, t.measuredAt),
  ],
);

/** A computed result for a drop. Every re-analysis is a new revision; none is overwritten. */
export const analyses = pgTable(
  'analyses',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    dropId: text('drop_id')
      .notNull()
      .references(() => drops.id, { onDelete: 'cascade' }),
    revision: integer('revision').notNull(),
    method: analysisMethodEnum('method').notNull(),
    baseline: jsonb('baseline').$type<{ x1: number; y1: number; x2: number; y2: number } | null>(),
    options: jsonb('options').$type<StoredAnalysisOptions>().notNull().default({}),
    /** The engine's output without its edge points (contact points, fit, warnings, …), or the imported angles. */
    result: jsonb('result').$type<StoredAnalysisResult>().notNull(),
    leftDeg: doublePrecision('left_deg').notNull(),
    rightDeg: doublePrecision('right_deg').notNull(),
    meanDeg: doublePrecision('mean_deg').notNull(),
    leftUncertaintyDeg: doublePrecision('left_uncertainty_deg'),
    rightUncertaintyDeg: doublePrecision('right_uncertainty_deg'),
    softwareVersion: text('software_version').notNull(),
    reviewStatus: reviewStatusEnum('review_status').notNull().default('draft'),
    /** Why this revision was made (asked when a saved drop is analysed again). */
    reason: text('reason'),
    /** The session whose conditions this revision was saved with. */
    sessionId: text('session_id').references(() => measurementSessions.id),
    createdByUserId: userRef('created_by_user_id'),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex('analyses_drop_revision_unique').on(t.dropId, t.revision),
    index('analyses_org_idx').on(t.organizationId),
  ],
);

// ---------------------------------------------------------------------------------------------
// Dynamic wetting: a series of frames of one drop (a video through the upload service, or frame
// photos with a rate), analysed by the server before it is saved; revisions as for drops.
// ---------------------------------------------------------------------------------------------

/** A video uploaded through the upload service, as ffprobe read it on the server. */
export const videos = pgTable(
  'videos',
  {
    ...storedFileColumns(),
    codec: text('codec').notNull(),
    width: integer('width').notNull(),
    height: integer('height').notNull(),
    fps: doublePrecision('fps'),
    frameCount: integer('frame_count'),
    sha256: text('sha256').notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    index('videos_org_time_idx').on(t.organizationId, t.createdAt),
    uniqueIndex('videos_file_key_unique').on(t.fileKey),
  ],
);

export const dynamicKindEnum = pgEnum('dynamic_kind', [
  'grow-and-withdraw',
  'growing',
  'shrinking',
  'tilt',
  'over-time',
]);

/** One series of one drop of one probe liquid on one sample. */
export const dynamicMeasurements = pgTable(
  'dynamic_measurements',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    sampleId: text('sample_id')
      .notNull()
      .references(() => samples.id),
    probeLiquidId: text('probe_liquid_id')
      .notNull()
      .references(() => probeLiquids.id),
    sessionId: text('session_id').references(() => measurementSessions.id),
    kind: dynamicKindEnum('kind').notNull(),
    sourceType: text('source_type').$type<'video' | 'frames'>().notNull(),
    /** The stored video (no action on delete: a kept result is only checkable with its source). */
    videoId: text('video_id').references(() => videos.id),
    /** The frame photos in order, for a series of frames. */
    framePhotoIds: jsonb('frame_photo_ids').$type<string[] | null>(),
    fps: doublePrecision('fps').notNull(),
    measuredAt: timestamp('measured_at', { withTimezone: true }).notNull().defaultNow(),
    archivedAt: archivedAt(),
    createdByUserId: userRef('created_by_user_id'),
    createdAt: createdAt(),
  },
  (t) => [
    index('dynamic_measurements_sample_idx').on(t.sampleId),
    index('dynamic_measurements_org_time_idx').on(t.organizationId, t.measuredAt),
    index('dynamic_measurements_video_idx').on(t.videoId),
    check(
      'dynamic_measurements_one_source',
      sql`(${t.videoId} is null) <> (${t.framePhotoIds} is null)`,
    ),
  ],
);

/** A computed result for a series; every re-analysis is a new revision, none is overwritten. */
export const dynamicAnalyses = pgTable(
  'dynamic_analyses',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    measurementId: text('measurement_id')
      .notNull()
      .references(() => dynamicMeasurements.id, { onDelete: 'cascade' }),
    revision: integer('revision').notNull(),
    method: analysisMethodEnum('method').notNull(),
    options: jsonb('options').$type<StoredDynamicOptions>().notNull(),
    /** Phases, windows, advancing/receding statistics, roll-off, angle over time, warnings. */
    result: jsonb('result').$type<StoredDynamicResult>().notNull(),
    /** Every frame's angles, base diameter, volume, tilt and warnings. */
    series: jsonb('series').$type<StoredSeries>().notNull(),
    advancingDeg: doublePrecision('advancing_deg'),
    advancingSdDeg: doublePrecision('advancing_sd_deg'),
    advancingFrames: integer('advancing_frames'),
    recedingDeg: doublePrecision('receding_deg'),
    recedingSdDeg: doublePrecision('receding_sd_deg'),
    recedingFrames: integer('receding_frames'),
    hysteresisDeg: doublePrecision('hysteresis_deg'),
    rollOffDeg: doublePrecision('roll_off_deg'),
    frameCount: integer('frame_count').notNull(),
    flaggedFrameCount: integer('flagged_frame_count').notNull(),
    softwareVersion: text('software_version').notNull(),
    reviewStatus: reviewStatusEnum('review_status').notNull().default('draft'),
    createdByUserId: userRef('created_by_user_id'),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex('dynamic_analyses_measurement_revision_unique').on(t.measurementId, t.revision),
    index('dynamic_analyses_org_idx').on(t.organizationId),
  ],
);

// ---------------------------------------------------------------------------------------------
// Account tokens sent by e-mail. Only the SHA-256 of each single-use token is stored; the token
// itself is only ever in the mail.
// ---------------------------------------------------------------------------------------------

/** A table of single-use tokens of one kind: the user, the token's hash, expiry and use. */
function tokenTable<Extra extends Record<string, PgColumnBuilderBase>>(name: string, extra: Extra) {
  return pgTable(
    name,
    {
      id: text('id').primaryKey(),
      userId: text('user_id')
        .notNull()
        .references(() => users.id, { onDelete: 'cascade' }),
      ...extra,
      tokenHash: text('token_hash').notNull(),
      expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
      usedAt: timestamp('used_at', { withTimezone: true }),
      createdAt: createdAt(),
    },
    (t) => [
      uniqueIndex(`${name}_token_hash_unique`).on(t.tokenHash),
      index(`${name}_user_idx`).on(t.userId),
    ],
  );
}

/** "Forgot password?": valid for one hour, used once. */
export const passwordResetTokens = tokenTable('password_reset_tokens', {});

/** Confirms that the user owns the e-mail address they signed up with. */
export const emailVerificationTokens = tokenTable('email_verification_tokens', {
  /** The address the link was sent to; verifying only counts while the user still has it. */
  email: text('email').notNull(),
});

/**
 * A sign-up waiting for its address to be proven: nothing is created until the link mailed to
 * the address is followed (server/account/sign-up.ts), so the sign-up form answers the same
 * whether or not the address already has an account.
 */
export const pendingSignUps = pgTable(
  'pending_sign_ups',
  {
    id: text('id').primaryKey(),
    email: text('email').notNull(),
    name: text('name').notNull(),
    organizationName: text('organization_name').notNull(),
    passwordHash: text('password_hash').notNull(),
    tokenHash: text('token_hash').notNull(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    usedAt: timestamp('used_at', { withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex('pending_sign_ups_token_hash_unique').on(t.tokenHash),
    index('pending_sign_ups_email_idx').on(t.email),
  ],
);

// ---------------------------------------------------------------------------------------------
// Review and sign-off: an analyst submits a sample's or a batch's results; a reviewer approves
// (signing with their password) or rejects with a comment. The analyses reviewed are listed, so
// a later re-analysis is a new revision that needs review again.
// ---------------------------------------------------------------------------------------------

export const reviewScopeEnum = pgEnum('review_scope', ['sample', 'batch']);
export const reviewOutcomeEnum = pgEnum('review_outcome', [
  'submitted',
  'approved',
  'rejected',
  'withdrawn',
  'revoked',
]);

export const reviews = pgTable(
  'reviews',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    scope: reviewScopeEnum('scope').notNull(),
    batchId: text('batch_id')
      .notNull()
      .references(() => batches.id),
    /** Set when the scope is one sample. */
    sampleId: text('sample_id').references(() => samples.id),
    /** The analysis revisions under review, frozen at submission. */
    analysisIds: jsonb('analysis_ids').$type<string[]>().notNull(),
    status: reviewOutcomeEnum('status').notNull().default('submitted'),
    submittedByUserId: userRef('submitted_by_user_id'),
    submittedAt: timestamp('submitted_at', { withTimezone: true }).notNull().defaultNow(),
    submitNote: text('submit_note').notNull().default(''),
    decidedByUserId: userRef('decided_by_user_id'),
    decidedAt: timestamp('decided_at', { withTimezone: true }),
    decisionComment: text('decision_comment').notNull().default(''),
    /** Who signed, when, how, and a digest of exactly what was signed. */
    signature: jsonb('signature').$type<Signature | null>(),
    /** An approval withdrawn later: only by an explicit revocation with its reason. */
    revokedByUserId: userRef('revoked_by_user_id'),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    revokeReason: text('revoke_reason').notNull().default(''),
  },
  (t) => [
    index('reviews_org_status_idx').on(t.organizationId, t.status, t.submittedAt),
    index('reviews_batch_idx').on(t.batchId),
  ],
);

/**
 * The analysis revisions of each review, one row each. `open` is true while the review waits
 * for its decision; the partial unique index keeps an analysis in at most one open review, so
 * two simultaneous submissions can never both take the same results.
 */
export const reviewItems = pgTable(
  'review_items',
  {
    reviewId: text('review_id')
      .notNull()
      .references(() => reviews.id, { onDelete: 'cascade' }),
    analysisId: text('analysis_id')
      .notNull()
      .references(() => analyses.id, { onDelete: 'cascade' }),
    open: boolean('open').notNull().default(true),
  },
  (t) => [
    primaryKey({ columns: [t.reviewId, t.analysisId] }),
    uniqueIndex('review_items_open_analysis_unique')
      .on(t.analysisId)
      .where(sql`${t.open}`),
  ],
);

// ---------------------------------------------------------------------------------------------
// Surface energy and tensiometry results, each stored with the inputs it was computed from.
// ---------------------------------------------------------------------------------------------

/** A surface free energy computed for one sample or one batch (exactly one of the two). */
export const surfaceEnergyResults = pgTable(
  'surface_energy_results',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    sampleId: text('sample_id').references(() => samples.id),
    batchId: text('batch_id').references(() => batches.id),
    /** Methods chosen and the liquids used: mean angle, SD, n and the components with their source. */
    inputs: jsonb('inputs').$type<SurfaceEnergyInputs>().notNull(),
    /** Per method: components with standard uncertainties, warnings; errors of methods that failed. */
    outputs: jsonb('outputs').$type<SurfaceEnergyOutputs>().notNull(),
    createdByUserId: userRef('created_by_user_id'),
    createdAt: createdAt(),
  },
  (t) => [
    index('surface_energy_results_sample_idx').on(t.sampleId, t.createdAt),
    index('surface_energy_results_batch_idx').on(t.batchId, t.createdAt),
    index('surface_energy_results_org_idx').on(t.organizationId, t.createdAt),
    check(
      'surface_energy_results_one_subject',
      sql`(${t.sampleId} is null) <> (${t.batchId} is null)`,
    ),
  ],
);

export const tensiometryKindEnum = pgEnum('tensiometry_kind', [
  'wilhelmy-tension',
  'wilhelmy-angle',
  'water-check',
  'pendant-drop',
]);

/** A tensiometry calculation (Wilhelmy plate, water probe check, pendant drop) with its inputs. */
export const tensiometryResults = pgTable(
  'tensiometry_results',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    kind: tensiometryKindEnum('kind').notNull(),
    inputs: jsonb('inputs').$type<TensiometryInputs>().notNull(),
    outputs: jsonb('outputs').$type<TensiometryOutputs>().notNull(),
    /**
     * The pendant-drop photo the result was fitted from. No action on delete (as drops.photo_id):
     * a kept result is only checkable with its photo, so a photo in use cannot be deleted on its
     * own; deleting the organization still removes both in one statement.
     */
    photoId: text('photo_id').references(() => photos.id),
    createdByUserId: userRef('created_by_user_id'),
    createdAt: createdAt(),
  },
  (t) => [
    index('tensiometry_results_org_idx').on(t.organizationId, t.kind, t.createdAt),
    // Deleting a photo checks this foreign key; without an index that is a full scan.
    index('tensiometry_results_photo_idx').on(t.photoId),
  ],
);

// ---------------------------------------------------------------------------------------------
// Out-of-spec alerts: who watches a coating, and the last verdict seen for each batch, so a
// batch turning to fail sends one mail per change.
// ---------------------------------------------------------------------------------------------

export const coatingWatchers = pgTable(
  'coating_watchers',
  {
    coatingId: text('coating_id')
      .notNull()
      .references(() => coatings.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    organizationId: orgRef(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.coatingId, t.userId] })],
);

export const batchVerdicts = pgTable('batch_verdicts', {
  batchId: text('batch_id')
    .primaryKey()
    .references(() => batches.id, { onDelete: 'cascade' }),
  organizationId: orgRef(),
  outcome: text('outcome').$type<'pass' | 'fail' | 'not-enough-data' | 'no-spec'>().notNull(),
  updatedAt: updatedAt(),
});

// ---------------------------------------------------------------------------------------------
// The versioned API (/api/v1): tokens for instruments and LIMS, and idempotent replies.
// ---------------------------------------------------------------------------------------------

/** What an API token may do: read records and results, measure (create and post photos), or both. */
export const apiTokenScopeEnum = pgEnum('api_token_scope', ['read', 'measure', 'read-measure']);

/**
 * A bearer token of an organization, made by an admin. Only its SHA-256 is kept (as the mailed
 * tokens, lib/auth/tokens.ts); the token is shown once. Accepted by /api/v1 only.
 */
export const apiTokens = pgTable(
  'api_tokens',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    name: text('name').notNull(),
    scope: apiTokenScopeEnum('scope').notNull(),
    /** The first characters of the token, to tell tokens apart in the list. */
    prefix: text('prefix').notNull(),
    tokenHash: text('token_hash').notNull(),
    createdByUserId: text('created_by_user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    lastUsedAt: timestamp('last_used_at', { withTimezone: true }),
    lastUsedAddress: text('last_used_address'),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex('api_tokens_token_hash_unique').on(t.tokenHash),
    index('api_tokens_org_idx').on(t.organizationId),
  ],
);

/**
 * The reply to a request sent with an Idempotency-Key: the same token and key answer the same
 * reply again instead of doing the work twice. `status` null while the first request runs.
 */
export const apiIdempotencyKeys = pgTable(
  'api_idempotency_keys',
  {
    tokenId: text('token_id')
      .notNull()
      .references(() => apiTokens.id, { onDelete: 'cascade' }),
    key: text('key').notNull(),
    /** SHA-256 of method, path and body: the same key with another request is refused. */
    requestHash: text('request_hash').notNull(),
    status: integer('status'),
    body: jsonb('body'),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.tokenId, t.key] })],
);

// ---------------------------------------------------------------------------------------------
// Certificates of analysis, built once by a job and reused while the batch's data is unchanged.
// ---------------------------------------------------------------------------------------------

/**
 * A built certificate (PDF/A-2b) of a batch for one audience ('all' results, or 'approved' only
 * for viewers). `fingerprint` is the SHA-256 of everything the certificate shows; a change to the
 * batch's data gives a new fingerprint and so a new certificate.
 */
export const certificates = pgTable(
  'certificates',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    batchId: text('batch_id')
      .notNull()
      .references(() => batches.id, { onDelete: 'cascade' }),
    audience: text('audience').$type<'all' | 'approved'>().notNull(),
    fingerprint: text('fingerprint').notNull(),
    fileName: text('file_name').notNull(),
    pdf: bytea('pdf').notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex('certificates_batch_audience_fingerprint_unique').on(
      t.batchId,
      t.audience,
      t.fingerprint,
    ),
  ],
);

// ---------------------------------------------------------------------------------------------
// Cached results (server/cache/results.ts) are keyed by their organization's data version.
// ---------------------------------------------------------------------------------------------

/**
 * The version of an organization's lab data: every insert, update or delete of a row that a
 * comparison, the dashboard or a list reads (coatings, specs, batches, samples, drops and their
 * analyses, dynamic measurements and theirs, probe liquids, reviews) sets it to a new value of
 * organization_data_version_seq when its transaction commits (deferred trigger, migration
 * 0018). Values only grow and are never reused, even after rows are truncated. No foreign key:
 * the commit of an organization's deletion still bumps it.
 */
export const organizationDataVersions = pgTable('organization_data_versions', {
  organizationId: text('organization_id').primaryKey(),
  version: bigint('version', { mode: 'bigint' }).notNull(),
});

/** Where organization_data_versions takes its values from. */
export const organizationDataVersionSeq = pgSequence('organization_data_version_seq');
/**
 * Webhooks: an admin's subscription of a URL to some events. The secret signs each delivery
 * (HMAC-SHA256, lib/webhooks/signature.ts); it is shown to the admin once and kept as it is,
 * because signing needs it (unlike API tokens, which are only compared).
 */
export const webhooks = pgTable(
  'webhooks',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    url: text('url').notNull(),
    description: text('description').notNull().default(''),
    events: text('events').array().notNull().$type<WebhookEventType[]>(),
    secret: text('secret').notNull(),
    createdByUserId: userRef('created_by_user_id'),
    createdAt: createdAt(),
  },
  (t) => [index('webhooks_org_idx').on(t.organizationId)],
);

export const webhookDeliveryStatusEnum = pgEnum('webhook_delivery_status', [
  'pending',
  'retrying',
  'delivered',
  'failed',
]);

/**
 * One event for one webhook: at most one row per (webhook, event), so an event is delivered once
 * per subscription whichever process runs the job. `body` is the exact JSON sent (a redelivery
 * sends the same bytes); `claimed_until` keeps two workers from sending the same row at once.
 */
export const webhookDeliveries = pgTable(
  'webhook_deliveries',
  {
    id: text('id').primaryKey(),
    organizationId: orgRef(),
    webhookId: text('webhook_id')
      .notNull()
      .references(() => webhooks.id, { onDelete: 'cascade' }),
    eventId: text('event_id').notNull(),
    eventType: text('event_type').notNull().$type<WebhookEventType>(),
    body: text('body').notNull(),
    status: webhookDeliveryStatusEnum('status').notNull().default('pending'),
    attempts: integer('attempts').notNull().default(0),
    lastStatusCode: integer('last_status_code'),
    lastError: text('last_error'),
    lastAttemptAt: timestamp('last_attempt_at', { withTimezone: true }),
    nextAttemptAt: timestamp('next_attempt_at', { withTimezone: true }),
    deliveredAt: timestamp('delivered_at', { withTimezone: true }),
    claimedUntil: timestamp('claimed_until', { withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex('webhook_deliveries_once').on(t.webhookId, t.eventId),
    index('webhook_deliveries_webhook_idx').on(t.webhookId, t.createdAt),
  ],
);
