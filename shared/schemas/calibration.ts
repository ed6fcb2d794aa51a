import { z } from 'zod'
import { PROBE_PRESET_IDS } from '../probes'

const temperature = (label: string) => z.number({ message: `${label} must be a number of °C` }).min(-50, `${label} must be −50 °C or above`).max(1300, `${label} must be 1300 °C or below`)

/** A calibration asked for on the calibration page (POST /api/calibrations/fit). */
export const calibrationRequestSchema = z.strictObject({
  logId: z.number({ message: 'Choose a log' }).int().positive('Choose a log'),
  channel: z.string({ message: 'Choose a channel' }).min(1, 'Choose a channel'),
  probe: z.enum(PROBE_PRESET_IDS, { message: `Probe must be one of ${PROBE_PRESET_IDS.join(', ')}` }),
  bath_C: temperature('Bath temperature'),
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
