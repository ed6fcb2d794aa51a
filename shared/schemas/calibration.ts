import { z } from 'zod'
import { PROBE_PRESET_IDS } from '../probes'

const temperature = (label: string) => z.number({ message: `${label} must be a number of °C` }).min(-50, `${label} must be −50 °C or above`).max(1300, `${label} must be 1300 °C or below`)

const seconds = (label: string) => z.number({ message: `${label} must be a number of seconds` }).finite().min(0, `${label} cannot be before the log's first row`)

/** Where the thermocouple sits in a plan's part: at the centre, at the surface, or a depth below the surface. */
export const thermocoupleSchema = z.union(
  [z.enum(['centre', 'surface']), z.strictObject({ depth_m: z.number({ message: 'Depth must be a number (m)' }).finite().min(0, 'Depth cannot be negative') })],
  { message: 'Thermocouple must be centre, surface or { depth_m }' },
)

/** A saved plan's part (its latest revision unless one is named) as the probe. */
export const planProbeSchema = z.strictObject({
  planId: z.number({ message: 'Choose a plan' }).int().positive('Choose a plan'),
  revision: z.number({ message: 'Revision must be a number' }).int().positive('Revision must be positive').optional(),
  thermocouple: thermocoupleSchema,
})
export type PlanProbe = z.output<typeof planProbeSchema>

/** A calibration asked for on the calibration page (POST /api/calibrations/fit). */
export const calibrationRequestSchema = z.strictObject({
  logId: z.number({ message: 'Choose a log' }).int().positive('Choose a log'),
  channel: z.string({ message: 'Choose a channel' }).min(1, 'Choose a channel'),
  probe: z.union([z.enum(PROBE_PRESET_IDS), planProbeSchema], { message: `Probe must be one of ${PROBE_PRESET_IDS.join(', ')} or a plan's part` }),
  bath_C: temperature('Bath temperature'),
  /** The body's uniform temperature at the window's start; the first logged value in the window when left out. */
  initial_C: temperature('Start temperature').optional(),
  /** The part of the log to fit, seconds from its first row; the whole log when left out. */
  window: z
    .strictObject({ from_s: seconds('From'), to_s: seconds('To') })
    .refine((w) => w.to_s > w.from_s, { path: ['to_s'], message: 'To must be after From' })
    .optional(),
  model: z.discriminatedUnion(
    'kind',
    [
      z.strictObject({ kind: z.literal('constant') }),
      z.strictObject({
        kind: z.literal('curve'),
        knots_C: z.array(temperature('A knot'), { message: 'Knots must be a list of temperatures' }).min(3, 'A curve needs at least three knots').max(12, 'At most 12 knots'),
      }),
    ],
    { message: 'Model must be constant or curve' },
  ),
})
export type CalibrationRequest = z.output<typeof calibrationRequestSchema>

/**
 * "Save as the medium's curve" (POST /api/calibrations): the same request again, so
 * the server fits it itself and never takes a curve from the browser, and the medium.
 */
export const calibrationSaveSchema = calibrationRequestSchema.extend({
  quenchantId: z.number({ message: 'Choose a quench medium' }).int().positive('Choose a quench medium'),
  /** The person has read that some knots are not determined by the log and saves them anyway. */
  acceptUndeterminedKnots: z.boolean({ message: 'Must be true or false' }).default(false),
})
export type CalibrationSave = z.output<typeof calibrationSaveSchema>
