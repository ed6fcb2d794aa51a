import { describe, expect, it } from 'vitest'
import { stageAt } from '../../server/planning/stages'
import { pointValue, type PointStage } from '../../shared/pointSeries'

// An oil stage to 40 s, still air to 100 s, then an open-ended last stage.
const ends = [40, 100, null]

describe('stageAt: which stage a curve time belongs to', () => {
  it.each([
    [0, 0, 't = 0, the moment the part enters the first medium'],
    [12.5, 0, 'inside the first stage'],
    [40, 0, 'the first boundary instant belongs to the earlier stage'],
    [40.000001, 1, 'just after the boundary'],
    [100, 1, 'the second boundary instant belongs to the earlier stage'],
    [100.5, 2, 'just after it'],
    [1e7, 2, 'the open-ended last stage runs on without end'],
  ])('t = %f s is stage %i (%s)', (t, stage) => {
    expect(stageAt(t, ends)).toBe(stage)
  })

  it('after a finite last stage its conditions continue, so later times belong to it', () => {
    expect(stageAt(60, [40, 50])).toBe(1)
    expect(stageAt(50, [40, 50])).toBe(1)
  })

  it('a single open-ended stage holds every time', () => {
    expect([0, 1, 1e6].map((t) => stageAt(t, [null]))).toEqual([0, 0, 0])
  })

  it('follows the point series: at a boundary instant a history reads the earlier stage', () => {
    // Two constant stages (no terms), 800 °C to 40 s, then 60 °C: the value tells which stage was read.
    const history: PointStage[] = [
      { start_s: 0, end_s: 40, steady_C: 800, terms: [] },
      { start_s: 40, steady_C: 60, terms: [] },
    ]
    const steady = history.map((s) => s.steady_C)
    for (const t of [0, 20, 40, 40.5, 500]) expect(pointValue(history, t), `t=${t}`).toBe(steady[stageAt(t, [40, null])])
  })
})
