import { describe, expect, it } from 'vitest'
import { dueMoment, newlyDue } from '../../shared/floorAlerts'

describe('the floor alert', () => {
  it.each([
    ['planned', false, null],
    ['charged', false, null],
    ['soaking', false, null],
    ['soaking', true, 'quench'],
    ['charged', true, 'quench'],
    ['quenched', true, null],
    ['cooling', true, null],
    ['ready', false, 'release'],
  ] as const)('%s, counted moment reached %s: %s is due', (state, reached, expected) => {
    expect(dueMoment({ state, reached })).toBe(expected)
  })

  it('announces each load\'s moment once: only the keys not announced before', () => {
    const due = new Map([[1, 'quench' as const], [2, null], [3, 'release' as const]])
    expect(newlyDue(due, new Set())).toEqual(['1:quench', '3:release'])
    expect(newlyDue(due, new Set(['1:quench']))).toEqual(['3:release'])
    expect(newlyDue(due, new Set(['1:quench', '3:release']))).toEqual([])
  })
})
