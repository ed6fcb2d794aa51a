import { z } from 'zod'
import { CASE_LIMITS, PHYSICAL, inRange, profileLimitIssues } from '../physicalBounds'

/** One point of a graded section: x is the fraction 0 (centre) – 1 (surface); a repeated x is a jump. */
export const gradedPointSchema = z.strictObject({
  x: z.number({ message: 'x must be a number from 0 to 1' }).min(0, 'x must be at least 0').max(1, 'x must be at most 1'),
  k: inRange(PHYSICAL.conductivity_W_mK, 'Conductivity'),
  rhoCp: inRange(PHYSICAL.volumetricHeatCapacity_J_m3K, 'Volumetric heat capacity'),
})

export const gradedProfileSchema = z
  .array(gradedPointSchema)
  .min(2, 'A graded profile needs at least two points')
  .max(CASE_LIMITS.profilePoints, `A graded profile has at most ${CASE_LIMITS.profilePoints} points`)
  .superRefine((points, ctx) => {
    if (points[0]?.x !== 0 || points.at(-1)?.x !== 1) {
      ctx.addIssue({ code: 'custom', message: 'A graded profile must run from x = 0 (centre) to x = 1 (surface)' })
    }
    points.forEach((point, i) => {
      if (i > 0 && point.x < points[i - 1]!.x) ctx.addIssue({ code: 'custom', path: [i, 'x'], message: 'x must not decrease' })
      if (i > 1 && point.x === points[i - 1]!.x && point.x === points[i - 2]!.x)
        ctx.addIssue({ code: 'custom', path: [i, 'x'], message: 'An x may appear at most twice (a jump)' })
    })
    for (const issue of profileLimitIssues(points)) {
      const label = issue.key === 'k' ? 'Conductivity' : 'x'
      ctx.addIssue({ code: 'custom', path: [issue.index, issue.key], message: `${label} ${issue.message}` })
    }
  })

/** One row of a property table: k and c_p at T; ρ may be left out (the room-temperature density is used). */
export const propertyRowSchema = z.strictObject({
  T_C: inRange(PHYSICAL.temperature_C, 'T'),
  k: inRange(PHYSICAL.conductivity_W_mK, 'Conductivity'),
  cp: inRange(PHYSICAL.specificHeat_J_kgK, 'Specific heat'),
  rho: inRange(PHYSICAL.density_kg_m3, 'Density').optional(),
})
export type PropertyRow = z.output<typeof propertyRowSchema>

/** Properties against temperature: linear between rows, constant beyond the ends (the engine reads it the same way). */
export const propertyTableSchema = z
  .array(propertyRowSchema, { message: 'A property table is a list of rows' })
  .min(2, 'A property table needs at least two rows')
  .max(60, 'A property table has at most 60 rows')
  .superRefine((rows, ctx) => {
    rows.forEach((row, i) => {
      if (i > 0 && !(row.T_C > rows[i - 1]!.T_C)) ctx.addIssue({ code: 'custom', path: [i, 'T_C'], message: 'Temperatures must rise strictly from row to row' })
    })
  })

// Field rules without defaults, so a partial update can tell "not sent" from "cleared".
const materialFields = {
  name: z.string({ message: 'Name is required' }).trim().min(2, 'Name needs at least 2 characters').max(120, 'Name is too long'),
  k_W_mK: inRange(PHYSICAL.conductivity_W_mK, 'Thermal conductivity'),
  density_kg_m3: inRange(PHYSICAL.density_kg_m3, 'Density'),
  specificHeat_J_kgK: inRange(PHYSICAL.specificHeat_J_kgK, 'Specific heat'),
  propertiesAt_C: z
    .number({ message: 'Reference temperature must be a number (°C)' })
    .finite()
    .min(-273.15, 'Reference temperature cannot be below absolute zero')
    .max(1600, 'Reference temperature above 1600 °C is beyond any steel')
    .nullable(),
  gradedProfile: gradedProfileSchema.nullable(),
  propertyTable: propertyTableSchema.nullable(),
  propertyTableSource: z.string({ message: 'Say where the table comes from' }).trim().min(3, 'Say where the table comes from').max(1000, 'Table source is too long').nullable(),
  notes: z.string({ message: 'Notes must be text' }).trim().max(2000, 'Notes are too long').nullable(),
  source: z.string({ message: 'Say where the values come from' }).trim().min(3, 'Say where the values come from').max(1000, 'Source is too long'),
}

type TableFields = { gradedProfile: unknown; propertyTable: unknown; propertyTableSource: string | null }

/** A table needs its source, and a graded section and a temperature table do not combine. */
export function checkPropertyTable(m: TableFields, ctx: z.RefinementCtx): void {
  if (m.propertyTable && !m.propertyTableSource) ctx.addIssue({ code: 'custom', path: ['propertyTableSource'], message: 'Say where the table comes from' })
  if (m.propertyTable && m.gradedProfile)
    ctx.addIssue({ code: 'custom', path: ['propertyTable'], message: 'A graded material cannot also carry a temperature table; use one or the other' })
}

/** A material as the library stores it (SI). */
export const materialInputSchema = z
  .strictObject({
    ...materialFields,
    propertiesAt_C: materialFields.propertiesAt_C.default(null),
    gradedProfile: materialFields.gradedProfile.default(null),
    propertyTable: materialFields.propertyTable.default(null),
    propertyTableSource: materialFields.propertyTableSource.default(null),
    notes: materialFields.notes.default(null),
  })
  .superRefine(checkPropertyTable)
export type MaterialInput = z.input<typeof materialInputSchema>
/** The values as stored, defaults applied. */
export type MaterialValues = z.output<typeof materialInputSchema>
export type Material = MaterialValues & { id: number; createdAt: string; updatedAt: string }

/** An edit: only the fields sent change; at least one must be sent. */
export const materialPatchSchema = z
  .strictObject(materialFields)
  .partial()
  .refine((patch) => Object.keys(patch).length > 0, 'Send at least one field to change')
export type MaterialPatch = z.output<typeof materialPatchSchema>
