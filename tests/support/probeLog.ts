import { forwardTemperatures } from '../../server/measurements/forwardModel'
import { parseFit } from '../../server/measurements/fitSchema'
import { ISO_9950_PROBE } from '../../server/measurements/probes'
import { gaussianNoise } from '../unit/measurements/noise'

/** A body quenched at one h, read at `x` (0 centre, 1 surface), logged every `step_s` for `rows` readings. */
export interface SyntheticBody {
  geometry: 'slab' | 'rod' | 'sphere'
  size_m: number
  material: unknown
  x: number
  step_s: number
  rows: number
}

/**
 * A thermocouple log made by the fit's own forward model: `body` from 850 °C into a
 * 60 °C bath at a constant `h`, with ±0.3 K of seeded noise, as a logger's CSV. A fit
 * must give `h` back (the closed-form check of the fit itself is
 * tests/unit/measurements/closedForm.test.ts).
 */
export function syntheticLogCsv(h_W_m2K: number, body: SyntheticBody): string {
  const t_s = Array.from({ length: body.rows }, (_, i) => i * body.step_s)
  const { problem, x } = parseFit({
    geometry: body.geometry,
    size_m: body.size_m,
    material: body.material,
    initial_C: 850,
    ambient_C: 60,
    at: { x: body.x },
    log: { t_s: [0, 1, 2], T_C: [850, 800, 750] },
    model: { kind: 'constant' },
  })
  const T_C = forwardTemperatures(problem, x, 60, { h_W_m2K }, t_s).thermocouple_C
  const noise = gaussianNoise(0.3, 11)
  return ['Elapsed (s),Probe centre (°C),Bath (°C)', ...t_s.map((t, i) => `${t.toFixed(1)},${(T_C[i] + noise()).toFixed(2)},60.0`)].join('\n')
}

/** The ISO 9950 probe's log: 400 readings 0.2 s apart at its centre. */
export function syntheticProbeCsv(h_W_m2K: number): string {
  const { geometry, size_m, material } = ISO_9950_PROBE
  return syntheticLogCsv(h_W_m2K, { geometry, size_m, material, x: 0, step_s: 0.2, rows: 400 })
}
