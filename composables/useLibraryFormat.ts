import { useUnitsStore } from '~/stores/units'

// A fixed locale: the server renders the first paint, and the browser's own locale could
// format differently and break hydration.
const formatters = new Map<number, Intl.NumberFormat>()
function formatter(digits: number) {
  let found = formatters.get(digits)
  if (!found) {
    found = new Intl.NumberFormat('en-US', { maximumFractionDigits: digits })
    formatters.set(digits, found)
  }
  return found
}

const significant3 = new Intl.NumberFormat('en-US', { minimumSignificantDigits: 3, maximumSignificantDigits: 3 })

/** Numbers and temperatures for the library tables, temperatures in the user's unit. */
export function useLibraryFormat() {
  const units = useUnitsStore()
  return {
    number: (value: number | null | undefined, digits = 1) => (value == null ? '—' : formatter(digits).format(value)),
    /** Three significant figures, as handbooks print a derived value such as α. */
    derived: (value: number) => significant3.format(value),
    temperature: (value_C: number | null | undefined) => (value_C == null ? '—' : `${formatter(0).format(units.showTemperature(value_C))} ${units.temperatureLabel}`),
  }
}
