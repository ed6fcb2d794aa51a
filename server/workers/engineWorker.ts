/**
 * Worker-thread entry for engine jobs (run by the pool in server/workers/jobPool.ts).
 * Each named export is one job. The build bundles this file on its own into
 * .output/server/workers/engineWorker.mjs (modules/workerEntries.ts), so it imports
 * only framework-free code: the planning computations and the engine.
 *
 * Errors lose their class crossing threads, so an engine refusal (CaseError) comes
 * back as a value and the request thread rebuilds it.
 */
import { runThisThreadInBackground } from './backgroundPriority'
import { Deadline } from '../thermal/deadline'
import { CaseError } from '../thermal/errors'
import { checkPlan, computeBudget_ms, computePlan } from '../planning/computePlan'
import type { ResolvedPlan } from '../../shared/schemas/plan'
import type { PlanCheckResult, PlanResult } from '../../shared/types/planResult'

runThisThreadInBackground()

export type EngineOutcome<T> = { ok: true; value: T } | { ok: false; field: string; message: string }

function outcome<T>(run: () => T): EngineOutcome<T> {
  try {
    return { ok: true, value: run() }
  } catch (error) {
    if (error instanceof CaseError) return { ok: false, field: error.field, message: error.reason }
    throw error
  }
}

// The engine's own budget refuses a slow case with a message; the pool's cap is the backstop for anything it misses.
const budgeted = (plan: ResolvedPlan) => ({ deadline: new Deadline(computeBudget_ms(plan)) })

export const compute = (plan: ResolvedPlan): EngineOutcome<PlanResult> => outcome(() => computePlan(plan, budgeted(plan)))
export const check = (plan: ResolvedPlan): EngineOutcome<PlanCheckResult> => outcome(() => checkPlan(plan, budgeted(plan)))
// A preview goes to the client as it is: serialised here, the request thread neither
// clones its tens of kB of curves across threads nor stringifies them again.
export const computeJson = (plan: ResolvedPlan): EngineOutcome<string> => outcome(() => JSON.stringify(computePlan(plan, budgeted(plan))))
