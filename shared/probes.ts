/** The probe presets a calibration may name (server/measurements/probes.ts holds their bodies and sources). */
export const PROBE_PRESET_IDS = ['iso-9950'] as const
export type ProbePresetId = (typeof PROBE_PRESET_IDS)[number]

export const PROBE_PRESET_LABELS: Record<ProbePresetId, string> = {
  'iso-9950': 'Standard nickel-alloy probe (ISO 9950), Ø12.5 × 60 mm, centre thermocouple',
}
