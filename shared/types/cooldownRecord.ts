/**
 * A cooldown record: the frozen account of one released load (what was planned, what
 * the floor recorded, what deviated) that QA signs. Written once by the server when
 * the load is released; see server/records/cooldownRecord.ts.
 */
import type { CurvePoint, Deviation, MeasuredTimes, MeasuredTrace, PredictedBand, RecordEvent, RecordEventType } from './records'

export const RECORD_STATES = ['unsigned', 'approved', 'rejected'] as const
export type RecordState = (typeof RECORD_STATES)[number]

export const RECORD_STATE_LABELS: Record<RecordState, string> = {
  unsigned: 'Waiting for sign-off',
  approved: 'Approved',
  rejected: 'Rejected',
}

/** A moment of the record with who recorded it; actorId null for a predicted moment. */
export interface SnapshotEvent extends RecordEvent {
  actorId: number | null
}

/** Everything the record froze at release. Times in seconds, instants ISO 8601 UTC. */
export interface RecordSnapshot {
  /** 2: events say whether they were recorded or predicted, carry corrections, and missing taps are listed. */
  format: 2
  batch: {
    id: number
    loadNumber: string
    reference: string
    partCount: number
    mass_kg: number
    furnace: { id: number; name: string }
    station: { id: number; name: string }
    plannedCharge: string
  }
  plan: {
    planId: number
    name: string
    revisionId: number
    revision: number
    /** The revision's spec as stored, with its copied material and quenchant values. */
    spec: Record<string, unknown>
  }
  predicted: {
    handling_C: number
    /** Soak temperature, or the plan's start temperature when it does no soak planning. */
    furnace_C: number
    heatUp_s: number | null
    minimumSoak_s: number | null
    furnace_s: number
    transfer_s: number
    quench_s: number
    quenchToHandling_s: number
    /** The plan's headline (typical coefficients) time, kept beside the booked one; absent on older records. */
    headlineToHandling_s?: number
    /** In words: where the booked time sits in the quench band (shared/safeHandling.ts); absent on older records. */
    handlingBasis?: string
    quenchDelayAllowance_s: number
    /** The planned end of soak (ready to quench) from the recorded charge and soak start. */
    soakEnd: string
    /** The predicted safe-to-handle moment from the recorded quench. */
    handlingAt: string
    /** Handling-point temperature after the quench starts. */
    curve: CurvePoint[]
    /** The quench band's ends at the handling point, on records with measured traces when it could be computed. */
    band?: PredictedBand
  }
  events: SnapshotEvent[]
  notRecorded: RecordEventType[]
  measured: MeasuredTimes
  /**
   * The load's logs, channel by channel, on the quench's clock (server/records/measuredTraces.ts);
   * absent when no log was attached. Logs close with the sign-off, so the seal covers them.
   */
  measuredTraces?: MeasuredTrace[]
  deviations: Deviation[]
  releasedAt: string
  releasedBy: { id: number; name: string }
}

export type RecordIntegrity = 'intact' | 'altered'

export interface RecordListItem {
  id: number
  batchId: number
  loadNumber: string
  planName: string
  furnaceId: number
  furnaceName: string
  releasedAt: string
  state: RecordState
  deviationCount: number
  signedBy: string | null
  signedAt: string | null
}

export interface RecordDetail extends RecordListItem {
  snapshot: RecordSnapshot
  hash: string
  /** The stored snapshot re-hashed now: "altered" when it no longer matches `hash`, or a signature no longer matches. */
  integrity: RecordIntegrity
  integrityProblems: string[]
  signComment: string | null
  signatureHash: string | null
  /** Whether the signed-in user may sign it, and if not, why. */
  canSign: { ok: boolean; reason: string | null }
}
