import { z } from 'zod'
import { RECORD_STATES } from '../types/cooldownRecord'

const instant = (label: string) => z.iso.datetime({ offset: true, message: `${label} must be an ISO 8601 date-time` })

/** Filters and order of the records list (GET /api/records), shared with the records page. */
export const recordListQuerySchema = z.object({
  state: z.enum(RECORD_STATES, { message: `State must be one of ${RECORD_STATES.join(', ')}` }).optional(),
  furnaceId: z.coerce.number({ message: 'Furnace id must be a number' }).int().positive().optional(),
  from: instant('From').optional(),
  to: instant('To').optional(),
  deviation: z.enum(['yes', 'no'], { message: 'Deviation must be yes or no' }).optional(),
  sort: z.enum(['releasedAt', 'loadNumber', 'furnace', 'deviations', 'state'], { message: 'Sort by releasedAt, loadNumber, furnace, deviations or state' }).default('releasedAt'),
  dir: z.enum(['asc', 'desc'], { message: 'Direction must be asc or desc' }).default('desc'),
  limit: z.coerce.number().int().min(1).max(500).default(200),
})
export type RecordListQuery = z.output<typeof recordListQuerySchema>

export const approveInputSchema = z.strictObject({
  comment: z.string({ message: 'Comment must be text' }).trim().max(2000, 'Comment is too long').optional().transform((value) => value || null),
})

export const rejectInputSchema = z.strictObject({
  comment: z.string({ message: 'A rejection needs a comment saying why' }).trim().min(3, 'A rejection needs a comment saying why').max(2000, 'Comment is too long'),
})
