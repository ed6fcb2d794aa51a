/**
 * The engine's refusals. Both name a field as a dotted case path ("stages.0.surface.h"),
 * so the command line prints "field: message" and exits 2 and the API answers 422.
 */

/** A case the engine cannot compute as given. */
export class CaseError extends Error {
  constructor(
    readonly field: string,
    /** The message without the field. */
    readonly reason: string,
  ) {
    super(`${field}: ${reason}`)
    this.name = 'CaseError'
  }
}

/** Field of a limit hit deep in the engine, where no case field is known; runCase names one. */
export const WHOLE_CASE = '(case)'

/**
 * A valid case the engine will not finish: an iteration cap, a non-finite value or the
 * time budget. A refusal instead of a loop, a stack trace or a held server.
 */
export class EngineLimitError extends CaseError {
  constructor(message: string, field: string = WHOLE_CASE) {
    super(field, message)
    this.name = 'EngineLimitError'
  }
}
