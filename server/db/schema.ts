import { boolean, datetime, double, index, int, json, mediumtext, mysqlEnum, mysqlTable, text, uniqueIndex, varchar } from 'drizzle-orm/mysql-core'
import { sql } from 'drizzle-orm'
import { ROLES } from '../../shared/roles'
import { QUENCHANT_KIND_VALUES as QUENCHANT_KINDS } from '../../shared/schemas/quenchant'
import { MAIL_RECIPIENT_KINDS } from '../../shared/schemas/mailRecipients'
import { OUTBOX_STATUSES, type OutboxAttachment } from '../../shared/types/outbox'

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
