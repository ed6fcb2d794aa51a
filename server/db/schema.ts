import { boolean, customType, datetime, double, index, int, json, mediumtext, mysqlEnum, mysqlTable, primaryKey, text, uniqueIndex, varchar } from 'drizzle-orm/mysql-core'
import { sql } from 'drizzle-orm'
import { ROLES } from '../../shared/roles'
import { QUENCHANT_KIND_VALUES as QUENCHANT_KINDS } from '../../shared/schemas/quenchant'
import { MAIL_RECIPIENT_KINDS } from '../../shared/schemas/mailRecipients'
import { OUTBOX_STATUSES, type OutboxAttachment } from '../../shared/types/outbox'
import { FURNACE_KINDS } from '../../shared/schemas/schedule'
import { BATCH_STATES } from '../../shared/schedule'
import { RECORD_STATES } from '../../shared/types/cooldownRecord'
import type { LogMapping, LogPreview } from '../../shared/types/measurementLog'
import type { CalibrationFitted, CalibrationProbe, QuenchantCalibration } from '../../shared/types/calibration'

const timestamps = {
  createdAt: datetime('created_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  updatedAt: datetime('updated_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`).$onUpdate(() => new Date()),
}

export const users = mysqlTable('users', {
  id: int('id').autoincrement().primaryKey(),
  email: varchar('email', { length: 190 }).notNull().unique(),
  displayName: varchar('display_name', { length: 120 }).notNull(),
  role: mysqlEnum('role', ROLES).notNull(),
  /** scrypt$N$r$p$salt$hash — see server/utils/password.ts */
  passwordHash: varchar('password_hash', { length: 255 }).notNull(),
  active: boolean('active').notNull().default(true),
  /** Raised to end every open session of the account (server/security/sessions.ts). */
  sessionVersion: int('session_version').notNull().default(0),
  /** Set on a generated first password: the account may do nothing but choose its own. */
  mustChangePassword: boolean('must_change_password').notNull().default(false),
  /** A demo shop sign-in with a published password: signs in only on loopback. */
  demo: boolean('demo').notNull().default(false),
  ...timestamps,
})

/** Append-only record of who changed what; rows are never updated or deleted by the app. */
export const auditLog = mysqlTable(
  'audit_log',
  {
    id: int('id').autoincrement().primaryKey(),
    at: datetime('at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
    actorId: int('actor_id').references(() => users.id),
    action: varchar('action', { length: 64 }).notNull(),
    entityType: varchar('entity_type', { length: 64 }).notNull(),
    entityId: varchar('entity_id', { length: 64 }),
    details: json('details').$type<Record<string, unknown>>(),
  },
  (table) => [index('audit_entity_idx').on(table.entityType, table.entityId), index('audit_at_idx').on(table.at)],
)

export type UserRow = typeof users.$inferSelect

/**
 * Sign-in attempts per account ('account:<e-mail>') and per client address
 * ('address:<ip>'), counted when they start so attempts in flight count too
 * (server/security/signInLimits.ts), kept in the database so that neither a restart
 * nor a second server process resets them.
 */
export const signInAttempts = mysqlTable('sign_in_attempts', {
  subject: varchar('subject', { length: 200 }).primaryKey(),
  count: int('count').notNull(),
  lastAt: datetime('last_at', { mode: 'date', fsp: 3 }).notNull(),
})
export type AuditRow = typeof auditLog.$inferSelect

/** Thermal properties in SI. A graded profile, when present, replaces the uniform values in the engine. */
export const materials = mysqlTable('materials', {
  id: int('id').autoincrement().primaryKey(),
  name: varchar('name', { length: 120 }).notNull().unique(),
  k_W_mK: double('k_w_mk').notNull(),
  density_kg_m3: double('density_kg_m3').notNull(),
  specificHeat_J_kgK: double('specific_heat_j_kgk').notNull(),
  /** Temperature (°C) the values refer to, or the middle of the range they average. */
  propertiesAt_C: double('properties_at_c'),
  /** [{ x (0–1 of the section), k, rhoCp }] with a repeated x for a jump; see shared/schemas/material.ts. */
  gradedProfile: json('graded_profile').$type<{ x: number; k: number; rhoCp: number }[]>(),
  /** [{ T_C, k, cp, rho? }] rising in T; linear between rows, constant beyond (shared/schemas/material.ts). */
  propertyTable: json('property_table').$type<{ T_C: number; k: number; cp: number; rho?: number }[]>(),
  propertyTableSource: text('property_table_source'),
  notes: text('notes'),
  source: text('source').notNull(),
  createdBy: int('created_by').references(() => users.id),
  ...timestamps,
})

/** A quench medium with the shop's calibrated heat-transfer coefficient and its spread. */
export const quenchants = mysqlTable('quenchants', {
  id: int('id').autoincrement().primaryKey(),
  name: varchar('name', { length: 120 }).notNull().unique(),
  kind: mysqlEnum('kind', QUENCHANT_KINDS).notNull(),
  hTypical_W_m2K: double('h_typical_w_m2k').notNull(),
  hLow_W_m2K: double('h_low_w_m2k').notNull(),
  hHigh_W_m2K: double('h_high_w_m2k').notNull(),
  bath_C: double('bath_c').notNull(),
  /** { low, typical, high }: each [{ T_C (surface), h }] rising in T (shared/schemas/quenchant.ts). */
  coolingCurves: json('cooling_curves').$type<Record<'low' | 'typical' | 'high', { T_C: number; h: number }[]>>(),
  /** Air and gas only: radiation to surroundings at bath_C on top of the curve or h. */
  emissivity: double('emissivity'),
  curveSource: text('curve_source'),
  notes: text('notes'),
  source: text('source').notNull(),
  createdBy: int('created_by').references(() => users.id),
  ...timestamps,
})

/** A plan's identity; its content lives in immutable revisions. */
export const plans = mysqlTable('plans', {
  id: int('id').autoincrement().primaryKey(),
  name: varchar('name', { length: 160 }).notNull(),
  latestRevision: int('latest_revision').notNull().default(1),
  archived: boolean('archived').notNull().default(false),
  createdBy: int('created_by').references(() => users.id),
  ...timestamps,
})

/**
 * One saved version of a plan. Never updated: an edit inserts the next revision.
 * `spec` is the validated planner input (shared/schemas/plan.ts) with the material
 * and quenchant values copied in, so a revision still computes the same after the
 * library changes; `summary` caches the headline results for lists.
 */
export const planRevisions = mysqlTable(
  'plan_revisions',
  {
    id: int('id').autoincrement().primaryKey(),
    planId: int('plan_id').notNull().references(() => plans.id),
    revision: int('revision').notNull(),
    spec: json('spec').$type<Record<string, unknown>>().notNull(),
    summary: json('summary').$type<Record<string, unknown>>(),
    note: varchar('note', { length: 255 }),
    createdBy: int('created_by').references(() => users.id),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (table) => [uniqueIndex('plan_revision_unique').on(table.planId, table.revision)],
)

export type MaterialRow = typeof materials.$inferSelect
export type QuenchantRow = typeof quenchants.$inferSelect
export type PlanRow = typeof plans.$inferSelect
export type PlanRevisionRow = typeof planRevisions.$inferSelect

/**
 * Durable mail outbox: a message is written in the same transaction as the change that
 * causes it and sent later by the worker (server/outbox/worker.ts). `next_attempt_at`
 * is both the retry schedule of a queued row and the lease expiry of a sending one.
 */
export const outboxMessages = mysqlTable(
  'outbox_messages',
  {
    id: int('id').autoincrement().primaryKey(),
    dedupeKey: varchar('dedupe_key', { length: 190 }).notNull().unique(),
    to: json('to_addresses').$type<string[]>().notNull(),
    subject: varchar('subject', { length: 255 }).notNull(),
    html: mediumtext('html').notNull(),
    text: mediumtext('text').notNull(),
    attachments: json('attachments').$type<OutboxAttachment[]>().notNull(),
    status: mysqlEnum('status', OUTBOX_STATUSES).notNull().default('queued'),
    attempts: int('attempts').notNull().default(0),
    nextAttemptAt: datetime('next_attempt_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
    /** Random token of the worker that holds the row while it is `sending`. */
    claimToken: varchar('claim_token', { length: 36 }),
    lastError: text('last_error'),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
    sentAt: datetime('sent_at', { mode: 'date', fsp: 3 }),
  },
  (table) => [index('outbox_due_idx').on(table.status, table.nextAttemptAt)],
)

/**
 * Who receives each kind of record mail. No row for a kind means its default: the
 * active users of the kind's role (shared/schemas/mailRecipients.ts).
 */
export const mailRecipients = mysqlTable('mail_recipients', {
  kind: mysqlEnum('kind', MAIL_RECIPIENT_KINDS).primaryKey(),
  emails: json('emails').$type<string[]>().notNull(),
  includeRoleDefault: boolean('include_role_default').notNull().default(true),
  updatedBy: int('updated_by').references(() => users.id),
  updatedAt: datetime('updated_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`).$onUpdate(() => new Date()),
})

export type OutboxMessageRow = typeof outboxMessages.$inferSelect
export type MailRecipientRow = typeof mailRecipients.$inferSelect

/** A furnace the shop books loads into; its row is the lock that serialises bookings on it. */
export const furnaces = mysqlTable('furnaces', {
  id: int('id').autoincrement().primaryKey(),
  name: varchar('name', { length: 80 }).notNull().unique(),
  kind: mysqlEnum('kind', FURNACE_KINDS).notNull(),
  maxTemp_C: double('max_temp_c').notNull(),
  capacity_kg: double('capacity_kg').notNull(),
  zoneWidth_mm: double('zone_width_mm').notNull(),
  zoneDepth_mm: double('zone_depth_mm').notNull(),
  zoneHeight_mm: double('zone_height_mm').notNull(),
  active: boolean('active').notNull().default(true),
  ...timestamps,
})

/** A quench tank or air station; like furnaces, its row is locked while booking. */
export const quenchStations = mysqlTable('quench_stations', {
  id: int('id').autoincrement().primaryKey(),
  name: varchar('name', { length: 80 }).notNull().unique(),
  kind: mysqlEnum('kind', QUENCHANT_KINDS).notNull(),
  maxTemp_C: double('max_temp_c').notNull(),
  capacity_kg: double('capacity_kg').notNull(),
  active: boolean('active').notNull().default(true),
  ...timestamps,
})

/** Which stations a furnace's loads can reach within the transfer time. */
export const furnaceStations = mysqlTable(
  'furnace_stations',
  {
    furnaceId: int('furnace_id').notNull().references(() => furnaces.id),
    stationId: int('station_id').notNull().references(() => quenchStations.id),
  },
  (table) => [primaryKey({ columns: [table.furnaceId, table.stationId] })],
)

/** Shop-wide scheduling figures (shared/schedule.ts ShopSettings), one row per key. */
export const shopSettings = mysqlTable('shop_settings', {
  key: varchar('key', { length: 64 }).primaryKey(),
  value: double('value').notNull(),
  updatedBy: int('updated_by').references(() => users.id),
  ...timestamps,
})

/** Last load-number sequence per year; locked while a booking takes the next one. */
export const loadCounters = mysqlTable('load_counters', {
  year: int('year').primaryKey(),
  last: int('last').notNull(),
})

/**
 * A booked load. Durations are copied from the plan revision and settings at
 * booking time, so re-planning from floor events never depends on later edits;
 * the slot columns are the current plan (moved by late floor events).
 */
export const batches = mysqlTable(
  'batches',
  {
    id: int('id').autoincrement().primaryKey(),
    loadNumber: varchar('load_number', { length: 32 }).notNull().unique(),
    planRevisionId: int('plan_revision_id').notNull().references(() => planRevisions.id),
    furnaceId: int('furnace_id').notNull().references(() => furnaces.id),
    stationId: int('station_id').notNull().references(() => quenchStations.id),
    partCount: int('part_count').notNull(),
    mass_kg: double('mass_kg').notNull(),
    reference: varchar('reference', { length: 120 }).notNull(),
    state: mysqlEnum('state', BATCH_STATES).notNull().default('planned'),
    plannedCharge: datetime('planned_charge', { mode: 'date', fsp: 3 }).notNull(),
    furnace_s: double('furnace_s').notNull(),
    furnaceIsDefault: boolean('furnace_is_default').notNull(),
    minimumSoak_s: double('minimum_soak_s'),
    transfer_s: double('transfer_s').notNull(),
    quench_s: double('quench_s').notNull(),
    quenchToHandling_s: double('quench_to_handling_s').notNull(),
    quenchDelayAllowance_s: double('quench_delay_allowance_s').notNull(),
    furnaceStart: datetime('furnace_start', { mode: 'date', fsp: 3 }).notNull(),
    furnaceEnd: datetime('furnace_end', { mode: 'date', fsp: 3 }).notNull(),
    quenchStart: datetime('quench_start', { mode: 'date', fsp: 3 }).notNull(),
    quenchEnd: datetime('quench_end', { mode: 'date', fsp: 3 }).notNull(),
    handlingAt: datetime('handling_at', { mode: 'date', fsp: 3 }).notNull(),
    chargedAt: datetime('charged_at', { mode: 'date', fsp: 3 }),
    soakingAt: datetime('soaking_at', { mode: 'date', fsp: 3 }),
    /** Furnace door open, load out: the start of the quench delay. */
    unloadedAt: datetime('unloaded_at', { mode: 'date', fsp: 3 }),
    quenchedAt: datetime('quenched_at', { mode: 'date', fsp: 3 }),
    /** Set when an earlier load ran late into this one's furnace or station time. */
    conflictWith: varchar('conflict_with', { length: 32 }),
    conflictNote: varchar('conflict_note', { length: 255 }),
    createdBy: int('created_by').references(() => users.id),
    ...timestamps,
  },
  (table) => [
    index('batch_furnace_time_idx').on(table.furnaceId, table.furnaceStart),
    index('batch_station_time_idx').on(table.stationId, table.quenchStart),
    index('batch_time_idx').on(table.furnaceStart),
  ],
)

/**
 * Every state move with who (null: the clock) and when. One row per batch and
 * target state, which is what makes a repeated floor tap harmless.
 */
export const batchEvents = mysqlTable(
  'batch_events',
  {
    id: int('id').autoincrement().primaryKey(),
    batchId: int('batch_id').notNull().references(() => batches.id),
    fromState: mysqlEnum('from_state', BATCH_STATES).notNull(),
    toState: mysqlEnum('to_state', BATCH_STATES).notNull(),
    at: datetime('at', { mode: 'date', fsp: 3 }).notNull(),
    actorId: int('actor_id').references(() => users.id),
    /** Set when the tap came before the plan said it should and the operator confirmed it anyway. */
    shortfall_s: double('shortfall_s'),
    shortfallNote: varchar('shortfall_note', { length: 300 }),
  },
  (table) => [uniqueIndex('batch_event_once').on(table.batchId, table.toState)],
)

/**
 * A corrected time for a recorded floor event. The event row keeps the original tap;
 * each correction is added beside it (the latest one counts), so the record and the
 * audit trail show both.
 */
export const batchEventCorrections = mysqlTable(
  'batch_event_corrections',
  {
    id: int('id').autoincrement().primaryKey(),
    eventId: int('event_id').notNull().references(() => batchEvents.id),
    batchId: int('batch_id').notNull().references(() => batches.id),
    correctedAt: datetime('corrected_at', { mode: 'date', fsp: 3 }).notNull(),
    reason: varchar('reason', { length: 500 }).notNull(),
    actorId: int('actor_id').notNull().references(() => users.id),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (table) => [index('correction_batch_idx').on(table.batchId)],
)

export type FurnaceRow = typeof furnaces.$inferSelect
export type QuenchStationRow = typeof quenchStations.$inferSelect
export type BatchRow = typeof batches.$inferSelect
export type BatchEventRow = typeof batchEvents.$inferSelect
export type BatchEventCorrectionRow = typeof batchEventCorrections.$inferSelect

/**
 * The cooldown record of a released batch, written in the release transaction. The
 * snapshot (shared/types/cooldownRecord.ts) is frozen: the app never updates it, and
 * `hash` is recordSeal(snapshot) at writing time (HMAC-SHA-256 under the server's
 * seal key), so any later change shows as a mismatch and cannot be re-sealed from
 * the database alone. The sign-off columns are written once; `signature_hash` seals
 * the decision, signer and time to the record's seal (server/records/cooldownRecord.ts).
 */
export const cooldownRecords = mysqlTable(
  'cooldown_records',
  {
    id: int('id').autoincrement().primaryKey(),
    batchId: int('batch_id').notNull().unique().references(() => batches.id),
    snapshot: json('snapshot').$type<Record<string, unknown>>().notNull(),
    hash: varchar('hash', { length: 64 }).notNull(),
    /** Copied from the snapshot for lists and filters; the snapshot stays the authority. */
    deviationCount: int('deviation_count').notNull(),
    releasedAt: datetime('released_at', { mode: 'date', fsp: 3 }).notNull(),
    state: mysqlEnum('state', RECORD_STATES).notNull().default('unsigned'),
    signedBy: int('signed_by').references(() => users.id),
    signedAt: datetime('signed_at', { mode: 'date', fsp: 3 }),
    signComment: text('sign_comment'),
    signatureHash: varchar('signature_hash', { length: 64 }),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (table) => [index('record_state_idx').on(table.state, table.createdAt), index('record_released_idx').on(table.releasedAt)],
)

export type CooldownRecordRow = typeof cooldownRecords.$inferSelect

/** Raw bytes up to 4 GB; the measurement tables keep files and number series in it. */
const longblob = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'longblob' })

/**
 * An uploaded thermocouple log: who sent which file when, what the parser detected and
 * the mapping the person confirmed. Written once with its bytes and parsed series in
 * one transaction and never changed afterwards (server/measurements/logStore.ts).
 * `time_s` is the series' time axis, seconds from the first row, as little-endian float64.
 */
export const measurementLogs = mysqlTable(
  'measurement_logs',
  {
    id: int('id').autoincrement().primaryKey(),
    fileName: varchar('file_name', { length: 255 }).notNull(),
    sha256: varchar('sha256', { length: 64 }).notNull(),
    size_bytes: int('size_bytes').notNull(),
    rows: int('rows').notNull(),
    duration_s: double('duration_s').notNull(),
    detected: json('detected').$type<Omit<LogPreview, 'firstRows'>>().notNull(),
    mapping: json('mapping').$type<LogMapping>().notNull(),
    time_s: longblob('time_s').notNull(),
    batchId: int('batch_id').references(() => batches.id),
    uploadedBy: int('uploaded_by').notNull().references(() => users.id),
    uploadedAt: datetime('uploaded_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (table) => [index('log_batch_idx').on(table.batchId), index('log_uploaded_idx').on(table.uploadedAt)],
)

/** One mapped temperature channel of a log, in °C as little-endian float64 (one value per row of time_s). */
export const measurementLogChannels = mysqlTable(
  'measurement_log_channels',
  {
    logId: int('log_id').notNull().references(() => measurementLogs.id),
    position: int('position').notNull(),
    name: varchar('name', { length: 255 }).notNull(),
    unit: mysqlEnum('unit', ['C', 'F']).notNull(),
    min_C: double('min_c').notNull(),
    max_C: double('max_c').notNull(),
    T_C: longblob('t_c').notNull(),
  },
  (table) => [primaryKey({ columns: [table.logId, table.position] })],
)

/**
 * The file as received, in parts of at most 1 MB: one statement stays far below the
 * server's max_allowed_packet (16 MB by default) even as hex, whatever the file size.
 */
export const measurementLogParts = mysqlTable(
  'measurement_log_parts',
  {
    logId: int('log_id').notNull().references(() => measurementLogs.id),
    part: int('part').notNull(),
    bytes: longblob('bytes').notNull(),
  },
  (table) => [primaryKey({ columns: [table.logId, table.part] })],
)

export type MeasurementLogRow = typeof measurementLogs.$inferSelect

/**
 * A calibration saved as a quench medium's curves: which log, channel, probe and bath
 * it came from, what the server's own fit found and how well it matched, and the
 * curves it wrote, by whom and when (server/measurements/saveCalibration.ts). Written
 * once, in the same transaction as the medium's change and its audit row.
 */
export const quenchantCalibrations = mysqlTable(
  'quenchant_calibrations',
  {
    id: int('id').autoincrement().primaryKey(),
    quenchantId: int('quenchant_id').notNull().references(() => quenchants.id),
    logId: int('log_id').notNull().references(() => measurementLogs.id),
    channel: varchar('channel', { length: 255 }).notNull(),
    probe: json('probe').$type<CalibrationProbe>().notNull(),
    bath_C: double('bath_c').notNull(),
    initial_C: double('initial_c').notNull(),
    from_s: double('from_s').notNull(),
    to_s: double('to_s').notNull(),
    model: mysqlEnum('model', ['constant', 'curve']).notNull(),
    fitted: json('fitted').$type<CalibrationFitted>().notNull(),
    rms_K: double('rms_k').notNull(),
    maxAbs_K: double('max_abs_k').notNull(),
    points: int('points').notNull(),
    iterations: int('iterations').notNull(),
    curves: json('curves').$type<QuenchantCalibration['curves']>().notNull(),
    createdBy: int('created_by').notNull().references(() => users.id),
    createdAt: datetime('created_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (table) => [index('calibration_quenchant_idx').on(table.quenchantId, table.createdAt)],
)
