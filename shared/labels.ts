/**
 * The words people read for codes the database keeps: equipment kinds and the
 * shop's named spans and settings. One place, so every page, sheet and mail says
 * the same thing (the glossary in DEVELOPERS.md lists them with the words retired).
 */
import type { FurnaceKind } from './schemas/schedule'

export { QUENCHANT_KIND_LABELS as STATION_KIND_LABELS } from './library'
export { ROLE_LABELS } from './roles'

export const FURNACE_KIND_LABELS: Record<FurnaceKind, string> = {
  'box': 'Box furnace',
  'pit': 'Pit furnace',
  'car-bottom': 'Car bottom furnace',
  'vacuum': 'Vacuum furnace',
  'belt': 'Belt furnace',
  'salt-bath': 'Salt bath furnace',
}

/** Named spans and settings, each with one label everywhere. */
export const TERMS = {
  chargeToQuench: 'Charge to quench',
  quenchToHandling: 'Quench to handling',
  quenchToRelease: 'Quench to release',
  quenchDelayAllowance: 'Quench delay allowance',
  handlingPoint: 'Handling point',
  transfer: 'Transfer (furnace door to quench)',
  defaultFurnaceTime: 'Furnace time without soak planning',
  temperWithin: 'Temper within',
} as const
