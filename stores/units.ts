import { defineStore } from 'pinia'
import {
  LENGTH_LABEL,
  TEMPERATURE_LABEL,
  lengthFromM,
  lengthToM,
  temperatureDifferenceFromK,
  temperatureFromC,
  temperatureToC,
  type LengthUnit,
  type TemperatureUnit,
} from '~~/shared/units'

interface UnitChoice {
  temperature: TemperatureUnit
  length: LengthUnit
}

const DEFAULT_CHOICE: UnitChoice = { temperature: 'C', length: 'mm' }

/** The signed-in user's display units, remembered in this browser per user. */
export const useUnitsStore = defineStore('units', () => {
  const temperature = ref<TemperatureUnit>(DEFAULT_CHOICE.temperature)
  const length = ref<LengthUnit>(DEFAULT_CHOICE.length)
  const storageKey = ref<string | null>(null)

  function load(userKey: string) {
    storageKey.value = `slakewise.units.${userKey}`
    if (!import.meta.client) return
    try {
      const saved = JSON.parse(localStorage.getItem(storageKey.value) ?? 'null') as Partial<UnitChoice> | null
      temperature.value = saved?.temperature === 'F' ? 'F' : 'C'
      length.value = saved?.length === 'in' ? 'in' : 'mm'
    } catch {
      temperature.value = DEFAULT_CHOICE.temperature
      length.value = DEFAULT_CHOICE.length
    }
  }

  function save() {
    if (import.meta.client && storageKey.value) {
      localStorage.setItem(storageKey.value, JSON.stringify({ temperature: temperature.value, length: length.value }))
    }
  }

  watch([temperature, length], save)

  /** A stored °C as an edit field shows it: in the user's unit, to 0.01. */
  function temperatureForEditing(value_C: number | null | undefined): number | '' {
    return value_C == null ? '' : Math.round(temperatureFromC(value_C, temperature.value) * 100) / 100
  }

  /**
   * The °C an edit field means. An untouched field keeps the stored °C exactly:
   * converting the rounded °F back would add rounding noise to the audit trail.
   */
  function temperatureFromEditing(entered: number | '', stored_C: number | null | undefined): number | '' {
    if (entered === '') return ''
    if (stored_C != null && entered === temperatureForEditing(stored_C)) return stored_C
    return temperatureToC(entered, temperature.value)
  }

  const temperatureLabel = computed(() => TEMPERATURE_LABEL[temperature.value])
  const lengthLabel = computed(() => LENGTH_LABEL[length.value])

  return {
    temperature,
    length,
    temperatureLabel,
    lengthLabel,
    load,
    temperatureForEditing,
    temperatureFromEditing,
    showTemperature: (value_C: number) => temperatureFromC(value_C, temperature.value),
    /** A temperature as text in the user's unit, to `digits` decimals at most: "100 °C", "212 °F". */
    formatTemperature: (value_C: number, digits = 1) => `${Number(temperatureFromC(value_C, temperature.value).toFixed(digits))} ${TEMPERATURE_LABEL[temperature.value]}`,
    readTemperature: (value: number) => temperatureToC(value, temperature.value),
    showTemperatureDifference: (value_K: number) => temperatureDifferenceFromK(value_K, temperature.value),
    showLength: (value_m: number) => lengthFromM(value_m, length.value),
    readLength: (value: number) => lengthToM(value, length.value),
  }
})
