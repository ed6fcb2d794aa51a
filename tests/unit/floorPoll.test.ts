import { describe, expect, it } from 'vitest'
import { expandFloorPoll } from '../../shared/floorPoll'
import { DEFAULT_SHOP_SETTINGS } from '../../shared/schedule'
import type { FloorCardWire, FloorPoll } from '../../shared/types/schedule'

const card = (id: number, planRevisionId: number, bookedToHandling_s: number): FloorCardWire => ({
  id,
  loadNumber: `KB-${id}`,
  planRevisionId,
  partCount: 4,
  mass_kg: 12,
  reference: `WO-${id}`,
  state: 'planned',
  furnaceStart: 0,
  furnaceEnd: 3_600_000,
  quenchEnd: 3_900_000,
  handlingAt: 5_000_000,
  quenchedAt: null,
  furnaceName: 'Box 1',
  stationName: 'Oil tank',
  bookedToHandling_s,
  quenchDelayAllowance_s: 30,
  taps: [],
})

describe('the floor poll as the browser expands it', () => {
  const poll: FloorPoll = {
    serverNow: 1,
    settings: DEFAULT_SHOP_SETTINGS,
    plans: {
      7: { planName: 'Drive pin', handling_C: 50, quenchToHandling_s: 900, slowEndToHandling_s: 1200 },
      8: { planName: 'Flange', handling_C: 60, quenchToHandling_s: 400 },
    },
    batches: [card(1, 7, 1200), card(2, 7, 1050), card(3, 8, 400)],
  }
  const [slowEnd, halfway, legacy] = expandFloorPoll(poll).batches

  it('joins each card with its plan revision, sent once for all its loads', () => {
    expect(slowEnd).toMatchObject({ id: 1, planName: 'Drive pin', handling_C: 50, headlineToHandling_s: 900 })
    expect(legacy).toMatchObject({ id: 3, planName: 'Flange', handling_C: 60, headlineToHandling_s: 400 })
    expect(slowEnd).not.toHaveProperty('bookedToHandling_s')
  })

  it('words the basis from the booked time: slow end, a share of the way to it, or a revision without a band', () => {
    expect(slowEnd!.handlingBasis).toBe('safe-to-handle at the slow end of the quench band')
    // (1050 − 900) / (1200 − 900) = 50 %
    expect(halfway!.handlingBasis).toBe('safe-to-handle 50 % of the way from the headline estimate to the slow end of the quench band, as the shop set')
    expect(legacy!.handlingBasis).toMatch(/^safe-to-handle at the headline estimate \(the plan revision predates/)
  })
})
