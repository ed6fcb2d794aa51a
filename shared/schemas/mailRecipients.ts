import { z } from 'zod'
import type { Role } from '../roles'

/** The kinds of record mail the shop routes to people. */
export const MAIL_RECIPIENT_KINDS = ['released_sheet', 'rejection', 'daily_digest'] as const
export type MailRecipientKind = (typeof MAIL_RECIPIENT_KINDS)[number]

export const MAIL_RECIPIENT_KIND_INFO: Record<MailRecipientKind, { label: string; description: string; defaultRole: Role }> = {
  released_sheet: {
    label: 'Released-load hold-time sheets',
    description: 'The hold-time sheet (PDF and curve CSV) of every load released to handling.',
    defaultRole: 'qa',
  },
  rejection: {
    label: 'Rejected records',
    description: 'A cooldown record QA did not sign off, with the reason.',
    defaultRole: 'metallurgist',
  },
  daily_digest: {
    label: 'Daily digest',
    description: 'One message a day listing the cooldown records that have waited more than a day for QA sign-off.',
    defaultRole: 'qa',
  },
}

export const mailRecipientKindSchema = z.enum(MAIL_RECIPIENT_KINDS, { message: `Kind must be one of ${MAIL_RECIPIENT_KINDS.join(', ')}` })

const address = z.string({ message: 'An e-mail address is required' }).trim().toLowerCase().pipe(z.email({ message: 'Enter a valid e-mail address' })).pipe(z.string().max(190, 'E-mail is too long'))

export const mailRecipientsUpdateSchema = z.strictObject({
  emails: z
    .array(address, { message: 'Send a list of e-mail addresses' })
    .max(50, 'At most 50 addresses')
    // A duplicate would mean one person gets every sheet twice.
    .transform((list) => [...new Set(list)]),
  includeRoleDefault: z.boolean({ message: 'Yes or no: also send to the active users of the default role' }),
})
export type MailRecipientsUpdate = z.infer<typeof mailRecipientsUpdateSchema>

/** One kind's setting with the addresses it resolves to right now. */
export interface MailRecipientSetting {
  kind: MailRecipientKind
  label: string
  description: string
  defaultRole: Role
  emails: string[]
  includeRoleDefault: boolean
  effective: string[]
  updatedAt: string | null
}
