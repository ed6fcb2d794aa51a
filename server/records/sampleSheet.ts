/**
 * A complete hold-time sheet for a fictional load, under the shop's own name: the
 * admin's test sheet, which checks the mail path without releasing a load.
 * The events are placed before `now`; the transfer to the quench is deliberately slow
 * so the sheet shows a deviation.
 */
import { pointValue, type PointStage } from '../../shared/pointSeries'
import type { CurvePoint, DeviationPlan, HoldTimeSheet, RecordEvent } from '../../shared/types/records'
import { STANDARD_CAUTIONS } from './cautions'
import { findDeviations, measureTimes } from './deviations'

const BATH_C = 60
const START_C = 850
const HANDLING_C = 120
const DECAY_PER_S = 1 / 380

// One-term cooling of the handling point in oil: T(t) = bath + (start − bath)·e^(−t/380 s).
const series: PointStage[] = [{ start_s: 0, steady_C: BATH_C, terms: [{ amplitude_K: START_C - BATH_C, decayRate_per_s: DECAY_PER_S }] }]

/** Where the one-term curve crosses the handling temperature: t = ln((T0 − Tb)/(Th − Tb)) / k. */
const QUENCH_TO_HANDLING_S = Math.log((START_C - BATH_C) / (HANDLING_C - BATH_C)) / DECAY_PER_S

export function sampleHoldTimeSheet(input: { loadNumber: string; shopName: string; now?: Date }): HoldTimeSheet {
  const now = (input.now ?? new Date()).getTime()
  const plan: DeviationPlan = { heatUp_s: 70 * 60, minimumSoak_s: 60 * 60, quenchDelayAllowance_s: 30, quenchToHandling_s: QUENCH_TO_HANDLING_S }

  const released = now - 5 * 60_000
  const quenched = released - 20 * 60_000
  const opened = quenched - 52_000
  const soaking = opened - 65 * 60_000
  const charged = soaking - 72 * 60_000
  const iso = (ms: number) => new Date(ms).toISOString()
  const events: RecordEvent[] = [
    { type: 'charged', at: iso(charged), by: 'Tomas Vidal', source: 'recorded' },
    { type: 'soaking', at: iso(soaking), by: 'Tomas Vidal', source: 'recorded', note: 'core thermocouple at 845 °C' },
    { type: 'furnace_opened', at: iso(opened), by: 'Tomas Vidal', source: 'recorded' },
    { type: 'quenched', at: iso(quenched), by: 'Tomas Vidal', source: 'recorded', note: 'crane held at the door' },
    { type: 'ready_to_handle', at: iso(quenched + Math.ceil(QUENCH_TO_HANDLING_S) * 1000), by: 'Slakewise (plan clock)', source: 'predicted' },
    { type: 'released', at: iso(released), by: 'June Halvorsen', source: 'recorded' },
  ]
  const tapped = events.filter((event) => event.source === 'recorded')

  const curveEnd = Math.ceil((QUENCH_TO_HANDLING_S * 1.25) / 30) * 30
  const predictedCurve: CurvePoint[] = []
  for (let t = 0; t <= curveEnd; t += 30) predictedCurve.push({ t_s: t, T_C: pointValue(series, t) })

  return {
    shopName: input.shopName,
    loadNumber: input.loadNumber,
    part: { name: 'Drive flange', number: 'KB-DF-220', quantity: 24, section: 'Ø 80 mm × 120 mm' },
    material: '42CrMo4 (1.7225)',
    furnace: 'Pit furnace 2',
    quenchStation: 'Oil tank A',
    quenchant: `medium-speed quench oil at ${BATH_C} °C`,
    plan: { name: 'Drive flange, harden', revision: 3 },
    planned: { ...plan, furnace_C: 850, handling_C: HANDLING_C },
    // The one-term sample has no quench band to take a slow end from.
    handlingNote: null,
    measured: measureTimes(tapped),
    predictedCurve,
    events,
    notRecorded: [],
    deviations: findDeviations(plan, tapped),
    cautions: [...STANDARD_CAUTIONS],
    generatedAt: new Date(now).toISOString(),
  }
}
