import { describe, expect, it } from 'vitest'
import { describeAction, describeDetails, fieldName } from '../../shared/auditWords'
import { FURNACE_KIND_LABELS } from '../../shared/labels'
import { retiredWordsIn } from '../support/glossary'

describe('the audit trail in words', () => {
  it.each([
    ['batch.book', 'Booked a load'],
    ['batch.move', 'Moved a booking'],
    ['batch.quenched', 'Recorded Quenching'],
    ['batch.released', 'Recorded Released'],
    ['batch.cancelled', 'Cancelled a booking'],
    ['furnace.create', 'Added a furnace'],
    ['station.update', 'Changed a quench station'],
    ['quenchant.update', 'Changed a quench medium'],
    ['material.create', 'Added a material'],
    ['session.sign-in', 'Signed in'],
  ])('%s reads "%s"', (action, words) => {
    expect(describeAction(action)).toBe(words)
  })

  it('names fields in words with their units, and stored "batch" keys as "load"', () => {
    expect(fieldName('loadNumber')).toBe('load number')
    expect(fieldName('hTypical_W_m2K')).toBe('h typical (W/m2K)')
    expect(fieldName('batchId')).toBe('load id')
  })

  it('writes details as "field: value" lines, nested values and lists in words, and no retired word', () => {
    const lines = describeDetails({ loadNumber: 'KB-2026-00042', active: false, to: { furnace: 'Bay 2 pit furnace', plannedCharge: '2026-12-03T08:00:00.000Z' }, records: ['KB-2026-00001', 'KB-2026-00002'], batchId: 7, comment: null })
    expect(lines).toEqual([
      'load number: KB-2026-00042',
      'active: no',
      'to: furnace Bay 2 pit furnace, planned charge 2026-12-03T08:00:00.000Z',
      'records: KB-2026-00001, KB-2026-00002',
      'load id: 7',
      'comment: —',
    ])
    expect(retiredWordsIn(lines.join('\n'))).toEqual([])
    expect(describeDetails(null)).toEqual([])
    // Stored kind codes read as the pages name them, nested or not.
    expect(describeDetails({ kind: 'still-air', to: { kind: 'car-bottom' } })).toEqual(['kind: Still air', `to: kind ${FURNACE_KIND_LABELS['car-bottom']}`])
  })
})
