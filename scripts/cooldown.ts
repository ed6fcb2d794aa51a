/**
 * Usage: npm run --silent cooldown -- case.json [--check]
 * Prints the result JSON on stdout; a bad case prints "field: message" on stderr
 * and exits 2, as does a case that needs more than the engine's time budget.
 */
import { COMPUTE_BUDGET_MS, Deadline } from '../server/thermal/deadline'
import { CaseError } from '../server/thermal/errors'
import { runCase } from '../server/thermal/runCase'
import { runJsonCommand } from './cli/jsonCommand'

runJsonCommand({
  usage: 'npm run --silent cooldown -- case.json [--check]',
  run: (input, flags) => {
    const deadline = new Deadline(COMPUTE_BUDGET_MS)
    return runCase(input, flags.includes('--check') ? { check: 'finite-difference', deadline } : { deadline })
  },
  isInputError: (error) => error instanceof CaseError,
})
