import type { QuenchantKind } from './schemas/quenchant'

export const QUENCHANT_KIND_LABELS: Record<QuenchantKind, string> = {
  'oil': 'Oil',
  'water': 'Water',
  'polymer': 'Polymer solution',
  'salt': 'Salt bath',
  'forced-air': 'Forced air',
  'still-air': 'Still air',
  'gas': 'Gas (pressurised)',
}

/** Thermal diffusivity α = k / (ρ c_p) in m²/s: how fast a temperature change spreads through the part. */
export function thermalDiffusivity_m2_s(k_W_mK: number, density_kg_m3: number, specificHeat_J_kgK: number): number {
  return k_W_mK / (density_kg_m3 * specificHeat_J_kgK)
}

/** The same in mm²/s, the size steels come in (about 4 for austenitic stainless, about 18 for mild steel). */
export function thermalDiffusivity_mm2_s(k_W_mK: number, density_kg_m3: number, specificHeat_J_kgK: number): number {
  return thermalDiffusivity_m2_s(k_W_mK, density_kg_m3, specificHeat_J_kgK) * 1e6
}
