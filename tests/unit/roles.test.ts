import { describe, expect, it } from 'vitest'
import { ROLES, isRole } from '../../shared/roles'

describe('roles', () => {
  it('recognises exactly the four roles', () => {
    expect(ROLES.filter(isRole)).toEqual(['admin', 'metallurgist', 'operator', 'qa'])
    expect(isRole('foreman')).toBe(false)
    expect(isRole(1)).toBe(false)
  })
})
