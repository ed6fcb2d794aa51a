/**
 * The moments the floor may want to hear about: a load whose soak is complete (quench
 * now) and a load that is safe to handle (release when ready). Each is keyed by load
 * and moment, so an alert sounds once however often the floor redraws.
 */
import type { CountdownView } from './floorCountdown'

export type DueMoment = 'quench' | 'release'

export function dueMoment(view: Pick<CountdownView, 'state' | 'reached'>): DueMoment | null {
  if ((view.state === 'charged' || view.state === 'soaking') && view.reached) return 'quench'
  if (view.state === 'ready') return 'release'
  return null
}

/** Keys ("12:quench") of the moments due now that were not due before: the ones to announce. */
export function newlyDue(due: ReadonlyMap<number, DueMoment | null>, announced: ReadonlySet<string>): string[] {
  return [...due].flatMap(([id, moment]) => (moment && !announced.has(`${id}:${moment}`) ? [`${id}:${moment}`] : []))
}
