/**
 * A saved or previewed plan (spec + copied library values) → engine cases → the
 * editor's result and the PlanSummary the schedule and floor read. Framework-free:
 * routes call it through server/planning/plans.ts, tests import it directly.
 *
 * Plates, bars and spheres go through runCase (eigenfunction series, any number of
 * stages, graded materials). When the revision's library values carry a property
 * table or cooling-power curves (quenchPhysics.ts), the quench runs with them (the
 * engine's stepped-amplitude sub-step series): the headline with each stage's chosen
 * curve, the band with the low and high curves, and beside them the constant-property
 * estimate of the single values, which is cheap. The heat-up stays constant-property
 * (one furnace coefficient, the room-temperature values), so a plan costs three
 * temperature-dependent solves. Short cylinders and blocks go through product
 * solutions (../thermal/productSolution.ts): uniform properties, a different bath or
 * air temperature per stage by superposition, handling point centre or mean; a
 * warning says when the library had tables or curves they could not use.
 */
import { COMPUTE_BUDGET_MS, type Deadline } from '../thermal/deadline'
import { CaseError, EngineLimitError, WHOLE_CASE } from '../thermal/errors'
import { runCase, type CaseResult } from '../thermal/runCase'
import { caseToProblem, parseCase } from '../thermal/caseSchema'
import { constantLimit } from '../thermal/constantLimit'
import { pointValue } from '../../shared/pointSeries'
import { COEFFICIENT_CHOICES, type CoefficientChoice, type QuenchPhysics, type ResolvedPlan } from '../../shared/schemas/plan'
import type { PlanSummary } from '../../shared/types/plan'
import type { PlanCheckResult, PlanMode, PlanResult, PlanStageResult } from '../../shared/types/planResult'
import type { PlanWarning } from '../../shared/planWarnings'
import { furnaceCoefficient_W_m2K } from './furnace'
import { MODES_LISTED, checkProduct, runProduct, type ModelRun, type ProductInput } from '../thermal/productSolution'
import { crackingWarning, curveRangeWarning, handlingAtMediumWarning, tableRangeWarning, uniformPropertiesWarning } from './warnings'
import { ONE_TERM_MIN_FOURIER, biot, characteristicLength_m, engineBody, fourier, volumeToSurface_m } from './shapes'
import { coefficientOf, engineMaterial, engineSurface, hasTemperatureData, stageQuenchants, surfaceCoefficients } from './quenchPhysics'
import { compactHistory } from './compactSeries'
import { stageAt, stageSpans } from './stages'

const PROFILE_TIMES = 25
/**
 * A temperature-dependent plan is three sub-step solves (0.3–1 s each on a quiet
 * machine, two to three times that on a loaded one), so it gets most of the pool's
 * default 8 s cap (NUXT_ENGINE_JOB_SECONDS) instead of the engine's 4 s, and the
 * engine's own refusal still comes before the pool stops the thread.
 */
export const TABLE_PLAN_BUDGET_MS = 7000

/** The engine budget of one computation of `plan`. */
export function computeBudget_ms(plan: ResolvedPlan): number {
  return isTemperatureDependent(plan) ? TABLE_PLAN_BUDGET_MS : COMPUTE_BUDGET_MS
}
const PRODUCT_METHOD = 'product of eigenmode series'

/**
 * Section-averaged k and ρc (trapezoids over the profile's x; a repeated x is a jump
 * of zero width). Used for the Biot and Fourier numbers only; the engine uses the profile.
 */
export function averageProperties(plan: ResolvedPlan): { k_W_mK: number; rhoCp_J_m3K: number } {
  const m = plan.library.material
  if (!m.gradedProfile) return { k_W_mK: m.k_W_mK, rhoCp_J_m3K: m.density_kg_m3 * m.specificHeat_J_kgK }
  let k = 0
  let c = 0
  const p = m.gradedProfile
  for (let i = 1; i < p.length; i++) {
    const w = p[i]!.x - p[i - 1]!.x
    k += (w * (p[i]!.k + p[i - 1]!.k)) / 2
    c += (w * (p[i]!.rhoCp + p[i - 1]!.rhoCp)) / 2
  }
  return { k_W_mK: k, rhoCp_J_m3K: c }
}

/**
 * True when this plan's quench runs with the library's tables or curves: plates, bars
 * and spheres, unless the plan asks for constants, and only when a table or curve is
 * not flat (flat ones are constants to the engine, and the plan computes as it did before them).
 */
export function isTemperatureDependent(plan: ResolvedPlan): boolean {
  if (plan.physics !== 'tables' || engineBody(plan.part).kind !== 'series' || !hasTemperatureData(plan.library.material, stageQuenchants(plan))) return false
  return COEFFICIENT_CHOICES.some((choice) => needsSubSteps(quenchCase(plan, choice, 'tables')))
}

/** Flat tables are constants to the engine, which then takes today's series unchanged. */
function needsSubSteps(kase: object): boolean {
  return !constantLimit(caseToProblem(inPlanTerms('quench', () => parseCase(kase))))
}

/**
 * The runCase case for the quench of a plate, bar or sphere; `choice` overrides every
 * stage's coefficient or curve (the band); `physics` 'constant' gives the single-value estimate.
 */
export function quenchCase(plan: ResolvedPlan, choice?: CoefficientChoice, physics: QuenchPhysics = plan.physics) {
  const body = engineBody(plan.part)
  if (body.kind !== 'series') throw new Error('quenchCase is for plates, bars and spheres')
  const quenchants = stageQuenchants(plan)
  return {
    geometry: body.geometry,
    size_m: body.size_m,
    material: engineMaterial(plan.library.material, physics),
    initial_C: plan.start_C,
    stages: plan.stages.map((s, i) => ({
      surface: engineSurface(quenchants[i]!, choice ?? s.coefficient, physics),
      ...(s.duration_s === undefined ? {} : { duration_s: s.duration_s }),
    })),
    target: { at: plan.handling.at, below_C: plan.handling.below_C },
  }
}

function furnaceH(plan: ResolvedPlan): number {
  const soak = plan.soak!
  return soak.furnaceH_W_m2K ?? furnaceCoefficient_W_m2K(soak.furnace_C, soak.charge_C)
}

/** The heat-up case: charged at charge_C into furnace_C until the centre is within the tolerance. */
export function heatUpCase(plan: ResolvedPlan) {
  const body = engineBody(plan.part)
  if (body.kind !== 'series' || !plan.soak) throw new Error('heatUpCase is for plates, bars and spheres with soak planning')
  return {
    geometry: body.geometry,
    size_m: body.size_m,
    material: engineMaterial(plan.library.material, 'constant'),
    initial_C: plan.soak.charge_C,
    stages: [{ surface: { h: furnaceH(plan), ambient_C: plan.soak.furnace_C } }],
    target: { at: 'centre' as const, above_C: plan.soak.furnace_C - plan.soak.tolerance_K },
  }
}

export function productInput(plan: ResolvedPlan, choice?: CoefficientChoice): ProductInput {
  const body = engineBody(plan.part)
  if (body.kind !== 'product') throw new Error('productInput is for short cylinders and blocks')
  const m = plan.library.material
  if (m.gradedProfile) throw new CaseError('materialId', 'a graded material needs a plate, round bar or sphere; short cylinders and blocks need uniform properties')
  if (plan.handling.at === 'surface') throw new CaseError('handling.at', 'for a short cylinder or block the handling point is the centre or the mean')
  const quenchants = stageQuenchants(plan)
  return {
    body,
    material: { k: m.k_W_mK, rho: m.density_kg_m3, cp: m.specificHeat_J_kgK },
    initial_C: plan.start_C,
    stages: plan.stages.map((s, i) => ({
      h_W_m2K: coefficientOf(quenchants[i]!, choice ?? s.coefficient),
      ambient_C: quenchants[i]!.bath_C,
      ...(s.duration_s === undefined ? {} : { duration_s: s.duration_s }),
    })),
    target: { at: plan.handling.at, below_C: plan.handling.below_C },
  }
}

function heatUpProductInput(plan: ResolvedPlan): ProductInput {
  const soak = plan.soak!
  return {
    ...productInput(plan),
    initial_C: soak.charge_C,
    stages: [{ h_W_m2K: furnaceH(plan), ambient_C: soak.furnace_C }],
    target: { at: 'centre', above_C: soak.furnace_C - soak.tolerance_K },
  }
}

/** The engine names case fields; the editor needs the plan's fields. */
function inPlanTerms<T>(context: 'quench' | 'heat-up', run: () => T): T {
  try {
    return run()
  } catch (error) {
    if (!(error instanceof CaseError)) throw error
    throw new CaseError(planField(error.field, context), error.reason)
  }
}

export function planField(field: string, context: 'quench' | 'heat-up'): string {
  // A limit of a uniform or product case: its stages are what makes it heavy.
  if (field === WHOLE_CASE) return context === 'heat-up' ? 'soak' : 'stages'
  if (field.startsWith('materialId') || field.startsWith('handling') || field.startsWith('part')) return field
  if (field.startsWith('material')) return 'materialId'
  if (field === 'size_m') return 'part'
  if (context === 'heat-up') {
    if (field.startsWith('target')) return 'soak.tolerance_K'
    if (field.startsWith('initial')) return 'soak.charge_C'
    if (field.startsWith('stages')) return 'soak.furnaceH_W_m2K'
    return `soak.${field}`
  }
  if (field.startsWith('target')) return 'handling.below_C'
  if (field.startsWith('initial')) return 'start_C'
  const stage = /^stages\.(\d+)/.exec(field)
  if (stage) return field.includes('duration') ? `stages.${stage[1]}.duration_s` : `stages.${stage[1]}.quenchantId`
  return field
}

/** A run with each stage's method and error estimate (the sub-step series' own, else the truncation bound). */
interface QuenchRun extends ModelRun {
  stageMethods: { method: string; estimatedError_K: number }[]
}

function fromRunCase(result: CaseResult): QuenchRun {
  return {
    targetTime_s: result.targetTime_s as number,
    curve: result.curve,
    profiles: result.profiles,
    stages: result.stages.map((s) => ({
      start_s: s.start_s,
      end_s: s.end_s,
      truncationError_K: s.truncationError_K,
      modes: s.decayRates_per_s.slice(0, MODES_LISTED).map((r, i): PlanMode => ({ label: `${i + 1}`, decayRate_per_s: r, timeConstant_s: 1 / r })),
    })),
    // A temperature-dependent stage is a chain of sub-step series; all of them make its history.
    series: result.stages.flatMap((s) => s.subStepSeries ?? [s.pointSeries]),
    stageMethods: result.stages.map((s) => ({ method: s.method, estimatedError_K: s.estimatedError_K })),
  }
}

function fromProduct(run: ModelRun): QuenchRun {
  return { ...run, stageMethods: run.stages.map((s) => ({ method: PRODUCT_METHOD, estimatedError_K: s.truncationError_K })) }
}

interface Runs {
  headline: QuenchRun
  detailed: QuenchRun
  low: QuenchRun
  high: QuenchRun
  heatUp: ModelRun | null
  /** The single-value estimate beside a temperature-dependent headline; null when it is the headline. */
  constant: ModelRun | null
}

/** Every run of one computation shares the deadline: it bounds the preview, not each run. */
function runAll(plan: ResolvedPlan, deadline: Deadline | undefined): Runs {
  const body = engineBody(plan.part)
  const quench = (kase: object) => inPlanTerms('quench', () => fromRunCase(runCase(kase, { deadline })))
  const heatUp = () => (plan.soak ? inPlanTerms('heat-up', () => fromRunCase(runCase(heatUpCase(plan), { deadline }))) : null)
  if (body.kind === 'series' && isTemperatureDependent(plan)) {
    // Three sub-step solves only: the headline carries the profile times, spread over the
    // constant-property slow end (known cheaply beforehand) rather than its own target.
    const constant = quench(quenchCase(plan, undefined, 'constant'))
    const constantSlow = quench(quenchCase(plan, 'low', 'constant'))
    const tables = (kase: object) => withConstantHint(() => quench(kase))
    const detailed = tables({ ...quenchCase(plan), times_s: profileTimes(Math.max(constant.targetTime_s, constantSlow.targetTime_s)) })
    return { headline: detailed, detailed, low: tables(quenchCase(plan, 'low')), high: tables(quenchCase(plan, 'high')), heatUp: heatUp(), constant }
  }
  if (body.kind === 'series') {
    const headline = quench(quenchCase(plan))
    const times_s = profileTimes(headline.targetTime_s)
    return {
      headline,
      detailed: quench({ ...quenchCase(plan), times_s }),
      low: quench(quenchCase(plan, 'low')),
      high: quench(quenchCase(plan, 'high')),
      heatUp: heatUp(),
      constant: null,
    }
  }
  const product = (choice?: CoefficientChoice, times_s?: number[]) =>
    inPlanTerms('quench', () => fromProduct(runProduct(productInput(plan, choice), { ...(times_s ? { times_s } : {}), deadline })))
  const headline = product()
  return {
    headline,
    detailed: product(undefined, profileTimes(headline.targetTime_s)),
    low: product('low'),
    high: product('high'),
    heatUp: plan.soak ? inPlanTerms('heat-up', () => runProduct(heatUpProductInput(plan), { deadline })) : null,
    constant: null,
  }
}

/** A sub-step solve the engine will not finish leaves the metallurgist a way out: the single values. */
function withConstantHint<T>(run: () => T): T {
  try {
    return run()
  } catch (error) {
    if (!(error instanceof EngineLimitError)) throw error
    throw new EngineLimitError(`${error.reason} (with the temperature tables and cooling curves; the single values compute this plan quickly)`, error.field)
  }
}

function profileTimes(target_s: number): number[] {
  return Array.from({ length: PROFILE_TIMES }, (_, i) => (1.25 * target_s * i) / (PROFILE_TIMES - 1))
}

/** The warnings about what the plan's physics could not honour: tables and curves read past their ends, or not used at all. */
function physicsWarnings(plan: ResolvedPlan, curve: ModelRun['curve'], stageEnds_s: (number | null)[], temperatureDependent: boolean): PlanWarning[] {
  const quenchants = stageQuenchants(plan)
  if (!temperatureDependent) {
    const unused = plan.physics === 'tables' && engineBody(plan.part).kind === 'product' && hasTemperatureData(plan.library.material, quenchants)
    return unused ? [uniformPropertiesWarning()] : []
  }
  // The part stays between its start and its media's temperatures (the maximum principle): a truncated
  // series' ringing just after the quench must not read as a temperature past a table's or curve's end.
  const range = [plan.start_C, ...quenchants.map((q) => q.bath_C)]
  const physical = (T: number) => Math.min(Math.max(...range), Math.max(Math.min(...range), T))
  const seen = { ...curve, centre_C: curve.centre_C.map(physical), surface_C: curve.surface_C.map(physical) }
  const table = plan.library.material.propertyTable
  const warnings = [table ? tableRangeWarning(table, plan.library.material.name, seen) : null]
  plan.stages.forEach((s, i) => {
    const curves = quenchants[i]!.coolingCurves
    if (!curves) return
    const surface = seen.surface_C.filter((_, j) => stageAt(curve.t_s[j]!, stageEnds_s) === i)
    warnings.push(curveRangeWarning(i, { name: quenchants[i]!.name, curve: curves[s.coefficient] }, surface))
  })
  return warnings.filter((w) => w !== null)
}

export function computePlan(plan: ResolvedPlan, options: { deadline?: Deadline } = {}): PlanResult {
  const runs = runAll(plan, options.deadline)
  const quenchants = stageQuenchants(plan)
  const props = averageProperties(plan)
  const L = characteristicLength_m(plan.part)
  const VA = volumeToSurface_m(plan.part)
  const diffusivity = props.k_W_mK / props.rhoCp_J_m3K
  const t_h = runs.headline.targetTime_s
  const Fo = fourier(diffusivity, t_h, L)
  const band = (run: ModelRun) => ({
    quenchToHandling_s: run.targetTime_s,
    handling_C: runs.detailed.curve.t_s.map((t) => (t <= 0 ? plan.start_C : pointValue(run.series, t))),
  })
  const temperatureDependent = runs.constant !== null
  const physics: QuenchPhysics = temperatureDependent ? 'tables' : 'constant'
  const stageEnds_s = runs.detailed.stages.map((s) => s.end_s)
  const surfaceH = surfaceCoefficients(runs.detailed.curve, stageEnds_s, plan.stages.map((s, i) => engineSurface(quenchants[i]!, s.coefficient, physics)))
  const stages: PlanStageResult[] = runs.detailed.stages.map((s, i) => {
    const h = coefficientOf(quenchants[i]!, plan.stages[i]!.coefficient)
    // The start reading (t = 0: the part's start temperature, before the medium has acted) is not a coefficient the surface saw.
    const seen = surfaceH.filter((_, j) => runs.detailed.curve.t_s[j]! > 0 && stageAt(runs.detailed.curve.t_s[j]!, stageEnds_s) === i)
    return {
      index: i,
      quenchantName: quenchants[i]!.name,
      h_W_m2K: h,
      hSeen_W_m2K: quenchants[i]!.coolingCurves && temperatureDependent && seen.length > 0 ? { min: Math.min(...seen), max: Math.max(...seen) } : null,
      ambient_C: quenchants[i]!.bath_C,
      start_s: s.start_s,
      end_s: s.end_s,
      biot: biot(h, L, props.k_W_mK),
      biotLumped: biot(h, VA, props.k_W_mK),
      modes: s.modes,
      truncationError_K: s.truncationError_K,
      method: runs.detailed.stageMethods[i]!.method,
      estimatedError_K: runs.detailed.stageMethods[i]!.estimatedError_K,
    }
  })
  const soak = plan.soak && runs.heatUp
    ? {
        furnace_C: plan.soak.furnace_C,
        charge_C: plan.soak.charge_C,
        tolerance_K: plan.soak.tolerance_K,
        furnaceH_W_m2K: furnaceH(plan),
        furnaceHFrom: plan.soak.furnaceH_W_m2K === null ? ('common-practice' as const) : ('spec' as const),
        heatUp_s: runs.heatUp.targetTime_s,
        minimumSoak_s: plan.soak.minimumSoak_s,
        total_s: runs.heatUp.targetTime_s + plan.soak.minimumSoak_s,
      }
    : null
  const spans = stageSpans(stages)
  const summary: PlanSummary = {
    quenchToHandling_s: t_h,
    // The band's longest time: the low coefficients normally, whichever run is slowest in any case.
    slowEndToHandling_s: Math.max(t_h, runs.low.targetTime_s, runs.high.targetTime_s),
    handling_C: plan.handling.below_C,
    soak: soak ? { furnace_C: soak.furnace_C, heatUp_s: soak.heatUp_s, minimumSoak_s: soak.minimumSoak_s, total_s: soak.total_s } : null,
    handlingPointSeries: temperatureDependent ? compactHistory(runs.headline.series, spans, [t_h]) : runs.headline.series,
    heatUpSeries: runs.heatUp ? runs.heatUp.series : null,
    firstStageEnd_s: stages[0]!.end_s,
    ...(temperatureDependent
      ? {
          bandPointSeries: {
            low: compactHistory(runs.low.series, spans, [runs.low.targetTime_s]),
            high: compactHistory(runs.high.series, spans, [runs.high.targetTime_s]),
          },
        }
      : {}),
  }
  const body = engineBody(plan.part)
  return {
    method: body.kind,
    shape: plan.part.shape,
    handling: plan.handling,
    quenchToHandling_s: t_h,
    fourierAtHandling: Fo,
    oneTermValid: Fo > ONE_TERM_MIN_FOURIER,
    truncationError_K: Math.max(...stages.map((s) => s.truncationError_K)),
    stages,
    material: { name: plan.library.material.name, graded: plan.library.material.gradedProfile !== null, ...props, diffusivity_m2_s: diffusivity },
    curve: runs.detailed.curve,
    stageBoundaries_s: stages.slice(1).map((s) => s.start_s),
    surfaceCoefficient_W_m2K: surfaceH,
    physics: {
      temperatureDependent,
      method: [...new Set(stages.map((s) => s.method))].join('; '),
      estimatedError_K: Math.max(...stages.map((s) => s.estimatedError_K)),
      constantPropertyToHandling_s: runs.constant ? runs.constant.targetTime_s : null,
      propertyTableSource: temperatureDependent ? (plan.library.material.propertyTable ? (plan.library.material.propertyTableSource ?? null) : null) : null,
      curveSources: temperatureDependent ? [...new Set(quenchants.filter((q) => q.coolingCurves).map((q) => q.curveSource ?? ''))].filter((x) => x) : [],
    },
    band: { low: band(runs.low), high: band(runs.high) },
    profiles: {
      ...runs.detailed.profiles,
      depth_m: L,
      along: body.kind === 'series' ? 'centre to surface' : 'centre to the nearest face centre',
    },
    soak,
    summary,
    warnings: [
      handlingAtMediumWarning(plan.handling.below_C, quenchants.at(-1)!),
      crackingWarning(runs.detailed.curve, plan.part, plan.library.material.k_W_mK),
      ...physicsWarnings(plan, runs.detailed.curve, stageEnds_s, temperatureDependent),
    ].filter((w) => w !== null),
  }
}

/** Re-solves the quench with Crank–Nicolson and reports the largest difference from the series. */
export function checkPlan(plan: ResolvedPlan, options: { deadline?: Deadline } = {}): PlanCheckResult {
  const { deadline } = options
  const body = engineBody(plan.part)
  if (body.kind === 'series') {
    const result = inPlanTerms('quench', () => runCase(quenchCase(plan), { check: 'finite-difference', deadline }))
    const how = isTemperatureDependent(plan)
      ? 'non-linear Crank–Nicolson (k(T), ρc(T), the curve’s h(T_s) and radiation iterated within each step) against the sub-step series at 12 curve times, centre, mid-radius and surface'
      : 'Crank–Nicolson against the series at 12 curve times, centre, mid-radius and surface'
    return { maxDifference_K: result.check!.maxDifference_K, how }
  }
  const input = inPlanTerms('quench', () => productInput(plan))
  const run = inPlanTerms('quench', () => runProduct(input, { deadline }))
  const times = Array.from({ length: 12 }, (_, i) => (run.targetTime_s * 1.25 * (i + 1)) / 12)
  return {
    maxDifference_K: inPlanTerms('quench', () => checkProduct(input, times, deadline)),
    how: 'Crank–Nicolson against each 1-D factor at 12 times; the sum over directions bounds the product’s difference',
  }
}

/** Curve as CSV with units in the header; temperatures in °C or °F as asked. */
export function curveCsv(result: PlanResult, unit: 'C' | 'F' = 'C'): string {
  const T = (c: number) => (unit === 'C' ? c : (c * 9) / 5 + 32)
  const u = unit === 'C' ? '°C' : '°F'
  const lines = [
    `time (s),centre (${u}),surface (${u}),mean (${u}),handling point at low coefficients (${u}),handling point at high coefficients (${u})`,
  ]
  const c = result.curve
  c.t_s.forEach((t, i) => {
    lines.push([t.toFixed(3), ...[c.centre_C[i]!, c.surface_C[i]!, c.mean_C[i]!, result.band.low.handling_C[i]!, result.band.high.handling_C[i]!].map((v) => T(v).toFixed(3))].join(','))
  })
  return `${lines.join('\r\n')}\r\n`
}
