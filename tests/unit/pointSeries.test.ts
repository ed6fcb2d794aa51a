import { describe, expect, it } from 'vitest'
import { pointValue, pointValues, type PointStage } from '../../shared/pointSeries'

describe('pointValues (curve evaluation by exponential ratios)', () => {
  const stages: PointStage[] = [
    { start_s: 0, end_s: 150, steady_C: 60, terms: [{ amplitude_K: 800, decayRate_per_s: 0.01 }, { amplitude_K: -40, decayRate_per_s: 0.3 }] },
    { start_s: 150, steady_C: 25, terms: [{ amplitude_K: 300, decayRate_per_s: 0.001 }, { amplitude_K: 5, decayRate_per_s: 0.05 }] },
  ]
  it('equals pointValue at every time of a uniform grid with extra times inserted, across a stage boundary', () => {
    const times = [...Array.from({ length: 601 }, (_, i) => (2000 * i) / 600), 150, 151.7, 999.9].sort((a, b) => a - b)
    const values = pointValues(stages, times)
    times.forEach((t, i) => expect(Math.abs(values[i] - pointValue(stages, t))).toBeLessThan(1e-10))
  })
})
