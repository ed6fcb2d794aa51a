import { z } from 'zod'
import { QUENCHANT_KIND_VALUES } from './quenchant'
import { BATCH_STATES } from '../schedule'

export const FURNACE_KINDS = ['box', 'pit', 'car-bottom', 'vacuum', 'belt', 'salt-bath'] as const
export type FurnaceKind = (typeof FURNACE_KINDS)[number]

const name = z.string({ message: 'Name is required' }).trim().min(2, 'Name needs at least 2 characters').max(80, 'Name is too long')
const positive = (label: string, unit: string, max: number) =>
  z
    .number({ message: `${label} must be a number (${unit})` })
    .finite()
    .positive(`${label} must be greater than zero (${unit})`)
    .max(max, `${label} above ${max} ${unit} is not supported`)

export const furnaceInputSchema = z.strictObject({
  name,
  kind: z.enum(FURNACE_KINDS, { message: `Kind must be one of: ${FURNACE_KINDS.join(', ')}` }),
  maxTemp_C: positive('Maximum temperature', '°C', 1600),
  capacity_kg: positive('Load capacity', 'kg', 100000),
  /** Usable work zone, width × depth × height in millimetres. */
  zoneWidth_mm: positive('Work-zone width', 'mm', 20000),
  zoneDepth_mm: positive('Work-zone depth', 'mm', 20000),
  zoneHeight_mm: positive('Work-zone height', 'mm', 20000),
  stationIds: z.array(z.number().int().positive(), { message: 'Quench stations must be a list of ids' }).max(20).default([]),
  active: z.boolean().default(true),
})
export type FurnaceInput = z.input<typeof furnaceInputSchema>
export const furnaceUpdateSchema = furnaceInputSchema.partial()

export const stationInputSchema = z.strictObject({
  name,
  kind: z.enum(QUENCHANT_KIND_VALUES, { message: `Kind must be one of: ${QUENCHANT_KIND_VALUES.join(', ')}` }),
  /** Highest bath temperature the station is rated for. */
  maxTemp_C: positive('Maximum temperature', '°C', 1000),
  capacity_kg: positive('Load capacity', 'kg', 100000),
  active: z.boolean().default(true),
})
export type StationInput = z.input<typeof stationInputSchema>
export const stationUpdateSchema = stationInputSchema.partial()

const isoTime = z.iso.datetime({ offset: true, message: 'Give a date and time (ISO 8601 with a time zone)' })

export const bookingInputSchema = z.strictObject({
  planRevisionId: z.number({ message: 'Choose a plan revision' }).int().positive('Choose a plan revision'),
  furnaceId: z.number({ message: 'Choose a furnace' }).int().positive('Choose a furnace'),
  stationId: z.number({ message: 'Choose a quench station' }).int().positive('Choose a quench station'),
  plannedCharge: isoTime,
  partCount: z.number({ message: 'Part count must be a whole number' }).int('Part count must be a whole number').positive('At least one part').max(100000),
  mass_kg: positive('Load mass', 'kg', 100000),
  reference: z.string({ message: 'Give the customer or work-order reference' }).trim().min(1, 'Give the customer or work-order reference').max(120, 'Reference is too long'),
})
export type BookingInput = z.input<typeof bookingInputSchema>

/** A booked load moved to another time, furnace or station; plan, parts and mass stay. */
export const bookingMoveSchema = bookingInputSchema.pick({ furnaceId: true, stationId: true, plannedCharge: true })
export type BookingMove = z.input<typeof bookingMoveSchema>

export const moveInputSchema = z.strictObject({
  to: z.enum(BATCH_STATES, { message: `State must be one of: ${BATCH_STATES.join(', ')}` }),
  /** The operator's second confirmation of a tap that comes before the plan says it should. */
  acknowledgeShortfall: z.boolean({ message: 'acknowledgeShortfall must be true or false' }).optional(),
})
export type MoveInput = z.infer<typeof moveInputSchema>

/** A corrected time for a recorded floor event, with the reason (kept beside the original). */
export const correctionInputSchema = z.strictObject({
  at: isoTime,
  reason: z.string({ message: 'Give the reason for the correction' }).trim().min(5, 'Give the reason for the correction (at least 5 characters)').max(500, 'Reason is too long (500 characters at most)'),
})
export type CorrectionInput = z.infer<typeof correctionInputSchema>

export const batchQuerySchema = z.object({
  from: isoTime,
  to: isoTime,
  furnaceId: z.coerce.number().int().positive().optional(),
})

export const settingsUpdateSchema = z.strictObject({
  transfer_s: positive('Transfer time', 's', 3600).optional(),
  defaultFurnace_s: positive('Default furnace time', 's', 7 * 24 * 3600).optional(),
  quenchDelayAllowance_s: positive('Quench delay allowance', 's', 24 * 3600).optional(),
  temperWithin_s: positive('Temper-within time', 's', 7 * 24 * 3600).optional(),
  correctionWindow_s: positive('Correction window', 's', 24 * 3600).optional(),
  safeHandlingTowardSlowEnd_pct: z
    .number({ message: 'Safe-to-handle position must be a number (%)' })
    .finite()
    .min(0, 'Safe-to-handle position cannot be below 0 % (the headline estimate)')
    .max(100, 'Safe-to-handle position cannot be above 100 % (the slow end of the quench band)')
    .optional(),
})
