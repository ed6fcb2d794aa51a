/**
 * Booking rules shared by the server (which enforces them) and the schedule and
 * floor pages (which explain them): batch states and who may move them, the
 * slots a plan revision needs, overlap and the next free start. Pure functions;
 * all times are epoch milliseconds unless the name says seconds.
 */
import { type Capability, can } from './access'
import { ROLE_LABELS, type Role } from './roles'
import { DEFAULT_TOWARD_SLOW_END_PCT, safeToHandle_s } from './safeHandling'
import type { PlanSummary } from './types/plan'

export const BATCH_STATES = ['planned', 'charged', 'soaking', 'unloaded', 'quenched', 'cooling', 'ready', 'released', 'cancelled'] as const
export type BatchState = (typeof BATCH_STATES)[number]

export const BATCH_STATE_LABELS: Record<BatchState, string> = {
  planned: 'Booked',
  charged: 'In furnace',
  soaking: 'Holding at heat',
  unloaded: 'Out of the furnace',
  quenched: 'Quenching',
  cooling: 'Cooling to handling',
  ready: 'Safe to handle',
  released: 'Released',
  cancelled: 'Booking cancelled',
}

/** States in which a batch still holds (or will hold) furnace or station time. */
export const OPEN_STATES: readonly BatchState[] = ['planned', 'charged', 'soaking', 'unloaded', 'quenched', 'cooling', 'ready']
/** The moves people tap on the floor, in process order: the ones a correction may retime. */
export const FLOOR_TAPS: readonly BatchState[] = ['charged', 'soaking', 'unloaded', 'quenched', 'released']
/** States shown on the floor. */
export const FLOOR_STATES: readonly BatchState[] = ['planned', 'charged', 'soaking', 'unloaded', 'quenched', 'cooling', 'ready']

export interface Transition {
  from: readonly BatchState[]
  /** Who may record it (shared/access.ts); null means only the clock moves it (from the plan's times). */
  capability: Capability | null
  /** The floor button's wording. */
  action: string
}

/**
 * The one table of allowed moves. "cooling" and "ready" are reached by the clock:
 * the bath stage ends and the predicted core temperature crosses the handling
 * temperature at times the plan fixes once the quench is recorded.
 */
export const TRANSITIONS: Record<Exclude<BatchState, 'planned'>, Transition> = {
  charged: { from: ['planned'], capability: 'floor.record', action: 'Load charged' },
  soaking: { from: ['charged'], capability: 'floor.record', action: 'Core at heat' },
  unloaded: { from: ['soaking'], capability: 'floor.record', action: 'Out of the furnace' },
  // From "soaking" too: a quench whose door tap was missed is still recorded, and the record says the door time is missing.
  quenched: { from: ['soaking', 'unloaded'], capability: 'floor.record', action: 'Quench started' },
  cooling: { from: ['quenched'], capability: null, action: 'Quench stage over' },
  ready: { from: ['cooling'], capability: null, action: 'Safe to handle' },
  released: { from: ['ready'], capability: 'floor.record', action: 'Release' },
  cancelled: { from: ['planned', 'charged', 'soaking'], capability: 'schedule.book', action: 'Cancel booking' },
}

/** True when `role` may record the move to `requested` at all (whatever the batch's state). */
export function canRecord(role: Role | undefined, requested: Exclude<BatchState, 'planned'>): boolean {
  const capability = TRANSITIONS[requested].capability
  return capability !== null && can(role, capability)
}

export type MoveCheck =
  | { ok: true }
  | { ok: false; status: 403 | 409; message: string }

/**
 * Whether `role` may move a batch from `current` to `requested`. A role that may
 * never record the move gets 403 whatever the state; otherwise the order decides.
 */
export function checkMove(current: BatchState, requested: BatchState, role: Role): MoveCheck {
  if (requested === 'planned') return { ok: false, status: 409, message: `A load cannot go back to ${BATCH_STATE_LABELS.planned}; it is ${BATCH_STATE_LABELS[current]}` }
  const rule = TRANSITIONS[requested]
  if (rule.capability === null) return { ok: false, status: 409, message: `${BATCH_STATE_LABELS[requested]} follows from the plan's times; nobody records it` }
  if (!canRecord(role, requested)) return { ok: false, status: 403, message: `The ${ROLE_LABELS[role]} role cannot record ${BATCH_STATE_LABELS[requested]}` }
  if (!rule.from.includes(current)) {
    return {
      ok: false,
      status: 409,
      message: `The load is ${BATCH_STATE_LABELS[current]}; it cannot move to ${BATCH_STATE_LABELS[requested]}`,
    }
  }
  return { ok: true }
}

/** The one move a floor operator makes next, if any. */
export function nextFloorMove(state: BatchState): Exclude<BatchState, 'planned'> | null {
  const order: [BatchState, Exclude<BatchState, 'planned'>][] = [
    ['planned', 'charged'],
    ['charged', 'soaking'],
    ['soaking', 'unloaded'],
    ['unloaded', 'quenched'],
    ['ready', 'released'],
  ]
  return order.find(([from]) => from === state)?.[1] ?? null
}

/** Shop-wide figures the plan does not carry. Defaults below are this product's, not a standard's. */
export interface ShopSettings {
  /** Furnace door to bath, used between soak end and quench start. */
  transfer_s: number
  /** Furnace time booked when a plan has no soak planning. */
  defaultFurnace_s: number
  /** How long past the end of soak a quench may start before the batch is flagged late. */
  quenchDelayAllowance_s: number
  /** How long after a tap its operator may still correct its time; later, a metallurgist or QA lead corrects it. */
  correctionWindow_s: number
  /** How long after "safe to handle" the load may wait for tempering before it is flagged. */
  temperWithin_s: number
  /** Where "safe to handle" sits between the headline estimate (0) and the slow end of the quench band (100). */
  safeHandlingTowardSlowEnd_pct: number
}

export const DEFAULT_SHOP_SETTINGS: ShopSettings = {
  transfer_s: 60,
  defaultFurnace_s: 4 * 3600,
  quenchDelayAllowance_s: 600,
  correctionWindow_s: 600,
  temperWithin_s: 2 * 3600,
  safeHandlingTowardSlowEnd_pct: DEFAULT_TOWARD_SLOW_END_PCT,
}

/** Durations a booking needs, read from a plan revision's summary and the shop settings. */
export interface SlotDurations {
  furnace_s: number
  /** True when the plan had no soak planning and the shop's default furnace time was used. */
  furnaceIsDefault: boolean
  minimumSoak_s: number | null
  transfer_s: number
  /** Time on the quench station: the plan's first (bath) stage, or the whole cooldown to safe handling if it has one stage only. */
  quench_s: number
  /** Quench to safe to handle: toward the slow end of the band as the shop sets (shared/safeHandling.ts). */
  quenchToHandling_s: number
}

export function slotDurations(summary: PlanSummary, settings: ShopSettings): SlotDurations {
  const bathEnd = summary.firstStageEnd_s === undefined ? summary.handlingPointSeries[0]?.end_s : (summary.firstStageEnd_s ?? undefined)
  const safe_s = safeToHandle_s(summary, settings.safeHandlingTowardSlowEnd_pct)
  return {
    furnace_s: summary.soak?.total_s ?? settings.defaultFurnace_s,
    furnaceIsDefault: summary.soak === null,
    minimumSoak_s: summary.soak?.minimumSoak_s ?? null,
    transfer_s: settings.transfer_s,
    quench_s: bathEnd ?? safe_s,
    quenchToHandling_s: safe_s,
  }
}

/** Where a batch sits on the timeline (epoch ms). Furnace and station hold [start, end). */
export interface Slots {
  furnaceStart: number
  furnaceEnd: number
  quenchStart: number
  quenchEnd: number
  /** Predicted moment the handling point is below the handling temperature. */
  handlingAt: number
}

/** Recorded floor times (epoch ms) that override the plan. */
export interface ActualTimes {
  chargedAt?: number | null
  soakingAt?: number | null
  unloadedAt?: number | null
  quenchedAt?: number | null
}

/**
 * Slots from the planned charge, re-planned from whatever the floor has recorded:
 * a recorded charge moves everything after it; "core at heat" restarts the
 * minimum soak when the plan knows it; a recorded door opening ends the furnace
 * time; a recorded quench fixes bath and cooldown and, without a door tap, frees the
 * furnace one transfer earlier.
 */
export function deriveSlots(plannedCharge: number, d: SlotDurations, actual: ActualTimes = {}): Slots {
  // Whole milliseconds, as the database stores them, so a proposed start books exactly.
  const ms = (seconds: number) => Math.round(seconds * 1000)
  const charge = actual.chargedAt ?? plannedCharge
  let furnaceEnd = charge + ms(d.furnace_s)
  if (actual.soakingAt != null && d.minimumSoak_s !== null) furnaceEnd = actual.soakingAt + ms(d.minimumSoak_s)
  if (actual.unloadedAt != null) furnaceEnd = actual.unloadedAt
  let quenchStart = furnaceEnd + ms(d.transfer_s)
  if (actual.quenchedAt != null) {
    quenchStart = actual.quenchedAt
    furnaceEnd = actual.unloadedAt ?? Math.max(charge, quenchStart - ms(d.transfer_s))
  }
  return {
    furnaceStart: charge,
    furnaceEnd,
    quenchStart,
    quenchEnd: quenchStart + ms(d.quench_s),
    handlingAt: quenchStart + ms(d.quenchToHandling_s),
  }
}

export interface Interval {
  start: number
  end: number
}

/** Half-open intervals: one ending exactly when the next starts do not overlap. */
export function overlaps(a: Interval, b: Interval): boolean {
  return a.start < b.end && b.start < a.end
}

/**
 * The earliest whole-second start at or after `from` at which the furnace holds the
 * load for `furnace_ms` and the station, `stationOffset_ms` after the start, holds it
 * for `station_ms`, clear of every busy interval. The answer is `from` itself or a
 * moment at which some busy interval ends (shifted by the offset for the station),
 * rounded up to the second, so only those candidates need checking. Whole seconds,
 * because a charge time is typed and sent to the second: an offer with milliseconds
 * would come back truncated and collide again.
 */
export function nextFreeStart(
  from: number,
  furnace_ms: number,
  stationOffset_ms: number,
  station_ms: number,
  furnaceBusy: Interval[],
  stationBusy: Interval[],
): number {
  const wholeSecond = (t: number) => Math.ceil(t / 1000) * 1000
  const candidates = [from, ...furnaceBusy.map((b) => b.end), ...stationBusy.map((b) => b.end - stationOffset_ms)]
    .map(wholeSecond)
    .filter((t) => t >= from)
    .sort((a, b) => a - b)
  for (const t of candidates) {
    const furnace = { start: t, end: t + furnace_ms }
    const station = { start: t + stationOffset_ms, end: t + stationOffset_ms + station_ms }
    if (!furnaceBusy.some((b) => overlaps(furnace, b)) && !stationBusy.some((b) => overlaps(station, b))) return t
  }
  // Unreachable: the latest candidate lies past every busy interval.
  throw new Error('no free start found')
}

/**
 * The state the clock has reached for a batch whose quench is recorded: the bath
 * stage ends at quenchEnd, the core is at handling temperature at handlingAt.
 */
export function stateByClock(state: BatchState, slots: Pick<Slots, 'quenchEnd' | 'handlingAt'>, now: number): BatchState {
  if (state === 'quenched' && now >= slots.quenchEnd) state = 'cooling'
  if (state === 'cooling' && now >= slots.handlingAt) state = 'ready'
  return state
}

export interface BatchFlags {
  lateToQuench: boolean
  overdueToTemper: boolean
}

/**
 * Late to quench: not in the quench by soak end (or the recorded door opening)
 * plus the allowance (the plan's own allowance when it states one). Overdue to temper: safe to handle
 * for longer than the shop allows before tempering.
 */
export function batchFlags(state: BatchState, slots: Slots, now: number, quenchDelayAllowance_s: number, temperWithin_s: number): BatchFlags {
  return {
    lateToQuench: (state === 'charged' || state === 'soaking' || state === 'unloaded') && now > slots.furnaceEnd + quenchDelayAllowance_s * 1000,
    overdueToTemper: state === 'ready' && now > slots.handlingAt + temperWithin_s * 1000,
  }
}

/** Shop-unique load number: prefix, year, five-digit sequence within the year. */
export function loadNumber(prefix: string, year: number, sequence: number): string {
  return `${prefix}-${year}-${String(sequence).padStart(5, '0')}`
}
