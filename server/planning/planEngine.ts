/**
 * Where plan computations run. In-process by default (the seed, scripts and unit
 * tests); the server's engine-pool plugin switches to worker threads at boot, so a
 * route only awaits and the request thread stays free for other requests.
 */
import { CaseError } from '../thermal/errors'
import type { JobPool, JobPoolStats } from '../workers/jobPool'
import type { EngineOutcome } from '../workers/engineWorker'
import { checkPlan, computePlan } from './computePlan'
import type { ResolvedPlan } from '../../shared/schemas/plan'
import type { PlanCheckResult, PlanResult } from '../../shared/types/planResult'

export interface PlanEngine {
  compute(plan: ResolvedPlan): Promise<PlanResult>
  /** The result as the JSON text a response carries. */
  computeJson(plan: ResolvedPlan): Promise<string>
  check(plan: ResolvedPlan): Promise<PlanCheckResult>
  stats(): ({ mode: 'worker' } & JobPoolStats) | { mode: 'in-process' }
}

function unwrap<T>(result: EngineOutcome<T>): T {
  if (!result.ok) throw new CaseError(result.field, result.message)
  return result.value
}

/**
 * In-process runs have no time budget: nothing waits behind a script, and a loaded
 * machine must not make the seed refuse its own demo plans (a temperature-dependent
 * one takes seconds). The engine's iteration caps still end every computation.
 */
const inProcess: PlanEngine = {
  compute: async (plan) => computePlan(plan),
  computeJson: async (plan) => JSON.stringify(computePlan(plan)),
  check: async (plan) => checkPlan(plan),
  stats: () => ({ mode: 'in-process' }),
}

let current: PlanEngine = inProcess

/** Routes every plan computation through `pool` (jobs named after engineWorker.ts's exports). */
export function useWorkerPool(pool: JobPool): void {
  current = {
    compute: async (plan) => unwrap(await pool.run<EngineOutcome<PlanResult>>('compute', plan)),
    computeJson: async (plan) => unwrap(await pool.run<EngineOutcome<string>>('computeJson', plan)),
    check: async (plan) => unwrap(await pool.run<EngineOutcome<PlanCheckResult>>('check', plan)),
    stats: () => ({ mode: 'worker', ...pool.stats() }),
  }
}

export const planEngine = (): PlanEngine => current
