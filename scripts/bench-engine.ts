/**
 * Series engine vs Crank–Nicolson at the same accuracy (0.05 K at the centre), and
 * the planner budgets: a uniform plan (< 2 ms) and a graded 12-mode plan (< 30 ms).
 * Prints medians and ratios; never fails on time.
 */
import { solveCrankNicolson } from '../server/thermal/crankNicolson'
import { runCase } from '../server/thermal/runCase'
import { solveCooldown } from '../server/thermal/solveCooldown'
import type { CooldownProblem, PropertyPoint } from '../server/thermal/types'

function median_ms(fn: () => void, reps: number): number {
  fn()
  const times: number[] = []
  for (let i = 0; i < reps; i++) {
    const t0 = performance.now()
    fn()
    times.push(performance.now() - t0)
  }
  times.sort((a, b) => a - b)
  return times[Math.floor(reps / 2)]
}

const steel = (k: number, rhoCp: number): PropertyPoint[] => [0, 1].map((x) => ({ x, k_W_mK: k, rhoCp_J_m3K: rhoCp }))
const gradedRod: PropertyPoint[] = [
  { x: 0, k_W_mK: 28, rhoCp_J_m3K: 3.7e6 },
  { x: 0.85, k_W_mK: 40, rhoCp_J_m3K: 3.8e6 },
  { x: 0.85, k_W_mK: 18, rhoCp_J_m3K: 4.1e6 },
  { x: 1, k_W_mK: 20, rhoCp_J_m3K: 4.1e6 },
]
const oilThenAir = (geometry: 'slab' | 'rod', length_m: number, properties: PropertyPoint[]): CooldownProblem => ({
  domain: { geometry, length_m, properties },
  initial: 850,
  stages: [
    { inner: { type: 'symmetry' }, outer: { type: 'convective', h_W_m2K: 900, ambient_C: 60 }, duration_s: 150 },
    { inner: { type: 'symmetry' }, outer: { type: 'convective', h_W_m2K: 15, ambient_C: 25 } },
  ],
})
const cases: [string, CooldownProblem][] = [
  ['uniform oil-quenched plate', oilThenAir('slab', 0.015, steel(40, 3.73e6))],
  ['uniform rod', oilThenAir('rod', 0.025, steel(40, 3.73e6))],
  ['graded rod (case + core)', oilThenAir('rod', 0.025, gradedRod)],
]
const times = Array.from({ length: 40 }, (_, i) => 5 + i * 40)

console.log('series vs Crank–Nicolson, centre temperature at 40 times, both within 0.05 K of a 60-mode reference')
console.log('case'.padEnd(30), 'series ms'.padStart(10), 'CN cells'.padStart(9), 'CN ms'.padStart(9), 'CN/series'.padStart(10))
for (const [name, problem] of cases) {
  const reference = solveCooldown(problem, { earliest_s: 5, minModes: 60 })
  const exact = times.map((t) => reference.evaluate(t, 0))
  const series = () => {
    const s = solveCooldown(problem, { earliest_s: 5 })
    return times.map((t) => s.evaluate(t, 0))
  }
  const seriesError = Math.max(...series().map((v, i) => Math.abs(v - exact[i])))
  let cells = 10
  const cn = (n: number) => solveCrankNicolson(problem, { times_s: times, points: [0], cells: n }).T_C.map((row) => row[0])
  while (cells < 3200 && Math.max(...cn(cells).map((v, i) => Math.abs(v - exact[i]))) > 0.05) cells = Math.round(cells * 1.5)
  const seriesMs = median_ms(series, 21)
  const cnMs = median_ms(() => cn(cells), 7)
  console.log(
    name.padEnd(30),
    seriesMs.toFixed(2).padStart(10),
    String(cells).padStart(9),
    cnMs.toFixed(2).padStart(9),
    (cnMs / seriesMs).toFixed(1).padStart(10),
    seriesError > 0.05 ? `  (series error ${seriesError.toFixed(3)} K!)` : '',
  )
}

const uniformPlan = {
  geometry: 'rod',
  size_m: 0.02,
  material: { k: 40, rho: 7850, cp: 475 },
  initial_C: 850,
  stages: [{ surface: { h: 800, ambient_C: 60 }, duration_s: 180 }, { surface: { h: 15, ambient_C: 25 } }],
  target: { at: 'centre', below_C: 100 },
}
const uniformMs = median_ms(() => runCase(uniformPlan), 51)
console.log(`\nuniform plan (runCase: modes, 600-point curve, time to target): median ${uniformMs.toFixed(2)} ms (budget 2 ms, ratio ${(uniformMs / 2).toFixed(2)})`)

const graded: CooldownProblem = { ...oilThenAir('rod', 0.025, gradedRod), stages: [oilThenAir('rod', 0.025, gradedRod).stages[1]] }
const gradedMs = median_ms(() => {
  const s = solveCooldown(graded, { minModes: 12, earliest_s: 1e9 })
  s.targetTime('centre', { below_C: 100 })
}, 15)
console.log(`graded plan, 12 modes (shooting + coefficients + time to target): median ${gradedMs.toFixed(2)} ms (budget 30 ms, ratio ${(gradedMs / 30).toFixed(2)})`)
