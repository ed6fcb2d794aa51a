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

/** A week either way: further than that, the log is not this quench's. */
const MAX_QUENCH_OFFSET_S = 7 * 24 * 3600

/**
 * The form fields sent beside the file when a log is stored (POST /api/logs). A load's
 * log may say how it lines up with the load's quench tap (server/records/measuredTraces.ts):
 * the instant of its first row, or the log time of the quench; never both.
 */
export const logUploadFieldsSchema = z
  .object({
    mapping: jsonText.pipe(logMappingSchema),
    batchId: z.coerce.number({ message: 'load id must be a number' }).int('load id must be a whole number').positive('load id must be positive').optional(),
    startedAt: z.iso.datetime({ offset: true, message: 'give the first row\'s date and time (ISO 8601 with a time zone)' }).optional(),
    quenchAtLog_s: z.coerce
      .number({ message: 'the quench\'s time into the log must be a number of seconds' })
      .min(-MAX_QUENCH_OFFSET_S, 'the quench cannot be more than a week before the log starts')
      .max(MAX_QUENCH_OFFSET_S, 'the quench cannot be more than a week into the log')
      .optional(),
  })
  .superRefine((fields, ctx) => {
    if (fields.startedAt !== undefined && fields.quenchAtLog_s !== undefined)
      ctx.addIssue({ code: 'custom', path: ['quenchAtLog_s'], message: 'give the log\'s start time or the quench\'s time into the log, not both' })
    if ((fields.startedAt !== undefined || fields.quenchAtLog_s !== undefined) && fields.batchId === undefined)
      ctx.addIssue({ code: 'custom', path: ['batchId'], message: 'a log lines up with a load\'s quench: name the load' })
  })
export type LogUploadFields = z.output<typeof logUploadFieldsSchema>
