/**
 * Usage: npm run --silent calibrate -- fit.json
 * Fits a quench medium's surface coefficient (one h, or h at chosen knots) to a
 * logged cooling curve and prints JSON on stdout; a bad input prints
 * "field: message" on stderr and exits 2.
 */
import { readFileSync } from 'node:fs'
import { FitError } from '../server/measurements/fitSchema'
import { fitCoolingLog, type FitResult } from '../server/measurements/fit'

function cliOutput(fit: FitResult) {
  const fitted = fit.h
    ? { h: fit.h.value }
    : { hCurve: (fit.hCurve ?? []).map((k) => ({ T_C: k.T_C, h: k.h })) }
  const uncertainty = fit.h
    ? { h: fit.h.uncertainty }
    : (fit.hCurve ?? []).map((k) => ({ T_C: k.T_C, h: k.uncertainty }))
  return { ...fitted, rms_K: fit.rms_K, maxAbs_K: fit.maxAbs_K, points: fit.points, iterations: fit.iterations, uncertainty, warnings: fit.warnings }
}

const file = process.argv.slice(2).find((a) => !a.startsWith('--'))
if (!file) {
  process.stderr.write('usage: npm run --silent calibrate -- fit.json\n')
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
  process.stdout.write(`${JSON.stringify(cliOutput(fitCoolingLog(input)), null, 2)}\n`)
} catch (error) {
  if (error instanceof FitError) {
    process.stderr.write(`${error.message}\n`)
    process.exit(2)
  }
  throw error
}
