import { z } from 'zod'
import { CASE_LIMITS, PHYSICAL, inRange } from '../physicalBounds'
import { gradedProfileSchema, propertyTableSchema } from './material'
import { QUENCHANT_KIND_VALUES, coolingCurvesSchema } from './quenchant'

/**
 * The cooldown plan as the metallurgist enters it (SI: metres, seconds, °C), shared by
 * the editor form and the API. Every message names what is wrong in shop words; the
 * API returns the zod path as the field ("stages.1.duration_s").
 */

const length = (label: string) => inRange(PHYSICAL.partSize_m, label)

const temperature = (label: string, min = -50, max = 1400) =>
  z
    .number({ message: `${label} must be a number (°C)` })
    .finite()
    .min(min, `${label} below ${min} °C is not supported`)
    .max(max, `${label} above ${max} °C is not supported`)

const duration = (label: string) => inRange(PHYSICAL.stageDuration_s, label)

export const PART_SHAPES = ['plate', 'round-bar', 'sphere', 'cylinder', 'block'] as const
export type PartShape = (typeof PART_SHAPES)[number]

export const PART_SHAPE_LABELS: Record<PartShape, string> = {
  'plate': 'Plate',
  'round-bar': 'Round bar',
  'sphere': 'Sphere',
  'cylinder': 'Short cylinder',
  'block': 'Rectangular block',
}

/** Plates, bars and spheres are one-dimensional; short cylinders and blocks use product solutions. */
export const PRODUCT_SHAPES: readonly PartShape[] = ['cylinder', 'block']

export const partSchema = z.discriminatedUnion(
  'shape',
  [
    z.strictObject({ shape: z.literal('plate'), thickness_m: length('Thickness') }),
    z.strictObject({ shape: z.literal('round-bar'), diameter_m: length('Diameter') }),
    z.strictObject({ shape: z.literal('sphere'), diameter_m: length('Diameter') }),
    z.strictObject({ shape: z.literal('cylinder'), diameter_m: length('Diameter'), length_m: length('Length') }),
    z.strictObject({ shape: z.literal('block'), sides_m: z.tuple([length('Side 1'), length('Side 2'), length('Side 3')]) }),
  ],
  { message: `Shape must be one of: ${PART_SHAPES.join(', ')}` },
)
export type Part = z.output<typeof partSchema>

export const COEFFICIENT_CHOICES = ['low', 'typical', 'high'] as const
export type CoefficientChoice = (typeof COEFFICIENT_CHOICES)[number]

export const planStageSchema = z.strictObject({
  quenchantId: z.number({ message: 'Choose a quenchant' }).int().positive('Choose a quenchant'),
  /** Every stage but the last; the last runs until the handling temperature is reached. */
  duration_s: duration('Stage duration').optional(),
  coefficient: z.enum(COEFFICIENT_CHOICES, { message: 'Coefficient must be low, typical or high' }).default('typical'),
})

export const HANDLING_POINTS = ['centre', 'surface', 'mean'] as const

/**
 * 'tables': the library's property table and cooling curves where they exist (the
 * default); 'constant': one k, ρ, cₚ and one h per medium, for a plan the sub-step
 * engine cannot finish yet or a comparison with an older estimate.
 */
export const QUENCH_PHYSICS = ['tables', 'constant'] as const
export type QuenchPhysics = (typeof QUENCH_PHYSICS)[number]

/** Still air and furnace radiation defaults live in server/planning/furnace.ts; furnaceH_W_m2K overrides them. */
export const soakSchema = z.strictObject({
  furnace_C: temperature('Furnace temperature', 100, 1300),
  tolerance_K: z.number({ message: 'Tolerance must be a number (K)' }).finite().positive('Tolerance must be greater than zero').max(100, 'Tolerance above 100 K is not a soak'),
  minimumSoak_s: z.number({ message: 'Minimum soak must be a number (s)' }).finite().min(0, 'Minimum soak cannot be negative').max(7 * 86400, 'Minimum soak above 7 days is not plausible'),
  charge_C: temperature('Charge temperature', -50, 1200).default(20),
  furnaceH_W_m2K: z
    .number({ message: 'Furnace coefficient must be a number (W/m²·K)' })
    .finite()
    .min(PHYSICAL.heatTransfer_W_m2K.min, `Furnace coefficient must be at least ${PHYSICAL.heatTransfer_W_m2K.minText}`)
    .max(2000, 'Furnace coefficient above 2000 W/m²·K is not a furnace')
    .nullable()
    .default(null),
})

const planSpecShape = {
  name: z.string({ message: 'Name is required' }).trim().min(2, 'Name needs at least 2 characters').max(160, 'Name is too long'),
  part: partSchema,
  materialId: z.number({ message: 'Choose a material' }).int().positive('Choose a material'),
  start_C: temperature('Start temperature', 20, 1300),
  stages: z.array(planStageSchema, { message: 'Add at least one quench stage' }).min(1, 'Add at least one quench stage').max(CASE_LIMITS.stages, `At most ${CASE_LIMITS.stages} stages`),
  handling: z.strictObject({
    below_C: temperature('Handling temperature', -50, 1000),
    at: z.enum(HANDLING_POINTS, { message: 'Handling point must be centre, surface or mean' }).default('centre'),
  }),
  physics: z.enum(QUENCH_PHYSICS, { message: 'Physics must be tables or constant' }).default('tables'),
  soak: soakSchema.nullable().default(null),
  quenchDelayAllowance_s: z.number({ message: 'Quench delay allowance must be a number (s)' }).finite().min(0, 'Quench delay allowance cannot be negative').max(3600, 'Quench delay allowance above an hour is not a quench').nullable().default(null),
}

type SpecLike = {
  start_C: number
  stages: { duration_s?: number }[]
  handling: { below_C: number }
  soak: { furnace_C: number; charge_C: number; tolerance_K: number } | null
}

function crossFieldIssues(spec: SpecLike, ctx: z.RefinementCtx): void {
  spec.stages.forEach((stage, i) => {
    const last = i === spec.stages.length - 1
    if (!last && stage.duration_s === undefined) ctx.addIssue({ code: 'custom', path: ['stages', i, 'duration_s'], message: 'Every stage but the last needs a duration' })
    if (last && stage.duration_s !== undefined)
      ctx.addIssue({ code: 'custom', path: ['stages', i, 'duration_s'], message: 'The last stage runs until the handling temperature; leave its duration empty' })
  })
  if (spec.handling.below_C >= spec.start_C)
    ctx.addIssue({ code: 'custom', path: ['handling', 'below_C'], message: 'The handling temperature must be below the start temperature' })
  if (spec.soak && spec.soak.tolerance_K >= spec.soak.furnace_C - spec.soak.charge_C)
    ctx.addIssue({ code: 'custom', path: ['soak', 'tolerance_K'], message: 'The tolerance must be smaller than the rise from charge to furnace temperature' })
}

export const planSpecSchema = z.strictObject(planSpecShape).superRefine(crossFieldIssues)
export type PlanSpecInput = z.input<typeof planSpecSchema>
export type PlanSpec = z.output<typeof planSpecSchema>

/** An edit: the whole spec again (a revision never patches the previous one) and an optional note. */
export const planRevisionInputSchema = z
  .strictObject({ ...planSpecShape, note: z.string().trim().max(255, 'Note is too long').nullable().default(null) })
  .superRefine(crossFieldIssues)
export type PlanRevisionInput = z.output<typeof planRevisionInputSchema>

/**
 * Library values copied into a saved revision so it recomputes identically after the
 * library changes. The temperature table and the cooling curves are optional: a
 * revision saved before they were copied has none and keeps computing with the single
 * values it was saved with.
 */
export const materialSnapshotSchema = z.strictObject({
  id: z.number().int(),
  name: z.string(),
  k_W_mK: z.number().positive(),
  density_kg_m3: z.number().positive(),
  specificHeat_J_kgK: z.number().positive(),
  gradedProfile: gradedProfileSchema.nullable(),
  propertyTable: propertyTableSchema.nullable().optional(),
  propertyTableSource: z.string().nullable().optional(),
  source: z.string(),
})
export type MaterialSnapshot = z.output<typeof materialSnapshotSchema>

export const quenchantSnapshotSchema = z.strictObject({
  id: z.number().int(),
  name: z.string(),
  kind: z.enum(QUENCHANT_KIND_VALUES),
  hLow_W_m2K: z.number().positive(),
  hTypical_W_m2K: z.number().positive(),
  hHigh_W_m2K: z.number().positive(),
  bath_C: z.number(),
  coolingCurves: coolingCurvesSchema.nullable().optional(),
  emissivity: z.number().min(0).max(1).nullable().optional(),
  curveSource: z.string().nullable().optional(),
  source: z.string(),
})
export type QuenchantSnapshot = z.output<typeof quenchantSnapshotSchema>

/** What a revision stores in plan_revisions.spec: the spec plus the library values it was computed with. */
export const resolvedPlanSchema = z.strictObject({
  ...planSpecShape,
  library: z.strictObject({ material: materialSnapshotSchema, quenchants: z.array(quenchantSnapshotSchema) }),
})
export type ResolvedPlan = z.output<typeof resolvedPlanSchema>

/** The plan list's search and filters (GET /api/plans). */
export const planListQuerySchema = z.object({
  q: z.string().trim().max(80, 'Search is too long').optional(),
  shape: z.enum(PART_SHAPES, { message: `Shape must be one of: ${PART_SHAPES.join(', ')}` }).optional(),
  archived: z.enum(['true', 'false'], { message: 'Archived must be true or false' }).default('false').transform((value) => value === 'true'),
})

export const planArchiveSchema = z.strictObject({
  archived: z.boolean({ message: 'Archived must be true or false' }),
})
