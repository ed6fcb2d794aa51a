import { describe, expect, it } from 'vitest'
import { bookedHeatUp_s, tapShortfall, type GuardTimes } from '../../shared/floorGuards'

// A load tapped early on a tablet: charged 05:05:00 UTC, predicted heat-up 2 min 39 s, minimum soak 2 min.
const charged = Date.parse('2026-03-04T05:05:00Z')
const times: GuardTimes = { chargedAt: charged, furnaceEnd: charged + 279_000, handlingAt: charged + 900_000, heatUp_s: 159, minimumSoak_s: 120 }

describe('tapShortfall', () => {
  it('core at heat 14 s after charging: 2 min 25 s before the predicted heat-up (159 − 14 = 145 s)', () => {
    expect(tapShortfall('charged', 'soaking', times, charged + 14_000)).toEqual({
      rule: 'early_core_at_heat',
      short_s: 145,
      message: 'Core at heat 14 s after charging, 2 min 25 s before the predicted heat-up of 2 min 39 s.',
    })
  })

  it('core at heat at or after the predicted heat-up passes', () => {
    expect(tapShortfall('charged', 'soaking', times, charged + 159_000)).toBeNull()
  })

  it('out of the furnace 100 s before the soak end: 1 min 40 s of the 2 min minimum soak left', () => {
    expect(tapShortfall('soaking', 'unloaded', { ...times, furnaceEnd: charged + 134_000 }, charged + 34_000)).toEqual({
      rule: 'early_out_of_soak',
      short_s: 100,
      message: 'Out of the furnace with 1 min 40 s of the 2 min 00 s minimum soak still to run.',
    })
  })

  it('a quench straight from soak (door tap missed) is guarded the same way; from the door it is not', () => {
    const at = times.furnaceEnd - 30_000
    expect(tapShortfall('soaking', 'quenched', times, at)?.message).toBe('Quench started with 30 s of the 2 min 00 s minimum soak still to run.')
    expect(tapShortfall('unloaded', 'quenched', times, at)).toBeNull()
  })

  it('no minimum soak planned: the default furnace time is no guard', () => {
    expect(tapShortfall('soaking', 'unloaded', { ...times, minimumSoak_s: null, heatUp_s: null }, charged)).toBeNull()
  })

  it('release 45 s before the safe-to-handle time', () => {
    expect(tapShortfall('ready', 'released', times, times.handlingAt - 45_000)).toEqual({ rule: 'early_release', short_s: 45, message: 'Release 45 s before the safe-to-handle time.' })
    expect(tapShortfall('ready', 'released', times, times.handlingAt)).toBeNull()
  })
})

describe('bookedHeatUp_s', () => {
  it('is the booked furnace time less the minimum soak (computePlan: total = heat-up + minimum soak)', () => {
    expect(bookedHeatUp_s({ furnace_s: 279, minimumSoak_s: 120, furnaceIsDefault: false })).toBe(159)
    expect(bookedHeatUp_s({ furnace_s: 14_400, minimumSoak_s: null, furnaceIsDefault: true })).toBeNull()
  })
})
