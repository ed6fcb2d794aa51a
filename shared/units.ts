/**
 * Display units. The database and the engine are always SI (m, °C, W/m²K); these
 * convert at the edge of the user interface only.
 */
export type TemperatureUnit = 'C' | 'F'
export type LengthUnit = 'mm' | 'in'

/** Exact by definition: 1 in = 25.4 mm (international inch, 1959). */
export const MM_PER_INCH = 25.4

export function temperatureFromC(value_C: number, unit: TemperatureUnit): number {
  return unit === 'C' ? value_C : (value_C * 9) / 5 + 32
}

export function temperatureToC(value: number, unit: TemperatureUnit): number {
  return unit === 'C' ? value : ((value - 32) * 5) / 9
}

/** A temperature difference (tolerance, band width): no offset. */
export function temperatureDifferenceFromK(value_K: number, unit: TemperatureUnit): number {
  return unit === 'C' ? value_K : (value_K * 9) / 5
}

export function temperatureDifferenceToK(value: number, unit: TemperatureUnit): number {
  return unit === 'C' ? value : (value * 5) / 9
}

export function lengthFromM(value_m: number, unit: LengthUnit): number {
  return unit === 'mm' ? value_m * 1000 : (value_m * 1000) / MM_PER_INCH
}

export function lengthToM(value: number, unit: LengthUnit): number {
  return unit === 'mm' ? value / 1000 : (value * MM_PER_INCH) / 1000
}

export const TEMPERATURE_LABEL: Record<TemperatureUnit, string> = { C: '°C', F: '°F' }
export const LENGTH_LABEL: Record<LengthUnit, string> = { mm: 'mm', in: 'in' }
