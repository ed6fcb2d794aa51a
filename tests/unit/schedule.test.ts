import { describe, expect, it } from 'vitest'
import { runCase } from '../../server/thermal/runCase'
import { pointValue } from '../../shared/pointSeries'
import { floorCountdown } from '../../shared/floorCountdown'
import {
  BATCH_STATE_LABELS,
  DEFAULT_SHOP_SETTINGS,
  checkMove,
  deriveSlots,
  loadNumber,
  nextFreeStart,
  overlaps,
  slotDurations,
  stateByClock,
  type BatchState,
} from '../../shared/schedule'
import type { Role } from '../../shared/roles'
import { OFFLINE_LIBRARY as lib } from '../support/library'
import { PIN_HEAT_UP_CASE, PIN_QUENCH_CASE, offlineSummary, pinSpec } from '../support/plans'

// Summaries from the planner's own compute, as a saved revision stores them.
const pin = offlineSummary(pinSpec(lib))
// The slot and countdown mechanics are checked against the headline engine run, so these tests book at the
// headline (a shop's 0 %); the default, the quench band's slow end, is checked in safeHandling.test.ts.
const AT_HEADLINE = { ...DEFAULT_SHOP_SETTINGS, safeHandlingTowardSlowEnd_pct: 0 }
/** A Ø120 bar, 600 s in oil then still air, without soak planning. */
const flange = offlineSummary({
  ...pinSpec(lib),
  name: 'Bar Ø120 oil then air, no soak planning',
  part: { shape: 'round-bar', diameter_m: 0.12 },
  stages: [{ quenchantId: lib.oilId, duration_s: 600 }, { quenchantId: lib.airId }],
  handling: { below_C: 80, at: 'centre' },
  soak: null,
})
const charge = Date.UTC(2031, 2, 3, 6, 0, 0)

describe('slot derivation from a planner-computed summary', () => {
  it('the pin plan: furnace = heat-up + minimum soak, 60 s transfer, bath = first stage (180 s), handling from the quench start', () => {
    const d = slotDurations(pin, AT_HEADLINE)
    const quench = runCase(PIN_QUENCH_CASE)
    const heat = runCase(PIN_HEAT_UP_CASE)
    expect(d.furnace_s).toBeCloseTo(heat.targetTime_s! + 1800, 9)
    expect(d.quench_s).toBe(180)
    expect(d.transfer_s).toBe(60)
    expect(d.quenchToHandling_s).toBeCloseTo(quench.targetTime_s!, 9)
    const slots = deriveSlots(charge, d)
    expect(slots.furnaceStart).toBe(charge)
    expect(slots.furnaceEnd).toBe(charge + Math.round(d.furnace_s * 1000))
    expect(slots.quenchStart - slots.furnaceEnd).toBe(60_000)
    expect(slots.quenchEnd - slots.quenchStart).toBe(180_000)
    expect(slots.handlingAt - slots.quenchStart).toBe(Math.round(quench.targetTime_s! * 1000))
    // At the handling time the series the floor evaluates gives exactly the handling temperature.
    expect(pointValue(pin.handlingPointSeries, pin.quenchToHandling_s)).toBeCloseTo(100, 6)
  })

  it('heat-up agrees with the lumped-capacitance closed form t = (ρcR/2h)·ln((T∞−T0)/(T∞−T)) within 3 % at Bi = hR/k = 0.06', () => {
    // Lumped body, rod of radius R: V/A = R/2. Source: Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, eq. 5.6.
    const lumped = ((7850 * 475 * 0.02) / (2 * 120)) * Math.log((860 - 20) / (860 - 850))
    expect(lumped).toBeCloseTo(1376.8, 1)
    expect(pin.soak!.heatUp_s / lumped).toBeGreaterThan(1)
    expect(pin.soak!.heatUp_s / lumped).toBeLessThan(1.03)
  })

  it('a plan without soak planning books the shop default furnace time and says so', () => {
    const d = slotDurations(flange, DEFAULT_SHOP_SETTINGS)
    expect(flange.soak).toBeNull()
    expect(d).toMatchObject({ furnace_s: 4 * 3600, furnaceIsDefault: true, minimumSoak_s: null, quench_s: 600 })
  })

  it('a single-stage quench holds the station until handling', () => {
    const single = offlineSummary({ ...pinSpec(lib), stages: [{ quenchantId: lib.oilId }] })
    expect(single.handlingPointSeries).toHaveLength(1)
    expect(slotDurations(single, AT_HEADLINE).quench_s).toBe(single.quenchToHandling_s)
  })

  it('recorded floor times re-plan the later slots', () => {
    const d = slotDurations(pin, AT_HEADLINE)
    const late = charge + 45 * 60_000
    const charged = deriveSlots(charge, d, { chargedAt: late })
    expect(charged.furnaceStart).toBe(late)
    expect(charged.furnaceEnd - late).toBe(Math.round(d.furnace_s * 1000))
    const atHeat = late + 1500_000
    const soaking = deriveSlots(charge, d, { chargedAt: late, soakingAt: atHeat })
    expect(soaking.furnaceEnd).toBe(atHeat + 1800_000)
    const quenched = late + 3 * 3600_000
    const inBath = deriveSlots(charge, d, { chargedAt: late, soakingAt: atHeat, quenchedAt: quenched })
    expect(inBath).toMatchObject({ furnaceEnd: quenched - 60_000, quenchStart: quenched, quenchEnd: quenched + 180_000 })
    expect(inBath.handlingAt - quenched).toBe(Math.round(d.quenchToHandling_s * 1000))
  })
})

describe('state moves', () => {
  const rows: [BatchState, BatchState, Role, 'ok' | 403 | 409][] = [
    ['planned', 'charged', 'operator', 'ok'],
    ['planned', 'charged', 'admin', 'ok'],
    ['planned', 'charged', 'metallurgist', 403],
    ['planned', 'charged', 'qa', 403],
    ['charged', 'soaking', 'operator', 'ok'],
    ['soaking', 'quenched', 'operator', 'ok'],
    ['planned', 'quenched', 'operator', 409],
    ['charged', 'quenched', 'operator', 409],
    ['soaking', 'charged', 'operator', 409],
    ['quenched', 'cooling', 'operator', 409],
    ['cooling', 'ready', 'admin', 409],
    ['ready', 'released', 'operator', 'ok'],
    ['cooling', 'released', 'operator', 409],
    ['released', 'planned', 'admin', 409],
    ['planned', 'cancelled', 'metallurgist', 'ok'],
    ['soaking', 'cancelled', 'admin', 'ok'],
    ['quenched', 'cancelled', 'metallurgist', 409],
    ['planned', 'cancelled', 'operator', 403],
  ]
  it.each(rows)('%s → %s by %s: %s', (from, to, role, expected) => {
    const verdict = checkMove(from, to, role)
    if (expected === 'ok') expect(verdict).toEqual({ ok: true })
    else {
      expect(verdict).toMatchObject({ ok: false, status: expected })
      if (expected === 409 && !['cooling', 'ready', 'planned'].includes(to)) expect(!verdict.ok && verdict.message).toBe(`The load is ${BATCH_STATE_LABELS[from]}; it cannot move to ${BATCH_STATE_LABELS[to]}`)
    }
  })

  it('the clock moves a quenched batch to cooling at the end of the bath and to ready at handling time', () => {
    const slots = { quenchEnd: 1000, handlingAt: 5000 }
    expect(stateByClock('quenched', slots, 999)).toBe('quenched')
    expect(stateByClock('quenched', slots, 1000)).toBe('cooling')
    expect(stateByClock('quenched', slots, 5000)).toBe('ready')
    expect(stateByClock('soaking', slots, 9000)).toBe('soaking')
  })
})

describe('overlap and the next free start', () => {
  /** Times are epoch ms; the offers are whole seconds. */
  const S = 1000
  it.each([
    [{ start: 0, end: 10 }, { start: 10, end: 20 }, false],
    [{ start: 0, end: 10 }, { start: 9, end: 20 }, true],
    [{ start: 5, end: 6 }, { start: 0, end: 20 }, true],
    [{ start: 0, end: 10 }, { start: -5, end: 0 }, false],
  ])('%j and %j overlap: %s (half-open)', (a, b, expected) => {
    expect(overlaps(a, b)).toBe(expected)
    expect(overlaps(b, a)).toBe(expected)
  })

  it('a free request keeps its start', () => {
    expect(nextFreeStart(100 * S, 50 * S, 60 * S, 10 * S, [{ start: 0, end: 100 * S }], [])).toBe(100 * S)
  })
  it('after a furnace booking: starts when it ends', () => {
    expect(nextFreeStart(100 * S, 50 * S, 60 * S, 10 * S, [{ start: 80 * S, end: 130 * S }], [])).toBe(130 * S)
  })
  it('skips a gap too short for the furnace time', () => {
    expect(nextFreeStart(0, 50 * S, 60 * S, 10 * S, [{ start: 10 * S, end: 40 * S }, { start: 70 * S, end: 200 * S }], [])).toBe(200 * S)
  })
  it('the station decides when its bath slot is taken: start = station end − offset', () => {
    // furnace free; bath wanted at t+60 for 10, station busy 150–190 → t = 130 puts the bath at 190.
    expect(nextFreeStart(100 * S, 50 * S, 60 * S, 10 * S, [], [{ start: 150 * S, end: 190 * S }])).toBe(130 * S)
  })
  it('offers whole seconds: a busy end at 15:58:12.421 gives 15:58:13.000, and that start is free', () => {
    const end = Date.parse('2026-12-03T15:58:12.421Z')
    const offered = nextFreeStart(end - 60 * S, 30 * S, 40 * S, 10 * S, [{ start: end - 100 * S, end }], [])
    expect(new Date(offered).toISOString()).toBe('2026-12-03T15:58:13.000Z')
    expect(overlaps({ start: offered, end: offered + 30 * S }, { start: end - 100 * S, end })).toBe(false)
  })
  it('load numbers are prefix-year-five digits', () => {
    expect(loadNumber('KB', 2026, 42)).toBe('KB-2026-00042')
  })
})

describe('floor countdown', () => {
  const d = slotDurations(pin, AT_HEADLINE)
  const quenchedAt = charge + 3600_000
  const slots = deriveSlots(charge, d, { chargedAt: charge, quenchedAt })
  const batch = { ...slots, state: 'quenched' as BatchState, quenchedAt, quenchDelayAllowance_s: 600, summary: pin }

  it('right after the quench it counts the engine time to handling and predicts the core temperature', () => {
    const view = floorCountdown(batch, quenchedAt, 7200)
    expect(view.seconds).toBeCloseTo(pin.quenchToHandling_s, 2)
    expect(view.coreNow_C).toBeCloseTo(pointValue(pin.handlingPointSeries, 0), 9)
    const later = floorCountdown(batch, quenchedAt + 60_000, 7200)
    expect(later.coreNow_C).toBeCloseTo(pointValue(pin.handlingPointSeries, 60), 9)
    expect(later.seconds).toBeCloseTo(pin.quenchToHandling_s - 60, 2)
  })
  it('the caption names the handling temperature in the reader\'s unit (°F by definition: 100 °C = 212 °F)', () => {
    expect(floorCountdown(batch, quenchedAt, 7200).caption).toBe(`until the core is below ${pin.handling_C} °C`)
    const fahrenheit = (c: number) => `${(c * 9) / 5 + 32} °F`
    expect(pin.handling_C).toBe(100)
    expect(floorCountdown(batch, quenchedAt, 7200, fahrenheit).caption).toBe('until the core is below 212 °F')
  })
  it('at zero the core is at 100 °C; this plan keeps the load in the bath until its 180 s stage ends, then it is safe to handle', () => {
    const atZero = floorCountdown(batch, slots.handlingAt, 7200)
    expect(atZero.reached).toBe(true)
    expect(atZero.coreNow_C).toBeCloseTo(100, 3)
    expect(atZero.state).toBe('quenched')
    const out = floorCountdown(batch, slots.quenchEnd, 7200)
    expect(out.state).toBe('ready')
    expect(out.next).toBe('released')
    expect(out.seconds).toBeCloseTo(7200 - (slots.quenchEnd - slots.handlingAt) / 1000, 6)
    expect(floorCountdown(batch, slots.handlingAt + 7200_001, 7200).flags.overdueToTemper).toBe(true)
    expect(floorCountdown(batch, slots.handlingAt + 7199_999, 7200).flags.overdueToTemper).toBe(false)
  })
  it('in the furnace it counts to heat-up plus minimum soak, and flags a quench later than the allowance', () => {
    const inFurnace = { ...batch, state: 'soaking' as BatchState, quenchedAt: null, ...deriveSlots(charge, d, { chargedAt: charge }) }
    expect(floorCountdown(inFurnace, charge, 7200).seconds).toBeCloseTo(pin.soak!.total_s, 2)
    expect(floorCountdown(inFurnace, inFurnace.furnaceEnd + 600_000, 7200).flags.lateToQuench).toBe(false)
    expect(floorCountdown(inFurnace, inFurnace.furnaceEnd + 600_001, 7200).flags.lateToQuench).toBe(true)
  })
})
