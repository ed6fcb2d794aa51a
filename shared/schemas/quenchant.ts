import { z } from 'zod'
import { PHYSICAL, inRange } from '../physicalBounds'

export const QUENCHANT_KIND_VALUES = ['oil', 'water', 'polymer', 'salt', 'forced-air', 'still-air', 'gas'] as const
export type QuenchantKind = (typeof QUENCHANT_KIND_VALUES)[number]

const coefficient = (label: string) => inRange(PHYSICAL.heatTransfer_W_m2K, label)

// Field rules without defaults, so a partial update can tell "not sent" from "cleared".
const quenchantFields = {
  name: z.string({ message: 'Name is required' }).trim().min(2, 'Name needs at least 2 characters').max(120, 'Name is too long'),
  kind: z.enum(QUENCHANT_KIND_VALUES, { message: `Kind must be one of: ${QUENCHANT_KIND_VALUES.join(', ')}` }),
  hTypical_W_m2K: coefficient('Typical coefficient'),
  hLow_W_m2K: coefficient('Low coefficient'),
  hHigh_W_m2K: coefficient('High coefficient'),
  bath_C: z
    .number({ message: 'Bath temperature must be a number (°C)' })
    .finite()
    .min(-50, 'Bath temperature below −50 °C is not supported')
    .max(700, 'Bath temperature above 700 °C is not supported'),
  notes: z.string({ message: 'Notes must be text' }).trim().max(2000, 'Notes are too long').nullable(),
  source: z.string({ message: 'Say where the values come from' }).trim().min(3, 'Say where the values come from').max(1000, 'Source is too long'),
}

type CoefficientSpread = Pick<z.output<z.ZodObject<typeof quenchantFields>>, 'hLow_W_m2K' | 'hTypical_W_m2K' | 'hHigh_W_m2K'>

/** low ≤ typical ≤ high, each issue on the field that breaks the order. */
export function checkCoefficientOrder(q: CoefficientSpread, ctx: z.RefinementCtx): void {
  if (q.hLow_W_m2K > q.hTypical_W_m2K) ctx.addIssue({ code: 'custom', path: ['hLow_W_m2K'], message: 'The low coefficient cannot exceed the typical one' })
  if (q.hHigh_W_m2K < q.hTypical_W_m2K) ctx.addIssue({ code: 'custom', path: ['hHigh_W_m2K'], message: 'The high coefficient cannot be below the typical one' })
}

/** A quench medium with its calibrated heat-transfer coefficient and spread (SI, °C). */
export const quenchantInputSchema = z
  .strictObject({ ...quenchantFields, notes: quenchantFields.notes.default(null) })
  .superRefine(checkCoefficientOrder)
export type QuenchantInput = z.input<typeof quenchantInputSchema>
/** The values as stored, defaults applied. */
export type QuenchantValues = z.output<typeof quenchantInputSchema>
export type Quenchant = QuenchantValues & { id: number; createdAt: string; updatedAt: string }

/**
 * An edit: only the fields sent change; at least one must be sent. The order of the
 * coefficients is checked again on the merged record, since a patch may send only one.
 */
export const quenchantPatchSchema = z
  .strictObject(quenchantFields)
  .partial()
  .refine((patch) => Object.keys(patch).length > 0, 'Send at least one field to change')
export type QuenchantPatch = z.output<typeof quenchantPatchSchema>
