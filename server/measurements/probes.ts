/**
 * Probe presets for calibrating a quench medium.
 *
 * The standard probe of ISO 9950 (Industrial quenching oils — Determination of
 * cooling characteristics — Nickel-alloy probe test method): a cylinder of nickel
 * alloy (Inconel 600) 12.5 mm in diameter and 60 mm long with a thermocouple at its
 * geometric centre. Slakewise models it as a long rod of radius 6.25 mm read at the
 * axis: at mid-length the ends are 30 mm away, and heat from them reaches the centre
 * only late in the test (for a slab of half-thickness 30 mm the centre still holds
 * over 97 % of its excess at Fourier number 0.05, about 13 s in this alloy, by which
 * time the probe centre has fallen below the oil's boiling range).
 *
 * Inconel 600 properties: density 8470 kg/m³; conductivity and specific heat
 * against temperature from the alloy producer's data sheet (Special Metals, "INCONEL
 * alloy 600", table of thermal properties) — from memory, edition and page not
 * checked; listed in DEVELOPERS.md under the provenance of numbers.
 */
import type { CaseInput } from '../thermal/caseSchema'
import { PROBE_PRESET_LABELS, type ProbePresetId } from '../../shared/probes'

export interface ProbePreset {
  id: ProbePresetId
  name: string
  geometry: 'rod'
  size_m: number
  at: 'centre'
  material: CaseInput['material']
  source: string
}

const INCONEL_600_DENSITY = 8470

/** [T °C, k W/mK, cp J/kgK]. */
const INCONEL_600_TABLE: [number, number, number][] = [
  [20, 14.9, 444],
  [100, 15.9, 465],
  [200, 17.3, 486],
  [300, 19.0, 502],
  [400, 20.5, 519],
  [500, 22.1, 536],
  [600, 23.9, 578],
  [700, 25.7, 595],
  [800, 27.5, 611],
  [900, 29.6, 628],
]

export const ISO_9950_PROBE: ProbePreset = {
  id: 'iso-9950',
  name: PROBE_PRESET_LABELS['iso-9950'],
  geometry: 'rod',
  size_m: 0.0125 / 2,
  at: 'centre',
  material: { table: INCONEL_600_TABLE.map(([T_C, k, cp], i) => ({ T_C, k, cp, ...(i === 0 ? { rho: INCONEL_600_DENSITY } : {}) })) },
  source: 'Probe: ISO 9950. Inconel 600 properties: Special Metals data sheet "INCONEL alloy 600" (from memory, not checked).',
}

export const PROBE_PRESETS: ProbePreset[] = [ISO_9950_PROBE]
