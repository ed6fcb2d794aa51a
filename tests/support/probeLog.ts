import { forwardTemperatures } from '../../server/measurements/forwardModel'
import { parseFit } from '../../server/measurements/fitSchema'
import { ISO_9950_PROBE } from '../../server/measurements/probes'
import { gaussianNoise } from '../unit/measurements/noise'

/**
 * A probe log made by the fit's own forward model: the ISO 9950 probe from 850 °C into
 * a 60 °C bath at a constant `h`, 400 readings 0.2 s apart with ±0.3 K of seeded noise,
 * as a logger's CSV. A fit must give `h` back (the closed-form check of the fit itself
 * is tests/unit/measurements/closedForm.test.ts).
 */
export function syntheticProbeCsv(h_W_m2K: number): string {
  const t_s = Array.from({ length: 400 }, (_, i) => i * 0.2)
  const { problem, x } = parseFit({
    geometry: ISO_9950_PROBE.geometry,
    size_m: ISO_9950_PROBE.size_m,
    material: ISO_9950_PROBE.material,
    initial_C: 850,
    ambient_C: 60,
    at: ISO_9950_PROBE.at,
    log: { t_s: [0, 1, 2], T_C: [850, 800, 750] },
    model: { kind: 'constant' },
  })
  const T_C = forwardTemperatures(problem, x, 60, { h_W_m2K }, t_s).thermocouple_C
  const noise = gaussianNoise(0.3, 11)
  return ['Elapsed (s),Probe centre (°C),Bath (°C)', ...t_s.map((t, i) => `${t.toFixed(1)},${(T_C[i] + noise()).toFixed(2)},60.0`)].join('\n')
}
