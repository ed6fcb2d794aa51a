/**
 * Warnings a metallurgist expects beside a plan's result. The server finds them
 * (server/planning/warnings.ts); the text names temperatures as {placeholders} so the
 * browser writes them in the user's unit and tests in °C.
 */
export type PlanWarningKind = 'handling-at-medium' | 'cracking-risk' | 'outside-table' | 'outside-curve' | 'uniform-properties'

export interface PlanWarning {
  kind: PlanWarningKind
  /** The plan field to look at ("handling.below_C", "stages.0.quenchantId", "materialId"). */
  field: string
  /** Text with {name} where a temperature goes. */
  text: string
  temperatures_C: Record<string, number>
  /** Temperature differences (K), written {name} as well. */
  differences_K?: Record<string, number>
}

/** The warning's words with its temperatures written by `temperature` and differences by `difference`. */
export function warningText(w: PlanWarning, temperature: (value_C: number) => string, difference: (value_K: number) => string): string {
  return w.text.replace(/\{(\w+)\}/g, (whole, name: string) => {
    if (name in w.temperatures_C) return temperature(w.temperatures_C[name]!)
    if (w.differences_K && name in w.differences_K) return difference(w.differences_K[name]!)
    return whole
  })
}
