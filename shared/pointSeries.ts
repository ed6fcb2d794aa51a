/**
 * Serialisable temperature history of one point (or of the heat-content mean):
 * per stage T(t) = steady_C + Σ amplitude_K · e^{−decayRate_per_s (t − start_s)},
 * so a browser can evaluate a live prediction without the engine. Lives in shared/
 * because both the engine (server) and the floor countdown (client) read it.
 */
export interface PointTerm {
  amplitude_K: number
  decayRate_per_s: number
}

export interface PointStage {
  start_s: number
  /** Absent for the open-ended last stage. */
  end_s?: number
  steady_C: number
  terms: PointTerm[]
}

/** Evaluates one stage's point series at absolute time t_s. */
export function pointStageValue(stage: PointStage, t_s: number): number {
  const tau = t_s - stage.start_s
  let T = stage.steady_C
  for (const term of stage.terms) T += term.amplitude_K * Math.exp(-term.decayRate_per_s * tau)
  return T
}

/**
 * Evaluates a whole point history at t_s: the stage with start < t ≤ end (a time on
 * a boundary belongs to the earlier stage, whose series has converged there);
 * after a finite last stage the last stage's conditions continue.
 */
export function pointValue(stages: PointStage[], t_s: number): number {
  for (const stage of stages) {
    if (stage.end_s === undefined || t_s <= stage.end_s) return pointStageValue(stage, t_s)
  }
  return pointStageValue(stages[stages.length - 1], t_s)
}

/**
 * pointValue at many ascending times, as for a plotted curve. Along a run of equal
 * spacing Δt within a stage each term is advanced by one multiplication,
 * e^{−μ(t+Δt)} = e^{−μt}·e^{−μΔt}, so a 600-point curve costs a few exp calls per
 * term instead of one per point; spacings are "equal" to 1e-12 relative, which
 * keeps the accumulated exponent error far below the series' own accuracy.
 */
export function pointValues(stages: PointStage[], times: ArrayLike<number>): number[] {
  const out: number[] = new Array(times.length)
  let s = 0
  let current = new Float64Array(0)
  let factor = new Float64Array(0)
  let prevT = Number.NaN
  let prevDt = Number.NaN
  let prevStage = -1
  for (let i = 0; i < times.length; i++) {
    const t = times[i]
    while (s < stages.length - 1 && stages[s].end_s !== undefined && t > (stages[s].end_s as number)) s++
    const stage = stages[s]
    const n = stage.terms.length
    const dt = t - prevT
    if (s !== prevStage) {
      current = new Float64Array(n)
      factor = new Float64Array(n)
      for (let j = 0; j < n; j++) current[j] = Math.exp(-stage.terms[j].decayRate_per_s * (t - stage.start_s))
      prevDt = Number.NaN
    } else if (Math.abs(dt - prevDt) <= 1e-12 * Math.abs(dt)) {
      for (let j = 0; j < n; j++) current[j] *= factor[j]
    } else {
      for (let j = 0; j < n; j++) {
        factor[j] = Math.exp(-stage.terms[j].decayRate_per_s * dt)
        current[j] *= factor[j]
      }
      prevDt = dt
    }
    let T = stage.steady_C
    for (let j = 0; j < n; j++) T += stage.terms[j].amplitude_K * current[j]
    out[i] = T
    prevT = t
    prevStage = s
  }
  return out
}
