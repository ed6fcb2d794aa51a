/**
 * The floor poll travels compact: every tablet repeats it every few seconds, so what a
 * plan revision says (name, handling temperature, headline and slow-end times) is sent
 * once per revision rather than once per card, and the browser joins it back here.
 */
import { handlingBasis } from './safeHandling'
import type { FloorBatch, FloorCardWire, FloorPlanFacts, FloorPoll, FloorResponse } from './types/schedule'

export function expandFloorPoll(poll: FloorPoll): FloorResponse {
  return { serverNow: poll.serverNow, settings: poll.settings, batches: poll.batches.map((card) => expandCard(card, poll.plans[card.planRevisionId]!)) }
}

function expandCard({ bookedToHandling_s, ...card }: FloorCardWire, plan: FloorPlanFacts): FloorBatch {
  return {
    ...card,
    planName: plan.planName,
    handling_C: plan.handling_C,
    handlingBasis: handlingBasis(bookedToHandling_s, plan),
    headlineToHandling_s: plan.quenchToHandling_s,
  }
}
