/**
 * npm run bench:fit — the calibration fit against its target: a 400-point log of the
 * ISO 9950 probe (Inconel 600 rod, 12.5 mm) quenched in an oil, fitted with a 7-knot
 * cooling-power curve, under 2 s. The log is made by the eigenmode engine from a known
 * curve plus seeded 0.3 K noise (as tests/unit/measurements/syntheticLogs.test.ts).
 * Printed side by side in one run: the fit's median time, one forward solve's median
 * time, and their ratio (forward solves' worth of work per fit), with the iterations.
 * Never fails on time.
 */
import { fitCoolingLog, type FitResult } from '../server/measurements/fit'
import { forwardTemperatures } from '../server/measurements/forwardModel'
import { ISO_9950_PROBE } from '../server/measurements/probes'
import { caseToProblem, parseCase } from '../server/thermal/caseSchema'
import { runCase } from '../server/thermal/runCase'
import { gaussianNoise } from '../tests/unit/measurements/noise'

const FITS = 5
const FORWARD_SOLVES = 20
const knots_C = [60, 200, 350, 500, 650, 750, 850]
const trueH = [300, 800, 2500, 3500, 2000, 700, 500]
const hCurve = knots_C.map((T_C, i) => ({ T_C, h: trueH[i]! }))
const t_s = Array.from({ length: 400 }, (_, i) => i * 0.15)
const ambient_C = 60

const probe = { geometry: ISO_9950_PROBE.geometry, size_m: ISO_9950_PROBE.size_m, material: ISO_9950_PROBE.material, initial_C: 850 }
const clean = runCase({ ...probe, stages: [{ surface: { hCurve, ambient_C } }], times_s: t_s, points: [0] }).table.T_C.map((row) => row[0]!)
const noise = gaussianNoise(0.3, 20261202)
const logged = clean.map((T, i) => (i === 0 ? T : T + noise()))
const input = { ...probe, ambient_C, at: 'centre' as const, log: { t_s, T_C: logged }, model: { kind: 'curve' as const, knots_C } }

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!
function timed<T>(run: () => T): { ms: number; value: T } {
  const t0 = performance.now()
  const value = run()
  return { ms: performance.now() - t0, value }
}

// Warm-up, then fits and forward solves interleaved so machine load touches both alike.
fitCoolingLog(input)
const problem = caseToProblem(parseCase({ ...probe, stages: [{ surface: { h: 1000, ambient_C } }] }))
const trial = { hCurve: knots_C.map((T_C, i) => ({ T_C, h_W_m2K: trueH[i]! })) }
const fitMs: number[] = []
const forwardMs: number[] = []
let last: FitResult | undefined
for (let i = 0; i < FITS; i++) {
  const fit = timed(() => fitCoolingLog(input))
  fitMs.push(fit.ms)
  last = fit.value
  for (let j = 0; j < FORWARD_SOLVES / FITS; j++) forwardMs.push(timed(() => forwardTemperatures(problem, 0, ambient_C, trial, t_s)).ms)
}
const fit = median(fitMs)
const forward = median(forwardMs)
console.log('calibration fit: ISO 9950 probe in an oil, 400 logged points, 7-knot curve (target under 2,000 ms)')
console.log('fit ms'.padStart(9), 'forward ms'.padStart(11), 'fit/forward'.padStart(12), 'iterations'.padStart(11), 'rms K'.padStart(7))
const row = [fit.toFixed(0).padStart(9), forward.toFixed(2).padStart(11), (fit / forward).toFixed(0).padStart(12)]
console.log(...row, String(last!.iterations).padStart(11), last!.rms_K.toFixed(3).padStart(7))
