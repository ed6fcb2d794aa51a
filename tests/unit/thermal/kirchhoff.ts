import bessel from 'bessel'
import type { CooldownProblem, Geometry } from '../../../server/thermal/types'
import { bisect } from '../../support/bisect'

/**
 * Kirchhoff transformation (Carslaw & Jaeger, Conduction of Heat in Solids, 2nd ed.,
 * §1.16; Özışık, Heat Conduction, the chapter on non-linear problems): with
 * k = k0(1 + βT) and ρc = C0(1 + βT), U = T + βT²/2 obeys the linear equation with
 * diffusivity k0/C0, so with a fixed surface temperature U follows the classical
 * fixed-surface series and T = (−1 + √(1 + 2βU))/β. β = −4e-4 /K makes k fall by
 * about a third between 0 and 850 °C, as a steel's does.
 */
export const BETA = -4e-4
const K0 = 45
const C0 = 3.9e6
const J0_ZEROS = Array.from({ length: 300 }, (_, i) => bisect((z) => bessel.besselj(z, 0), (i + 0.75) * Math.PI - 0.3, (i + 0.75) * Math.PI + 0.3))
/** Fraction of the initial excess left for a fixed surface: Carslaw & Jaeger §3.3 (slab), §7.4 (rod), §9.3 (sphere). */
const fixedSurfaceFraction: Record<Geometry, (x: number, Fo: number) => number> = {
  slab: (x, Fo) => {
    let s = 0
    for (let n = 0; n < 2000; n++) {
      const l = ((2 * n + 1) * Math.PI) / 2
      s += ((4 * (-1) ** n) / ((2 * n + 1) * Math.PI)) * Math.cos(l * x) * Math.exp(-l * l * Fo)
    }
    return s
  },
  rod: (x, Fo) => J0_ZEROS.reduce((s, b) => s + ((2 * bessel.besselj(b * x, 0)) / (b * bessel.besselj(b, 1))) * Math.exp(-b * b * Fo), 0),
  sphere: (x, Fo) => {
    let s = 0
    for (let n = 1; n < 2000; n++) {
      const l = n * Math.PI
      s += 2 * (-1) ** (n + 1) * (x === 0 ? 1 : Math.sin(l * x) / (l * x)) * Math.exp(-l * l * Fo)
    }
    return s
  },
}

const L = 0.02
const T0 = 850
const TS = 20
const U = (T: number) => T + (BETA * T * T) / 2
const T = (u: number) => (-1 + Math.sqrt(1 + 2 * BETA * u)) / BETA

/** The closed-form temperature at x (fraction of L) and t for kirchhoffProblem(geometry). */
export function kirchhoffExact(geometry: Geometry, x: number, t: number): number {
  return T(U(TS) + (U(T0) - U(TS)) * fixedSurfaceFraction[geometry](x, ((K0 / C0) * t) / (L * L)))
}

/** A 20 mm body from 850 °C with its surface held at 20 °C, k and ρc as above. */
export function kirchhoffProblem(geometry: Geometry): CooldownProblem {
  return {
    domain: {
      geometry,
      length_m: L,
      properties: [0, 1].map((x) => ({ x, k_W_mK: K0, rhoCp_J_m3K: C0 })),
      // Linear between 0 and 900 °C, so the table is the law itself over the whole run.
      temperatureTable: [0, 900].map((T_C) => ({ T_C, k_W_mK: K0 * (1 + BETA * T_C), rhoCp_J_m3K: C0 * (1 + BETA * T_C) })),
    },
    initial: T0,
    stages: [{ inner: { type: 'symmetry' }, outer: { type: 'fixed', T_C: TS } }],
  }
}
