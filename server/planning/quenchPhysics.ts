/**
 * Which physics a plan's quench uses, and the engine's material and surfaces for it.
 * A revision whose library values carry a property table (material) or cooling-power
 * curves (a stage's medium) is computed with them: k(T), ρc(T) and h(T_s) plus the
 * medium's radiation; one saved before they were copied has neither and computes with
 * the single values exactly as before. Framework-free, like the rest of the planner's core.
 */
import type { CoefficientChoice, MaterialSnapshot, QuenchPhysics, QuenchantSnapshot, ResolvedPlan } from '../../shared/schemas/plan'
import { convectiveBoundaryOf } from '../thermal/caseSchema'
import { CaseError } from '../thermal/errors'
import { surfaceLaw } from '../thermal/surfaceCurve'
import { stageAt } from './stages'

export function coefficientOf(q: QuenchantSnapshot, choice: CoefficientChoice): number {
  return choice === 'low' ? q.hLow_W_m2K : choice === 'high' ? q.hHigh_W_m2K : q.hTypical_W_m2K
}

/** True when the plan's library values carry a table or curves, so the tables change its answer. */
export function hasTemperatureData(material: MaterialSnapshot, quenchants: QuenchantSnapshot[]): boolean {
  return !!material.propertyTable || quenchants.some((q) => !!q.coolingCurves)
}

/** The engine's material: the graded profile, the temperature table (ρ left out = the room-temperature density), or the single values. */
export function engineMaterial(m: MaterialSnapshot, physics: QuenchPhysics) {
  if (m.gradedProfile) return { profile: m.gradedProfile }
  if (physics === 'tables' && m.propertyTable) return { table: m.propertyTable.map((r) => ({ T_C: r.T_C, k: r.k, rho: r.rho ?? m.density_kg_m3, cp: r.cp })) }
  return { k: m.k_W_mK, rho: m.density_kg_m3, cp: m.specificHeat_J_kgK }
}

/** The engine's surface for a stage in medium `q`: its curve (with radiation) or its single coefficient. */
export function engineSurface(q: QuenchantSnapshot, choice: CoefficientChoice, physics: QuenchPhysics) {
  if (physics === 'tables' && q.coolingCurves) {
    const hCurve = q.coolingCurves[choice]
    return { hCurve, ambient_C: q.bath_C, ...(q.emissivity ? { emissivity: q.emissivity } : {}) }
  }
  return { h: coefficientOf(q, choice), ambient_C: q.bath_C }
}

/**
 * The coefficient the surface saw along a curve: h_eff(T_s) = h(T_s) + εσ(T_s² + T∞²)(T_s + T∞)
 * of the stage in force at each time (stageAt: a stage boundary belongs to the earlier stage).
 */
export function surfaceCoefficients(
  curve: { t_s: number[]; surface_C: number[] },
  stageEnds_s: (number | null)[],
  surfaces: ReturnType<typeof engineSurface>[],
): number[] {
  const laws = surfaces.map((s) => surfaceLaw(convectiveBoundaryOf(s)))
  return curve.t_s.map((t, i) => laws[stageAt(t, stageEnds_s)]!.effectiveH(curve.surface_C[i]!))
}

/** The library values of the stages' quenchants, in stage order. */
export function stageQuenchants(plan: ResolvedPlan): QuenchantSnapshot[] {
  return plan.stages.map((stage, i) => {
    const q = plan.library.quenchants.find((candidate) => candidate.id === stage.quenchantId)
    if (!q) throw new CaseError(`stages.${i}.quenchantId`, `quenchant ${stage.quenchantId} is not among the plan's library values`)
    return q
  })
}
