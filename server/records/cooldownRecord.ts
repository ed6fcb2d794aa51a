/**
 * The cooldown record of a released load, as pure functions: the frozen snapshot from
 * what the batch, its plan revision and its events say at release; the hold-time sheet
 * rendered from that snapshot; the sign-off signature; the integrity check.
 *
 * Recorded and predicted moments. The events list the floor's taps (charge, core at
 * heat, out of the furnace, quench, release) at their corrected times where a tap was
 * corrected, with the original time and every correction beside them, and the moments
 * the plan's clock gives from the recorded quench (out of the quench, ready to handle),
 * marked "predicted". Measured spans and deviations come from the taps alone. The quench
 * delay is the door opening to the quench, as the trade means it; when nobody tapped
 * the door opening the record lists it as not recorded and measures no delay, rather
 * than deriving the moment from the plan.
 */
import { pointValue } from '../../shared/pointSeries'
import { handlingBasis } from '../../shared/safeHandling'
import { deriveSlots, type BatchState, type SlotDurations } from '../../shared/schedule'
import type { PlanSummary } from '../../shared/types/plan'
import type { RecordIntegrity, RecordSnapshot, SnapshotEvent } from '../../shared/types/cooldownRecord'
import type { CurvePoint, EventCorrection, HoldTimeSheet, RecordEventType } from '../../shared/types/records'
import { canonicalJson, hmacSha256Hex, verifyRecordSeal } from './canonical'
import { STANDARD_CAUTIONS } from './cautions'
import { deviationPlanFromSummary, findDeviations, findTraceDeviations, measureTimes, type TracePlan } from './deviations'
import { formatSpan } from './format'
import { alignedTraces, measuredTrace, type LoadLog } from './measuredTraces'
import { bandCurves, slowEndAt, type BandSeries } from './predictedBand'

/** Who a predicted moment is attributed to on the sheet. */
export const CLOCK_NAME = 'Slakewise (plan clock)'

/** The floor taps a record lists, in process order. */
const TAPPED: Partial<Record<BatchState, RecordEventType>> = {
  charged: 'charged',
  soaking: 'soaking',
  unloaded: 'furnace_opened',
  quenched: 'quenched',
  released: 'released',
}
const EXPECTED_TAPS: RecordEventType[] = ['charged', 'soaking', 'furnace_opened', 'quenched', 'released']

export interface SnapshotInput {
  batch: {
    id: number
    loadNumber: string
    reference: string
    partCount: number
    mass_kg: number
    plannedCharge: Date
    quenchDelayAllowance_s: number
  } & SlotDurations
  furnace: { id: number; name: string }
  station: { id: number; name: string }
  plan: { id: number; name: string }
  revision: { id: number; revision: number; spec: Record<string, unknown>; summary: PlanSummary }
  events: { id: number; toState: BatchState; at: Date; actorId: number | null; actorName: string | null; shortfallNote: string | null }[]
  /** Corrections of the events, oldest first. */
  corrections: { eventId: number; correctedAt: Date; reason: string; actorName: string; createdAt: Date }[]
  releasedBy: { id: number; name: string }
  /** The logs attached to the load, oldest first; their traces go on the record. */
  logs?: LoadLog[]
  /** The quench band's ends (predictedBand.ts), computed when the load has logs; null when it could not be. */
  band?: BandSeries | null
}

/**
 * The measured part of a record: traces, the band over the span they are shown on, and
 * the trace rules' deviations. The span reaches past the release so the release tap's
 * reading and the band at that moment are on the chart.
 */
function measuredSection(input: SnapshotInput, quenched_ms: number, released_ms: number) {
  const logs = input.logs ?? []
  if (logs.length === 0) return null
  const band = input.band ?? null
  const quenchToRelease_s = (released_ms - quenched_ms) / 1000
  const plan: TracePlan = {
    handling_C: input.revision.summary.handling_C,
    quenchToHandling_s: input.batch.quenchToHandling_s,
    quenchToRelease_s,
    slowEnd_C: band ? (t) => slowEndAt(band, t) : null,
  }
  const span_s = Math.max(input.batch.quenchToHandling_s * 1.25, quenchToRelease_s * 1.1)
  const traces = alignedTraces(logs, quenched_ms)
  return {
    traces: traces.map((trace) => measuredTrace(trace, plan, span_s)),
    band: band ? bandCurves(band, span_s) : null,
    deviations: findTraceDeviations(plan, traces),
  }
}

/** About 120 points over 1.25 × the predicted time to handling, at least one per second of span. */
export function predictedCurve(summary: PlanSummary, quenchToHandling_s: number): CurvePoint[] {
  const span = quenchToHandling_s * 1.25
  const step = span / 120
  const points: CurvePoint[] = []
  for (let i = 0; i <= 120; i += 1) {
    const t = i * step
    // Rounded so the frozen JSON stays compact; far finer than any thermocouple reads.
    points.push({ t_s: Math.round(t * 1000) / 1000, T_C: Math.round(pointValue(summary.handlingPointSeries, t) * 100) / 100 })
  }
  return points
}

/** A floor tap at its corrected time, with the original time and its corrections beside it. */
function tappedEvent(event: SnapshotInput['events'][number], type: RecordEventType, corrections: SnapshotInput['corrections']): SnapshotEvent {
  const original = event.at.toISOString()
  const own = corrections.filter((c) => c.eventId === event.id)
  const history: EventCorrection[] = []
  let current = original
  for (const c of own) {
    history.push({ from: current, to: c.correctedAt.toISOString(), reason: c.reason, by: c.actorName, madeAt: c.createdAt.toISOString() })
    current = c.correctedAt.toISOString()
  }
  return {
    type,
    at: current,
    by: event.actorName ?? CLOCK_NAME,
    actorId: event.actorId,
    source: 'recorded',
    ...(event.shortfallNote ? { shortfall: event.shortfallNote } : {}),
    ...(history.length ? { originalAt: original, corrections: history } : {}),
  }
}

export function buildSnapshot(input: SnapshotInput): RecordSnapshot {
  const { batch, revision } = input
  const iso = (ms: number) => new Date(ms).toISOString()
  const taps = input.events.flatMap((event) => {
    const type = TAPPED[event.toState]
    return type && event.actorId !== null ? [tappedEvent(event, type, input.corrections)] : []
  })
  const tapAt = (type: RecordEventType) => {
    const found = taps.find((event) => event.type === type)
    return found ? Date.parse(found.at) : null
  }
  const quenched = tapAt('quenched')
  const released = tapAt('released')
  if (quenched === null || released === null) throw new Error(`Load ${batch.loadNumber} has no recorded quench or release`)

  // The batch carries its booked SlotDurations; the plan's moments follow from the recorded ones.
  const actual = { chargedAt: tapAt('charged'), soakingAt: tapAt('soaking'), unloadedAt: tapAt('furnace_opened') }
  const soakEnd = deriveSlots(batch.plannedCharge.getTime(), batch, { chargedAt: actual.chargedAt, soakingAt: actual.soakingAt }).furnaceEnd
  const afterQuench = deriveSlots(batch.plannedCharge.getTime(), batch, { ...actual, quenchedAt: quenched })
  const predictedNote = 'predicted from the recorded quench and the plan, not recorded on the floor'
  const events: SnapshotEvent[] = [
    ...taps,
    { type: 'cooling', at: iso(afterQuench.quenchEnd), by: CLOCK_NAME, actorId: null, source: 'predicted', note: predictedNote },
    { type: 'ready_to_handle', at: iso(afterQuench.handlingAt), by: CLOCK_NAME, actorId: null, source: 'predicted', note: predictedNote },
  ]
  events.sort((a, b) => Date.parse(a.at) - Date.parse(b.at) || EXPECTED_TAPS.indexOf(a.type) - EXPECTED_TAPS.indexOf(b.type))

  const plan = deviationPlanFromSummary(revision.summary, batch.quenchDelayAllowance_s)
  // The batch froze its own durations at booking; they are what the floor worked to.
  plan.minimumSoak_s = batch.minimumSoak_s
  plan.quenchToHandling_s = batch.quenchToHandling_s
  const spec = revision.spec as { start_C?: number }
  const measured = measuredSection(input, quenched, released)
  return {
    format: 2,
    batch: {
      id: batch.id,
      loadNumber: batch.loadNumber,
      reference: batch.reference,
      partCount: batch.partCount,
      mass_kg: batch.mass_kg,
      furnace: input.furnace,
      station: input.station,
      plannedCharge: batch.plannedCharge.toISOString(),
    },
    plan: { planId: input.plan.id, name: input.plan.name, revisionId: revision.id, revision: revision.revision, spec: revision.spec },
    predicted: {
      handling_C: revision.summary.handling_C,
      furnace_C: revision.summary.soak?.furnace_C ?? spec.start_C ?? 0,
      heatUp_s: plan.heatUp_s,
      minimumSoak_s: plan.minimumSoak_s,
      furnace_s: batch.furnace_s,
      transfer_s: batch.transfer_s,
      quench_s: batch.quench_s,
      quenchToHandling_s: batch.quenchToHandling_s,
      headlineToHandling_s: revision.summary.quenchToHandling_s,
      handlingBasis: handlingBasis(batch.quenchToHandling_s, revision.summary),
      quenchDelayAllowance_s: batch.quenchDelayAllowance_s,
      soakEnd: iso(soakEnd),
      handlingAt: iso(afterQuench.handlingAt),
      curve: predictedCurve(revision.summary, batch.quenchToHandling_s),
      ...(measured?.band ? { band: measured.band } : {}),
    },
    events,
    notRecorded: EXPECTED_TAPS.filter((type) => tapAt(type) === null),
    measured: measureTimes(taps),
    ...(measured ? { measuredTraces: measured.traces } : {}),
    deviations: [...findDeviations(plan, taps), ...(measured?.deviations ?? [])],
    releasedAt: iso(released),
    releasedBy: input.releasedBy,
  }
}

type SpecView = {
  part?: { shape?: string; thickness_m?: number; diameter_m?: number; length_m?: number; sides_m?: number[] }
  stages?: { quenchantId: number }[]
  library?: { material?: { name?: string }; quenchants?: { id: number; name: string; bath_C: number }[] }
}

const mm = (m: number | undefined) => `${Math.round((m ?? 0) * 10_000) / 10} mm`

function section(part: SpecView['part']): string {
  switch (part?.shape) {
    case 'plate': return `plate ${mm(part.thickness_m)} thick`
    case 'round-bar': return `bar Ø ${mm(part.diameter_m)}`
    case 'sphere': return `sphere Ø ${mm(part.diameter_m)}`
    case 'cylinder': return `Ø ${mm(part.diameter_m)} × ${mm(part.length_m)}`
    case 'block': return (part.sides_m ?? []).map(mm).join(' × ')
    default: return 'see plan'
  }
}

/** The sheet mailed on release, rendered from the frozen snapshot only, so mail and record say the same. */
export function sheetFromSnapshot(snapshot: RecordSnapshot, shopName: string, signOffUrl?: string): HoldTimeSheet {
  const spec = snapshot.plan.spec as SpecView
  const quenchants = (spec.stages ?? []).map((stage) => spec.library?.quenchants?.find((q) => q.id === stage.quenchantId))
  const p = snapshot.predicted
  return {
    shopName,
    loadNumber: snapshot.batch.loadNumber,
    part: { name: snapshot.plan.name, number: snapshot.batch.reference, quantity: snapshot.batch.partCount, section: section(spec.part) },
    material: spec.library?.material?.name ?? 'see plan',
    furnace: snapshot.batch.furnace.name,
    quenchStation: snapshot.batch.station.name,
    quenchant: quenchants.map((q) => (q ? `${q.name} at ${q.bath_C} °C` : 'see plan')).join(', then '),
    plan: { name: snapshot.plan.name, revision: snapshot.plan.revision },
    planned: {
      heatUp_s: p.heatUp_s,
      minimumSoak_s: p.minimumSoak_s,
      quenchDelayAllowance_s: p.quenchDelayAllowance_s,
      quenchToHandling_s: p.quenchToHandling_s,
      furnace_C: p.furnace_C,
      handling_C: p.handling_C,
    },
    handlingNote: p.handlingBasis && p.headlineToHandling_s !== undefined ? `Predicted handling time: ${p.handlingBasis}; headline estimate ${formatSpan(p.headlineToHandling_s)}.` : null,
    measured: snapshot.measured,
    predictedCurve: p.curve,
    ...(p.band ? { predictedBand: p.band } : {}),
    ...(snapshot.measuredTraces ? { measuredTraces: snapshot.measuredTraces } : {}),
    events: snapshot.events.map(({ actorId: _actorId, ...event }) => event),
    notRecorded: snapshot.notRecorded,
    deviations: snapshot.deviations,
    cautions: [...STANDARD_CAUTIONS],
    generatedAt: snapshot.releasedAt,
    ...(signOffUrl ? { signOffUrl } : {}),
  }
}

export type Decision = 'approved' | 'rejected'

/** The sign-off's seal: HMAC-SHA-256 under the seal key of the record's seal, the decision, the signer and the time, in canonical JSON. */
export function signatureSeal(recordSeal: string, decision: Decision, signerId: number, signedAt: Date, key: string | Buffer): string {
  return hmacSha256Hex(key, canonicalJson({ decision, recordHash: recordSeal, signedAt: signedAt.toISOString(), signerId }))
}

export interface StoredRecord {
  snapshot: unknown
  hash: string
  deviationCount: number
  releasedAt: Date
  state: 'unsigned' | Decision
  signedBy: number | null
  signedAt: Date | null
  signatureHash: string | null
}

/**
 * Re-seals the stored snapshot and re-derives the signature under the seal key. Any mismatch is
 * "altered", with each problem named; the copied list columns are checked too, so a
 * list can never disagree with the record silently.
 */
export function checkIntegrity(row: StoredRecord, key: string | Buffer): { integrity: RecordIntegrity; problems: string[] } {
  const problems: string[] = []
  let snapshotOk: boolean
  try {
    snapshotOk = verifyRecordSeal(row.snapshot, row.hash, key)
  } catch {
    snapshotOk = false
  }
  if (!snapshotOk) problems.push('The snapshot no longer matches the seal written at release')
  const snapshot = row.snapshot as Partial<RecordSnapshot>
  if (!Array.isArray(snapshot.deviations) || snapshot.deviations.length !== row.deviationCount) problems.push('The deviation count differs from the snapshot')
  if (snapshot.releasedAt !== row.releasedAt.toISOString()) problems.push('The release time differs from the snapshot')
  if (row.state !== 'unsigned') {
    const expected = row.signedBy !== null && row.signedAt !== null ? signatureSeal(row.hash, row.state, row.signedBy, row.signedAt, key) : null
    if (expected === null || expected !== row.signatureHash) problems.push('The sign-off no longer matches its signature')
  } else if (row.signedBy !== null || row.signedAt !== null || row.signatureHash !== null) {
    problems.push('An unsigned record carries sign-off data')
  }
  return { integrity: problems.length ? 'altered' : 'intact', problems }
}
