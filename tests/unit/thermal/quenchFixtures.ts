import type { CooldownProblem, Geometry, HeatTransferPoint, Stage, ThermalTableRow } from '../../../server/thermal/types'

/**
 * A plain medium-carbon steel, k and cp against temperature, shaped like the
 * handbook tables of such steels (common practice, from memory): conductivity falls
 * by about a half from room temperature to the Curie point, cp rises to a sharp peak
 * at the magnetic and pearlite-to-austenite change near 740 °C, density falls slowly.
 */
export const STEEL_TABLE: ThermalTableRow[] = (
  [
    [20, 51, 7850, 460],
    [200, 48, 7800, 520],
    [400, 42, 7740, 590],
    [600, 35, 7680, 720],
    [700, 31, 7650, 900],
    [740, 29.5, 7640, 1400],
    [780, 27, 7630, 900],
    [850, 26, 7650, 620],
    [1000, 27.5, 7600, 640],
  ] as const
).map(([T_C, k, rho, cp]) => ({ T_C, k_W_mK: k, rhoCp_J_m3K: rho * cp }))

/**
 * A quench oil's h against surface temperature: a vapour blanket above ~700 °C, a
 * boiling peak near 600 °C, convection below ~300 °C (common practice, from memory;
 * the magnitudes of a medium-speed oil).
 */
export const OIL_CURVE: HeatTransferPoint[] = (
  [
    [25, 300],
    [300, 400],
    [450, 1800],
    [600, 3000],
    [700, 1500],
    [800, 600],
    [900, 500],
  ] as const
).map(([T_C, h]) => ({ T_C, h_W_m2K: h }))

/** Constant steel properties near 850 °C. */
export const STEEL_K = 26
export const STEEL_RHO_CP = 7650 * 620

/** One open-ended stage for a body of steel from 850 °C, with a constant or table material. */
export function steelQuench(geometry: Geometry, length_m: number, outer: Stage['outer'], table = false): CooldownProblem {
  return {
    domain: {
      geometry,
      length_m,
      properties: [0, 1].map((x) => ({ x, k_W_mK: STEEL_K, rhoCp_J_m3K: STEEL_RHO_CP })),
      ...(table ? { temperatureTable: STEEL_TABLE } : {}),
    },
    initial: 850,
    stages: [{ inner: { type: 'symmetry' }, outer }],
  }
}
