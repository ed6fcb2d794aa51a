import { z } from 'zod'

export const RecordParams = z.object({ id: z.coerce.number({ message: 'Record id must be a number' }).int().positive('Record id must be positive') })
