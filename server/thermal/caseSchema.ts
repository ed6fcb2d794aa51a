/**
 * The cooldown case format (CLI and web planner) and its translation into a
 * CooldownProblem. Every rejection names the offending field as a dotted path
 * ("stages.0.surface.h") through CaseError.
 */
import { z } from 'zod'
import { CASE_LIMITS, PHYSICAL, inRange, profileLimitIssues } from '../../shared/physicalBounds'
import { CaseError } from './errors'
import { interpolate } from './propertyTable'
import type { Boundary, ConvectiveBoundary, CooldownProblem, HeatTransferPoint, PropertyPoint, Stage, ThermalTableRow } from './types'

const finite = z.number().finite()
const temperature = inRange(PHYSICAL.temperature_C)
const fraction = finite.min(0).max(1)
const tablePoints = (what: string) => `at most ${CASE_LIMITS.profilePoints} ${what}`

/** A heat-transfer curve point: h (W/m²K) at a surface temperature T_C. */
const curvePoint = z.object({ T_C: temperature, h: inRange(PHYSICAL.heatTransfer_W_m2K) }).strict()

/**
 * { h or hCurve, ambient_C, emissivity? } or { fixed_C }, checked field by field so
 * errors name the field.
 */
const surfaceSchema = z
  .object({
    h: inRange(PHYSICAL.heatTransfer_W_m2K).optional(),
    hCurve: z.array(curvePoint).min(3, 'a heat-transfer curve needs at least three points').max(CASE_LIMITS.profilePoints, tablePoints('points')).optional(),
    emissivity: finite.min(0, 'must be between 0 and 1').max(1, 'must be between 0 and 1').optional(),
    ambient_C: temperature.optional(),
    fixed_C: temperature.optional(),
  })
  .strict()
  .superRefine((s, ctx) => {
    if (s.fixed_C !== undefined) {
      if (s.h !== undefined || s.ambient_C !== undefined || s.hCurve !== undefined || s.emissivity !== undefined)
        ctx.addIssue({ code: 'custom', path: ['fixed_C'], message: 'give either fixed_C or a convective surface (h or hCurve, ambient_C, emissivity), not both' })
      return
    }
    if (s.h !== undefined && s.hCurve !== undefined) ctx.addIssue({ code: 'custom', path: ['hCurve'], message: 'give either h or hCurve, not both' })
    if (s.h === undefined && s.hCurve === undefined) ctx.addIssue({ code: 'custom', path: ['h'], message: 'a convective surface needs h (W/m²K > 0) or hCurve' })
    if (s.hCurve) increasingIssues(s.hCurve, ['hCurve'], ctx)
    if (s.ambient_C === undefined) ctx.addIssue({ code: 'custom', path: ['ambient_C'], message: 'a convective surface needs ambient_C' })
  })

const profilePoint = z.object({ x: finite, k: inRange(PHYSICAL.conductivity_W_mK), rhoCp: inRange(PHYSICAL.volumetricHeatCapacity_J_m3K) }).strict()

/** A material table row; rho may be left out after the first row, which then carries the row above's. */
const tableRow = z
  .object({
    T_C: temperature,
    k: inRange(PHYSICAL.conductivity_W_mK),
    rho: inRange(PHYSICAL.density_kg_m3).optional(),
    cp: inRange(PHYSICAL.specificHeat_J_kgK),
  })
  .strict()

const materialSchema = z
  .object({
    k: inRange(PHYSICAL.conductivity_W_mK).optional(),
    rho: inRange(PHYSICAL.density_kg_m3).optional(),
    cp: inRange(PHYSICAL.specificHeat_J_kgK).optional(),
    profile: z.array(profilePoint).min(2).max(CASE_LIMITS.profilePoints, tablePoints('points')).optional(),
    table: z.array(tableRow).min(2, 'a material table needs at least two rows').max(CASE_LIMITS.profilePoints, tablePoints('rows')).optional(),
  })
  .strict()
  .superRefine((mat, ctx) => {
    const forms = [mat.profile, mat.table, mat.k ?? mat.rho ?? mat.cp].filter((f) => f !== undefined).length
    if (forms > 1) ctx.addIssue({ code: 'custom', path: [mat.table ? 'table' : 'profile'], message: 'give one of k, rho, cp or a profile or a table' })
    if (mat.profile) {
      tableIssues(mat.profile, ['profile'], ctx)
      for (const issue of profileLimitIssues(mat.profile)) ctx.addIssue({ code: 'custom', path: ['profile', issue.index, issue.key], message: issue.message })
      return
    }
    if (mat.table) {
      increasingIssues(mat.table, ['table'], ctx)
      if (mat.table[0].rho === undefined) ctx.addIssue({ code: 'custom', path: ['table', 0, 'rho'], message: 'the first row needs rho (later rows carry it when left out)' })
      return
    }
    for (const key of ['k', 'rho', 'cp'] as const)
      if (mat[key] === undefined) ctx.addIssue({ code: 'custom', path: [key], message: `a uniform material needs ${key} (> 0)` })
  })

const stageSchema = z.object({ surface: surfaceSchema, duration_s: inRange(PHYSICAL.stageDuration_s).optional() }).strict()

const pointRef = z.union([z.enum(['centre', 'surface', 'mean']), z.object({ x: fraction }).strict()])

const targetSchema = z
  .object({ at: pointRef.default('centre'), below_C: temperature.optional(), above_C: temperature.optional() })
  .strict()
  .superRefine((t, ctx) => {
    if ((t.below_C === undefined) === (t.above_C === undefined))
      ctx.addIssue({ code: 'custom', path: ['below_C'], message: 'give exactly one of below_C (cooling) or above_C (heating)' })
  })

export const caseSchema = z
  .object({
    geometry: z.enum(['slab', 'rod', 'sphere']),
    size_m: inRange(PHYSICAL.engineSize_m),
    material: materialSchema,
    initial_C: temperature.optional(),
    initialProfile: z.array(z.object({ x: finite, T_C: temperature }).strict()).min(2).max(CASE_LIMITS.profilePoints, tablePoints('points')).optional(),
    centre: z.union([z.literal('symmetry'), surfaceSchema]).default('symmetry'),
    stages: z.array(stageSchema).min(1).max(CASE_LIMITS.stages, `at most ${CASE_LIMITS.stages} stages`),
    target: targetSchema.optional(),
    points: z.array(fraction).max(CASE_LIMITS.readingPoints, `at most ${CASE_LIMITS.readingPoints} points`).optional(),
    times_s: z.array(inRange(PHYSICAL.readingTime_s)).max(CASE_LIMITS.readingTimes, `at most ${CASE_LIMITS.readingTimes} times`).optional(),
    modes: z.number().int().min(1).max(400).optional(),
    check: z.literal('finite-difference').optional(),
  })
  .strict()
  .superRefine((c, ctx) => {
    if ((c.initial_C === undefined) === (c.initialProfile === undefined))
      ctx.addIssue({ code: 'custom', path: ['initial_C'], message: 'give exactly one of initial_C or initialProfile' })
    if (c.initialProfile) tableIssues(c.initialProfile, ['initialProfile'], ctx)
    if (c.centre !== 'symmetry' && c.geometry !== 'slab')
      ctx.addIssue({ code: 'custom', path: ['centre'], message: `a ${c.geometry} has a symmetric centre; only a slab can have a face at x = 0` })
    c.stages.forEach((s, i) => {
      if (s.duration_s === undefined && i < c.stages.length - 1)
        ctx.addIssue({ code: 'custom', path: ['stages', i, 'duration_s'], message: 'every stage but the last needs a duration' })
    })
    if (c.target) reachabilityIssue(c, ctx)
  })

export type CaseInput = z.input<typeof caseSchema>
export type Case = z.output<typeof caseSchema>

/** x must run from 0 to 1, never decrease, and repeat at most once (a jump). */
function tableIssues(points: { x: number }[], path: (string | number)[], ctx: z.RefinementCtx): void {
  const xs = points.map((p) => p.x)
  if (xs[0] !== 0 || xs[xs.length - 1] !== 1)
    ctx.addIssue({ code: 'custom', path, message: `must cover x = 0 to 1 (got ${xs[0]} to ${xs[xs.length - 1]})` })
  for (let i = 1; i < xs.length; i++) {
    if (xs[i] < xs[i - 1]) ctx.addIssue({ code: 'custom', path: [...path, i, 'x'], message: 'x must not decrease' })
    if (i >= 2 && xs[i] === xs[i - 1] && xs[i] === xs[i - 2])
      ctx.addIssue({ code: 'custom', path: [...path, i, 'x'], message: 'an x may appear at most twice (a jump)' })
  }
}

/** Temperatures of a table must strictly increase. */
function increasingIssues(rows: { T_C: number }[], path: (string | number)[], ctx: z.RefinementCtx): void {
  for (let i = 1; i < rows.length; i++)
    if (!(rows[i].T_C > rows[i - 1].T_C)) ctx.addIssue({ code: 'custom', path: [...path, i, 'T_C'], message: 'temperatures must strictly increase' })
}

/**
 * Maximum principle: temperatures stay between the lowest and highest of the
 * start temperatures and the surroundings, so a target outside that range can
 * never be met.
 */
function reachabilityIssue(c: Case, ctx: z.RefinementCtx): void {
  const t = c.target as NonNullable<Case['target']>
  const temps = [...(c.initialProfile?.map((p) => p.T_C) ?? [c.initial_C as number])]
  const surfaceTemp = (s: z.output<typeof surfaceSchema>) => (s.fixed_C ?? s.ambient_C) as number
  for (const s of c.stages) temps.push(surfaceTemp(s.surface))
  if (c.centre !== 'symmetry') temps.push(surfaceTemp(c.centre))
  if (t.below_C !== undefined && !(Math.min(...temps) < t.below_C))
    ctx.addIssue({ code: 'custom', path: ['target', 'below_C'], message: `nothing in the case is colder than ${Math.min(...temps)} °C, so the part can never get below ${t.below_C} °C` })
  if (t.above_C !== undefined && !(Math.max(...temps) > t.above_C))
    ctx.addIssue({ code: 'custom', path: ['target', 'above_C'], message: `nothing in the case is hotter than ${Math.max(...temps)} °C, so the part can never get above ${t.above_C} °C` })
}

/** Validates a raw case; throws CaseError naming the first bad field. */
export function parseCase(input: unknown): Case {
  const parsed = caseSchema.safeParse(input)
  if (!parsed.success) {
    const issue = parsed.error.issues[0]
    throw new CaseError(issue.path.length ? issue.path.join('.') : '(case)', issue.message)
  }
  return parsed.data
}

/** A case surface as zod leaves it: a fixed temperature or a convective surface (h or hCurve, ambient_C, emissivity). */
export type CaseSurface = z.output<typeof surfaceSchema>

function boundaryOf(s: CaseSurface): Exclude<Boundary, { type: 'symmetry' }> {
  if (s.fixed_C !== undefined) return { type: 'fixed', T_C: s.fixed_C }
  return convectiveBoundaryOf(s)
}

/**
 * The engine's convective boundary for a case surface that is not fixed, the one place a
 * boundary is built from a surface (the planner reads the coefficient the surface saw through it).
 */
export function convectiveBoundaryOf(s: Omit<CaseSurface, 'fixed_C'>): ConvectiveBoundary {
  const hCurve = s.hCurve?.map((p) => ({ T_C: p.T_C, h_W_m2K: p.h }))
  return {
    type: 'convective',
    h_W_m2K: s.h ?? (hCurve as HeatTransferPoint[])[0].h_W_m2K,
    ambient_C: s.ambient_C as number,
    ...(hCurve ? { hCurve } : {}),
    ...(s.emissivity === undefined ? {} : { emissivity: s.emissivity }),
  }
}

/** A material table's rows with rho carried down where a row leaves it out. */
function tableRows(table: z.output<typeof tableRow>[]): ThermalTableRow[] {
  let rho = table[0].rho as number
  return table.map((r) => {
    rho = r.rho ?? rho
    return { T_C: r.T_C, k_W_mK: r.k, rhoCp_J_m3K: rho * r.cp }
  })
}

/** The engine's problem for a validated case. */
export function caseToProblem(c: Case): CooldownProblem {
  const table = c.material.table ? tableRows(c.material.table) : undefined
  // A table material's properties field holds its values at the start temperature (for time scales and summaries).
  const start_C = c.initial_C ?? (c.initialProfile as { T_C: number }[])[0].T_C
  const atStart = (key: 'k_W_mK' | 'rhoCp_J_m3K', rows: ThermalTableRow[]) =>
    interpolate(rows.map((r) => r.T_C), rows.map((r) => r[key]), start_C)
  const properties: PropertyPoint[] = c.material.profile
    ? c.material.profile.map((p) => ({ x: p.x, k_W_mK: p.k, rhoCp_J_m3K: p.rhoCp }))
    : table
      ? [0, 1].map((x) => ({ x, k_W_mK: atStart('k_W_mK', table), rhoCp_J_m3K: atStart('rhoCp_J_m3K', table) }))
      : [0, 1].map((x) => ({ x, k_W_mK: c.material.k as number, rhoCp_J_m3K: (c.material.rho as number) * (c.material.cp as number) }))
  const inner: Boundary = c.centre === 'symmetry' ? { type: 'symmetry' } : boundaryOf(c.centre)
  const stages: Stage[] = c.stages.map((s) => ({ outer: boundaryOf(s.surface), inner, ...(s.duration_s === undefined ? {} : { duration_s: s.duration_s }) }))
  return {
    domain: { geometry: c.geometry, length_m: c.size_m, properties, ...(table ? { temperatureTable: table } : {}) },
    initial: c.initialProfile ?? (c.initial_C as number),
    stages,
  }
}
