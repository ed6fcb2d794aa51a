/**
 * Shared vocabulary of the cooldown engine. Everything is SI; temperatures in °C.
 *
 * The domain is one-dimensional: x runs from 0 (centre, or the inner face of a
 * full-thickness slab) to 1 (the outer surface), as a fraction of `length_m`.
 * The conduction equation solved everywhere in this folder is
 *
 *   ρc(x) ∂T/∂t = x^-m ∂/∂x ( x^m k(x) ∂T/∂x ),   m = 0 slab, 1 rod, 2 sphere.
 */
import type { PointStage } from '../../shared/pointSeries'
import type { Deadline } from './deadline'
import type { ScaledDomain } from './properties'
import type { StageSeries } from './series'
import type { TargetSpec } from './targetTime'

export type Geometry = 'slab' | 'rod' | 'sphere'

/** Exponent m of the radial weight x^m. */
export const GEOMETRY_EXPONENT: Record<Geometry, 0 | 1 | 2> = { slab: 0, rod: 1, sphere: 2 }

/** One end of the domain. */
export type Boundary =
  | { type: 'symmetry' }
  | ConvectiveBoundary
  | { type: 'fixed'; T_C: number }

/** A point of a heat-transfer curve: h at a surface temperature. */
export interface HeatTransferPoint {
  T_C: number
  h_W_m2K: number
}

/**
 * A surface losing heat to surroundings at ambient_C. With `hCurve` the coefficient
 * follows the surface temperature (linear between points, constant beyond the ends)
 * and h_W_m2K is not used (it holds the curve's first point); with
 * `emissivity` radiation to surroundings at ambient_C adds εσ(T_s⁴ − T∞⁴).
 */
export interface ConvectiveBoundary {
  type: 'convective'
  h_W_m2K: number
  ambient_C: number
  hCurve?: HeatTransferPoint[]
  emissivity?: number
}

/** A row of a temperature-dependent material table (linear between rows, constant beyond the ends). */
export interface ThermalTableRow {
  T_C: number
  k_W_mK: number
  rhoCp_J_m3K: number
}

/**
 * A property table point. x is a fraction 0–1 of `length_m`; values are linear
 * between points, and a repeated x is a jump (layered, clad, case-hardened parts).
 * A uniform part is the two points x = 0 and x = 1 with equal values.
 */
export interface PropertyPoint {
  x: number
  k_W_mK: number
  rhoCp_J_m3K: number
}

/** A temperature table point (initial profile), x as a fraction 0–1. */
export interface TemperaturePoint {
  x: number
  T_C: number
}

/** The body being heated or cooled. */
export interface ConductionDomain {
  geometry: Geometry
  /** Half-thickness / radius with a symmetric centre; full thickness when x = 0 is a face. */
  length_m: number
  properties: PropertyPoint[]
  /**
   * Temperature-dependent material, uniform in space: k and ρc follow the local
   * temperature. `properties` then holds the table's values at the start temperature.
   */
  temperatureTable?: ThermalTableRow[]
}

/** One stage of a cooldown (or heat-up): its surface conditions for a time. */
export interface Stage {
  /** Condition at x = 1. */
  outer: Exclude<Boundary, { type: 'symmetry' }>
  /** Condition at x = 0: symmetry, or for a slab a face of its own. */
  inner: Boundary
  /** Length of the stage; the last stage may be open-ended (undefined). */
  duration_s?: number
}

/** A full problem: domain, initial state and the sequence of stages. */
export interface CooldownProblem {
  domain: ConductionDomain
  /** A uniform start temperature, or a profile over 0–1. */
  initial: number | TemperaturePoint[]
  stages: Stage[]
}

/** Where a temperature is read: a named place, or x as a fraction of length_m. */
export type PointRef = 'centre' | 'surface' | 'mean' | { x: number }

export interface SolveOptions {
  /** Earliest time after each stage's start the series must be accurate at (one value or one per stage). */
  earliest_s?: number | number[]
  /** Use at least this many modes in every stage. */
  minModes?: number
  /**
   * Temperature accuracy to aim for, in K. Absent: the product default (series
   * truncated at 0.01 K, graded rates polished to 1e-10). A value loosens the
   * truncation to 80 % of it and the graded shooting to a matching tolerance
   * (shootingAccuracy), e.g. 0.05 K to compare with a grid tuned to 0.05 K.
   */
  accuracy_K?: number
  /** Refuse (EngineLimitError) once this passes; absent, a solve takes the time it needs. */
  deadline?: Deadline
}

export interface StageSummary {
  start_s: number
  /** Null for an open-ended stage. */
  end_s: number | null
  modes: number
  decayRates_per_s: number[]
  timeConstants_s: number[]
  truncationError_K: number
  /** h L / k_ref at the surface (null when fixed); innerBiot likewise for a slab face. */
  biot: number | null
  innerBiot?: number | null
  /** Temperature-dependent stages only: the method, its error estimate and sub-step count (runCase names the series otherwise). */
  method?: string
  estimatedError_K?: number
  subSteps?: number
}

export interface CooldownSolution {
  domain: ScaledDomain
  stages: StageSeries[]
  summaries: StageSummary[]
  /** x of the centre: 0, or 0.5 (mid-plane) when x = 0 is a face. */
  centreX: number
  initialAt: (x: number) => number
  evaluate: (t_s: number, x: number) => number
  /** Heat-content mean ∫ρc x^m T / ∫ρc x^m (the mass mean when c is uniform). */
  mean: (t_s: number) => number
  pointSeries: (at: PointRef) => PointStage[]
  targetTime: (at: PointRef, target: TargetSpec) => number | null
}
