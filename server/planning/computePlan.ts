/**
 * A saved or previewed plan (spec + copied library values) → engine cases → the
 * editor's result and the PlanSummary the schedule and floor read. Framework-free:
 * routes call it through server/planning/plans.ts, tests import it directly.
 *
 * Plates, bars and spheres go through runCase (eigenfunction series, any number of
 * stages, graded materials). Short cylinders and blocks go through product
 * solutions (../thermal/productSolution.ts): uniform properties, a different bath or
 * air temperature per stage by superposition, handling point centre or mean.
 */
import type { Deadline } from '../thermal/deadline'
import { CaseError, WHOLE_CASE } from '../thermal/errors'
import { runCase, type CaseResult } from '../thermal/runCase'
import { pointValue } from '../../shared/pointSeries'
import type { CoefficientChoice, QuenchantSnapshot, ResolvedPlan } from '../../shared/schemas/plan'
import type { PlanSummary } from '../../shared/types/plan'
import type { PlanCheckResult, PlanMode, PlanResult, PlanStageResult } from '../../shared/types/planResult'
import { furnaceCoefficient_W_m2K } from './furnace'
import { MODES_LISTED, checkProduct, runProduct, type ModelRun, type ProductInput } from '../thermal/productSolution'
import { crackingWarning, handlingAtMediumWarning } from './warnings'
import { ONE_TERM_MIN_FOURIER, biot, characteristicLength_m, engineBody, fourier, volumeToSurface_m } from './shapes'

const PROFILE_TIMES = 25

/** The library values of the stages' quenchants, in stage order. */
function stageQuenchants(plan: ResolvedPlan): QuenchantSnapshot[] {
  return plan.stages.map((stage, i) => {
    const q = plan.library.quenchants.find((candidate) => candidate.id === stage.quenchantId)
    if (!q) throw new CaseError(`stages.${i}.quenchantId`, `quenchant ${stage.quenchantId} is not among the plan's library values`)
    return q
  })
}

export function coefficientOf(q: QuenchantSnapshot, choice: CoefficientChoice): number {
  return choice === 'low' ? q.hLow_W_m2K : choice === 'high' ? q.hHigh_W_m2K : q.hTypical_W_m2K
}

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

function engineMaterial(plan: ResolvedPlan) {
  const m = plan.library.material
  return m.gradedProfile ? { profile: m.gradedProfile } : { k: m.k_W_mK, rho: m.density_kg_m3, cp: m.specificHeat_J_kgK }
}

/** The runCase case for the quench of a plate, bar or sphere; `choice` overrides every stage's coefficient (the band). */
export function quenchCase(plan: ResolvedPlan, choice?: CoefficientChoice) {
  const body = engineBody(plan.part)
  if (body.kind !== 'series') throw new Error('quenchCase is for plates, bars and spheres')
  const quenchants = stageQuenchants(plan)
  return {
    geometry: body.geometry,
    size_m: body.size_m,
    material: engineMaterial(plan),
    initial_C: plan.start_C,
    stages: plan.stages.map((s, i) => ({
      surface: { h: coefficientOf(quenchants[i]!, choice ?? s.coefficient), ambient_C: quenchants[i]!.bath_C },
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
    material: engineMaterial(plan),
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

function fromRunCase(result: CaseResult): ModelRun {
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
    series: result.stages.map((s) => s.pointSeries),
  }
}

interface Runs {
  headline: ModelRun
  detailed: ModelRun
  low: ModelRun
  high: ModelRun
  heatUp: ModelRun | null
}

/** Every run of one computation shares the deadline: it bounds the preview, not each run. */
function runAll(plan: ResolvedPlan, deadline: Deadline | undefined): Runs {
  const body = engineBody(plan.part)
  if (body.kind === 'series') {
    const headline = inPlanTerms('quench', () => fromRunCase(runCase(quenchCase(plan), { deadline })))
    const times_s = profileTimes(headline.targetTime_s)
    return {
      headline,
      detailed: inPlanTerms('quench', () => fromRunCase(runCase({ ...quenchCase(plan), times_s }, { deadline }))),
      low: inPlanTerms('quench', () => fromRunCase(runCase(quenchCase(plan, 'low'), { deadline }))),
      high: inPlanTerms('quench', () => fromRunCase(runCase(quenchCase(plan, 'high'), { deadline }))),
      heatUp: plan.soak ? inPlanTerms('heat-up', () => fromRunCase(runCase(heatUpCase(plan), { deadline }))) : null,
    }
  }
  const headline = inPlanTerms('quench', () => runProduct(productInput(plan), { deadline }))
  return {
    headline,
    detailed: inPlanTerms('quench', () => runProduct(productInput(plan), { times_s: profileTimes(headline.targetTime_s), deadline })),
    low: inPlanTerms('quench', () => runProduct(productInput(plan, 'low'), { deadline })),
    high: inPlanTerms('quench', () => runProduct(productInput(plan, 'high'), { deadline })),
    heatUp: plan.soak ? inPlanTerms('heat-up', () => runProduct(heatUpProductInput(plan), { deadline })) : null,
  }
}

function profileTimes(target_s: number): number[] {
  return Array.from({ length: PROFILE_TIMES }, (_, i) => (1.25 * target_s * i) / (PROFILE_TIMES - 1))
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
  const stages: PlanStageResult[] = runs.detailed.stages.map((s, i) => {
    const h = coefficientOf(quenchants[i]!, plan.stages[i]!.coefficient)
    return {
      index: i,
      quenchantName: quenchants[i]!.name,
      h_W_m2K: h,
      ambient_C: quenchants[i]!.bath_C,
      start_s: s.start_s,
      end_s: s.end_s,
      biot: biot(h, L, props.k_W_mK),
      biotLumped: biot(h, VA, props.k_W_mK),
      modes: s.modes,
      truncationError_K: s.truncationError_K,
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
  const summary: PlanSummary = {
    quenchToHandling_s: t_h,
    // The band's longest time: the low coefficients normally, whichever run is slowest in any case.
    slowEndToHandling_s: Math.max(t_h, runs.low.targetTime_s, runs.high.targetTime_s),
    handling_C: plan.handling.below_C,
    soak: soak ? { furnace_C: soak.furnace_C, heatUp_s: soak.heatUp_s, minimumSoak_s: soak.minimumSoak_s, total_s: soak.total_s } : null,
    handlingPointSeries: runs.headline.series,
    heatUpSeries: runs.heatUp ? runs.heatUp.series : null,
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
    ].filter((w) => w !== null),
  }
}

/** Re-solves the quench with Crank–Nicolson and reports the largest difference from the series. */
export function checkPlan(plan: ResolvedPlan, options: { deadline?: Deadline } = {}): PlanCheckResult {
  const { deadline } = options
  const body = engineBody(plan.part)
  if (body.kind === 'series') {
    const result = inPlanTerms('quench', () => runCase(quenchCase(plan), { check: 'finite-difference', deadline }))
    return { maxDifference_K: result.check!.maxDifference_K, how: 'Crank–Nicolson against the series at 12 curve times, centre, mid-radius and surface' }
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
