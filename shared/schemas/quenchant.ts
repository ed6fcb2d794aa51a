import { z } from 'zod'
import { interpolate } from '../interpolate'
import { PHYSICAL, inRange } from '../physicalBounds'

export const QUENCHANT_KIND_VALUES = ['oil', 'water', 'polymer', 'salt', 'forced-air', 'still-air', 'gas'] as const
export type QuenchantKind = (typeof QUENCHANT_KIND_VALUES)[number]

const coefficient = (label: string) => inRange(PHYSICAL.heatTransfer_W_m2K, label)

/** Media whose cooling includes radiation to the surroundings: only these carry an emissivity. */
export const RADIATING_KINDS: readonly QuenchantKind[] = ['still-air', 'forced-air', 'gas']

/** One point of a cooling-power curve: h at a surface temperature. */
export const curvePointSchema = z.strictObject({
  T_C: z.number({ message: 'Surface temperature must be a number (°C)' }).finite().min(-50, 'Surface temperature below −50 °C is not supported').max(1400, 'Surface temperature above 1400 °C is not supported'),
  h: coefficient('Coefficient'),
})
export type CurvePoint = z.output<typeof curvePointSchema>

/** h against surface temperature: linear between points, constant beyond the ends. */
export const coolingCurveSchema = z
  .array(curvePointSchema, { message: 'A cooling curve is a list of points' })
  .min(3, 'A cooling curve needs at least three points')
  .max(60, 'A cooling curve has at most 60 points')
  .superRefine((points, ctx) => {
    points.forEach((point, i) => {
      if (i > 0 && !(point.T_C > points[i - 1]!.T_C)) ctx.addIssue({ code: 'custom', path: [i, 'T_C'], message: 'Surface temperatures must rise strictly from point to point' })
    })
  })

/** The band kept as curves: the slow (low), typical and fast (high) cooling power. */
export const coolingCurvesSchema = z.strictObject({ low: coolingCurveSchema, typical: coolingCurveSchema, high: coolingCurveSchema })
export type CoolingCurves = z.output<typeof coolingCurvesSchema>

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
  coolingCurves: coolingCurvesSchema.nullable(),
  emissivity: z.number({ message: 'Emissivity must be a number from 0 to 1' }).finite().min(0, 'Emissivity cannot be below 0').max(1, 'Emissivity cannot be above 1').nullable(),
  curveSource: z.string({ message: 'Say where the curves come from' }).trim().min(3, 'Say where the curves come from').max(1000, 'Curve source is too long').nullable(),
  notes: z.string({ message: 'Notes must be text' }).trim().max(2000, 'Notes are too long').nullable(),
  source: z.string({ message: 'Say where the values come from' }).trim().min(3, 'Say where the values come from').max(1000, 'Source is too long'),
}

type CoefficientSpread = Pick<z.output<z.ZodObject<typeof quenchantFields>>, 'hLow_W_m2K' | 'hTypical_W_m2K' | 'hHigh_W_m2K'>

type CurveFields = Pick<z.output<z.ZodObject<typeof quenchantFields>>, 'kind' | 'coolingCurves' | 'emissivity' | 'curveSource'>

/** low ≤ typical ≤ high, each issue on the field that breaks the order. */
export function checkCoefficientOrder(q: CoefficientSpread, ctx: z.RefinementCtx): void {
  if (q.hLow_W_m2K > q.hTypical_W_m2K) ctx.addIssue({ code: 'custom', path: ['hLow_W_m2K'], message: 'The low coefficient cannot exceed the typical one' })
  if (q.hHigh_W_m2K < q.hTypical_W_m2K) ctx.addIssue({ code: 'custom', path: ['hHigh_W_m2K'], message: 'The high coefficient cannot be below the typical one' })
}

/**
 * Curves need their source and keep the band's order at every point of each curve
 * (compared by interpolation); emissivity belongs to air and gas, where radiation counts.
 */
export function checkCurves(q: CurveFields, ctx: z.RefinementCtx): void {
  const curves = q.coolingCurves
  if (curves) {
    if (!q.curveSource) ctx.addIssue({ code: 'custom', path: ['curveSource'], message: 'Say where the curves come from' })
    const temperatures = [...new Set([...curves.low, ...curves.typical, ...curves.high].map((p) => p.T_C))]
    const at = (curve: CurvePoint[], T: number) => interpolate(curve.map((p) => p.T_C), curve.map((p) => p.h), T)
    const lowAbove = temperatures.find((T) => at(curves.low, T) > at(curves.typical, T) * (1 + 1e-9))
    if (lowAbove !== undefined) ctx.addIssue({ code: 'custom', path: ['coolingCurves', 'low'], message: `The low curve cannot exceed the typical one (at ${lowAbove} °C)` })
    const highBelow = temperatures.find((T) => at(curves.high, T) < at(curves.typical, T) * (1 - 1e-9))
    if (highBelow !== undefined) ctx.addIssue({ code: 'custom', path: ['coolingCurves', 'high'], message: `The high curve cannot be below the typical one (at ${highBelow} °C)` })
  }
  if (q.emissivity === null) return
  if (!RADIATING_KINDS.includes(q.kind))
    ctx.addIssue({ code: 'custom', path: ['emissivity'], message: 'Emissivity applies to air and gas media only; a liquid’s curve already includes its radiation' })
  // The single coefficients are means with radiation already in them; only a convection curve takes it on top.
  else if (!curves) ctx.addIssue({ code: 'custom', path: ['emissivity'], message: 'Emissivity adds radiation to the cooling curves; give the curves with it' })
}

/** A quench medium with its calibrated heat-transfer coefficient and spread (SI, °C). */
export const quenchantInputSchema = z
  .strictObject({
    ...quenchantFields,
    coolingCurves: quenchantFields.coolingCurves.default(null),
    emissivity: quenchantFields.emissivity.default(null),
    curveSource: quenchantFields.curveSource.default(null),
    notes: quenchantFields.notes.default(null),
  })
  .superRefine(checkCoefficientOrder)
  .superRefine(checkCurves)
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
