/**
 * The engine's own time budget: a deadline checked in every loop whose length depends
 * on the case (mode searches, shots, integration steps, projections, finite-volume
 * steps), so a case that would run on is refused with a message instead. Wall-clock
 * time, since what matters is how long a request holds its thread.
 */
import { EngineLimitError } from './errors'

/** Budget of one plan computation (preview, save, check) and of a command-line case. */
export const COMPUTE_BUDGET_MS = 4000

export class Deadline {
  private readonly until_ms: number

  constructor(
    readonly budget_ms: number,
    private readonly clock: () => number = () => performance.now(),
  ) {
    this.until_ms = clock() + budget_ms
  }

  /** Throws EngineLimitError once the budget is spent. */
  check(): void {
    if (this.clock() > this.until_ms)
      throw new EngineLimitError(`this case needs more than ${this.budget_ms / 1000} s to solve; coarsen the profile or shorten the stages`)
  }
}
