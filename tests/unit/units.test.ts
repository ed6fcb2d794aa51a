import { describe, expect, it } from 'vitest'
import {
  lengthFromM,
  lengthToM,
  temperatureDifferenceFromK,
  temperatureDifferenceToK,
  temperatureFromC,
  temperatureToC,
} from '../../shared/units'

describe('temperature', () => {
  // Fixed points of the two scales (definition of the Fahrenheit scale, NIST SP 811 §B.8).
  it.each([
    [0, 32],
    [100, 212],
    [-40, -40],
    [850, 1562],
    [60, 140],
  ])('%s °C is %s °F and back', (celsius, fahrenheit) => {
    expect(temperatureFromC(celsius, 'F')).toBe(fahrenheit)
    expect(temperatureToC(fahrenheit, 'F')).toBe(celsius)
  })

  it('a difference of 5 K is 9 °F', () => {
    expect(temperatureDifferenceFromK(5, 'F')).toBe(9)
    expect(temperatureDifferenceToK(9, 'F')).toBe(5)
  })

  it('round-trips shop temperatures both ways to the last bit or one unit in the last place', () => {
    for (let celsius = -50; celsius <= 1250; celsius += 0.5) {
      expect(temperatureToC(temperatureFromC(celsius, 'F'), 'F')).toBeCloseTo(celsius, 12)
      expect(temperatureFromC(temperatureToC(celsius, 'F'), 'F')).toBeCloseTo(celsius, 12)
      expect(temperatureToC(temperatureFromC(celsius, 'C'), 'C')).toBe(celsius)
    }
  })
})

describe('length', () => {
  // 1 in = 25.4 mm exactly (international yard and pound agreement, 1959).
  it.each([
    [0.0254, 'in', 1],
    [0.0254, 'mm', 25.4],
    [0.1016, 'in', 4],
    [0.05, 'mm', 50],
  ] as const)('%s m in %s is %s', (metres, unit, shown) => {
    expect(lengthFromM(metres, unit)).toBeCloseTo(shown, 12)
    expect(lengthToM(shown, unit)).toBeCloseTo(metres, 15)
  })

  it('round-trips sizes from 1 mm to 2 m both ways', () => {
    for (let mm = 1; mm <= 2000; mm += 0.5) {
      const metres = mm / 1000
      for (const unit of ['mm', 'in'] as const) {
        expect(lengthToM(lengthFromM(metres, unit), unit)).toBeCloseTo(metres, 14)
        expect(lengthFromM(lengthToM(mm, unit), unit)).toBeCloseTo(mm, 11)
      }
    }
  })
})
