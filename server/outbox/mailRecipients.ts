import { and, asc, eq } from 'drizzle-orm'
import {
  MAIL_RECIPIENT_KIND_INFO,
  MAIL_RECIPIENT_KINDS,
  type MailRecipientKind,
  type MailRecipientSetting,
  type MailRecipientsUpdate,
} from '../../shared/schemas/mailRecipients'
import type { Database, Transaction } from '../db/client'
import { mailRecipients, users, type MailRecipientRow } from '../db/schema'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'

async function activeAddressesOf(db: Database | Transaction, role: MailRecipientSetting['defaultRole']): Promise<string[]> {
  const rows = await db.select({ email: users.email }).from(users).where(and(eq(users.role, role), eq(users.active, true))).orderBy(asc(users.email))
  return rows.map((row) => row.email)
}

async function settingOf(db: Database | Transaction, kind: MailRecipientKind, row: MailRecipientRow | undefined): Promise<MailRecipientSetting> {
  const info = MAIL_RECIPIENT_KIND_INFO[kind]
  const emails = row?.emails ?? []
  const includeRoleDefault = row?.includeRoleDefault ?? true
  const fromRole = includeRoleDefault ? await activeAddressesOf(db, info.defaultRole) : []
  return {
    kind,
    ...info,
    emails,
    includeRoleDefault,
    effective: [...new Set([...fromRole, ...emails])],
    updatedAt: row?.updatedAt.toISOString() ?? null,
  }
}

/**
 * The addresses a kind of mail goes to right now: the configured list, plus the
 * active users of the kind's default role unless that was switched off. Read inside
 * the transaction that queues the mail, so a person deactivated a moment earlier is
 * not on it.
 */
export async function recipientsFor(db: Database | Transaction, kind: MailRecipientKind): Promise<string[]> {
  const [row] = await db.select().from(mailRecipients).where(eq(mailRecipients.kind, kind))
  return (await settingOf(db, kind, row)).effective
}

export async function listRecipientSettings(): Promise<MailRecipientSetting[]> {
  const db = useDb()
  const rows = await db.select().from(mailRecipients)
  return await Promise.all(MAIL_RECIPIENT_KINDS.map((kind) => settingOf(db, kind, rows.find((row) => row.kind === kind))))
}

export async function updateRecipientSetting(kind: MailRecipientKind, change: MailRecipientsUpdate, actorId: number): Promise<MailRecipientSetting> {
  return await useDb().transaction(async (tx) => {
    const [before] = await tx.select().from(mailRecipients).where(eq(mailRecipients.kind, kind)).for('update')
    await tx
      .insert(mailRecipients)
      .values({ kind, emails: change.emails, includeRoleDefault: change.includeRoleDefault, updatedBy: actorId })
      .onDuplicateKeyUpdate({ set: { emails: change.emails, includeRoleDefault: change.includeRoleDefault, updatedBy: actorId, updatedAt: new Date() } })
    await recordAudit(tx, {
      actorId,
      action: 'mail_recipients.update',
      entityType: 'mail_recipients',
      entityId: kind,
      details: {
        emails: { from: before?.emails ?? [], to: change.emails },
        includeRoleDefault: { from: before?.includeRoleDefault ?? true, to: change.includeRoleDefault },
      },
    })
    const [after] = await tx.select().from(mailRecipients).where(eq(mailRecipients.kind, kind))
    return await settingOf(tx, kind, after)
  })
}
