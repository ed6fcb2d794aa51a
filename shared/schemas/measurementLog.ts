import { z } from 'zod'

const UNITS = ['C', 'F'] as const

/** The person's confirmed reading of a log file (shared/types/measurementLog.ts LogMapping). */
export const logMappingSchema = z
  .strictObject({
    time: z.string({ message: 'name the time column' }).min(1, 'name the time column'),
    channels: z
      .array(
        z.strictObject({
          column: z.string({ message: 'name the temperature column' }).min(1, 'name the temperature column'),
          unit: z.enum(UNITS, { message: 'unit must be C or F' }),
        }),
        { message: 'map at least one temperature column' },
      )
      .min(1, 'map at least one temperature column')
      .max(32, 'at most 32 temperature columns'),
  })
  .superRefine((mapping, ctx) => {
    mapping.channels.forEach((channel, i) => {
      if (mapping.channels.findIndex((other) => other.column === channel.column) !== i)
        ctx.addIssue({ code: 'custom', path: ['channels', i, 'column'], message: `"${channel.column}" is mapped twice` })
    })
  })

/** A form field holding JSON text, parsed before its own schema checks it. */
const jsonText = z.string({ message: 'required' }).transform((text, ctx) => {
  try {
    return JSON.parse(text) as unknown
  } catch {
    ctx.addIssue({ code: 'custom', message: 'is not JSON' })
    return z.NEVER
  }
})

/** The form fields sent beside the file when a log is stored (POST /api/logs). */
export const logUploadFieldsSchema = z.object({
  mapping: jsonText.pipe(logMappingSchema),
  batchId: z.coerce.number({ message: 'load id must be a number' }).int('load id must be a whole number').positive('load id must be positive').optional(),
})
export type LogUploadFields = z.output<typeof logUploadFieldsSchema>
