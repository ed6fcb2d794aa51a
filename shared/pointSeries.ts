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
