/**
 * Usage: npm run --silent cooldown -- case.json [--check]
 * Prints the result JSON on stdout; a bad case prints "field: message" on stderr
 * and exits 2, as does a case that needs more than the engine's time budget.
 */
import { readFileSync } from 'node:fs'
import { COMPUTE_BUDGET_MS, Deadline } from '../server/thermal/deadline'
import { CaseError } from '../server/thermal/errors'
import { runCase } from '../server/thermal/runCase'

const args = process.argv.slice(2)
const file = args.find((a) => !a.startsWith('--'))
if (!file) {
  process.stderr.write('usage: npm run --silent cooldown -- case.json [--check]\n')
  process.exit(2)
}
let input: unknown
try {
  input = JSON.parse(readFileSync(file, 'utf8'))
} catch (error) {
  process.stderr.write(`${file}: ${(error as Error).message}\n`)
  process.exit(2)
}
try {
  const deadline = new Deadline(COMPUTE_BUDGET_MS)
  const result = runCase(input, args.includes('--check') ? { check: 'finite-difference', deadline } : { deadline })
  process.stdout.write(`${JSON.stringify(result, null, 2)}\n`)
} catch (error) {
  if (error instanceof CaseError) {
    process.stderr.write(`${error.message}\n`)
    process.exit(2)
  }
  throw error
}
