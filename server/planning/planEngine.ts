/**
 * Where plan computations run. In-process by default (the seed, scripts and unit
 * tests); the server's engine-pool plugin switches to worker threads at boot, so a
 * route only awaits and the request thread stays free for other requests.
 */
import { CaseError } from '../thermal/errors'
import type { JobPool, JobPoolStats } from '../workers/jobPool'
import { check, compute, type EngineOutcome } from '../workers/engineWorker'
import type { ResolvedPlan } from '../../shared/schemas/plan'
import type { PlanCheckResult, PlanResult } from '../../shared/types/planResult'

export interface PlanEngine {
  compute(plan: ResolvedPlan): Promise<PlanResult>
  check(plan: ResolvedPlan): Promise<PlanCheckResult>
  stats(): ({ mode: 'worker' } & JobPoolStats) | { mode: 'in-process' }
}

function unwrap<T>(result: EngineOutcome<T>): T {
  if (!result.ok) throw new CaseError(result.field, result.message)
  return result.value
}

const inProcess: PlanEngine = {
  compute: async (plan) => unwrap(compute(plan)),
  check: async (plan) => unwrap(check(plan)),
  stats: () => ({ mode: 'in-process' }),
}

let current: PlanEngine = inProcess

/** Routes every plan computation through `pool` (jobs named after engineWorker.ts's exports). */
export function useWorkerPool(pool: JobPool): void {
  current = {
    compute: async (plan) => unwrap(await pool.run<EngineOutcome<PlanResult>>('compute', plan)),
    check: async (plan) => unwrap(await pool.run<EngineOutcome<PlanCheckResult>>('check', plan)),
    stats: () => ({ mode: 'worker', ...pool.stats() }),
  }
}

export const planEngine = (): PlanEngine => current
