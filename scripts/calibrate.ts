/**
 * Usage: npm run --silent calibrate -- fit.json
 * Fits a quench medium's surface coefficient (one h, or h at chosen knots) to a
 * logged cooling curve and prints JSON on stdout; a bad input prints
 * "field: message" on stderr and exits 2.
 */
import { FitError } from '../server/measurements/fitSchema'
import { fitCoolingLog, type FitResult } from '../server/measurements/fit'
import { runJsonCommand } from './cli/jsonCommand'

function cliOutput(fit: FitResult) {
  const fitted = fit.h
    ? { h: fit.h.value }
    : { hCurve: (fit.hCurve ?? []).map((k) => ({ T_C: k.T_C, h: k.h })) }
  const uncertainty = fit.h
    ? { h: fit.h.uncertainty }
    : (fit.hCurve ?? []).map((k) => ({ T_C: k.T_C, h: k.uncertainty }))
  return { ...fitted, rms_K: fit.rms_K, maxAbs_K: fit.maxAbs_K, points: fit.points, iterations: fit.iterations, uncertainty, warnings: fit.warnings }
}

runJsonCommand({
  usage: 'npm run --silent calibrate -- fit.json',
  run: (input) => cliOutput(fitCoolingLog(input)),
  isInputError: (error) => error instanceof FitError,
})
