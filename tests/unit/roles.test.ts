import { describe, expect, it } from 'vitest'
import { ROLES, isRole, roleAllows } from '../../shared/roles'

describe('roleAllows', () => {
  it.each([
    ['admin', ['admin'], true],
    ['qa', ['admin'], false],
    ['operator', ['metallurgist', 'operator'], true],
    ['metallurgist', [], true],
    [undefined, [], false],
    [undefined, ['admin'], false],
  ] as const)('%s with %j → %s', (role, allowed, expected) => {
    expect(roleAllows(role, allowed)).toBe(expected)
  })

  it('recognises exactly the four roles', () => {
    expect(ROLES.filter(isRole)).toEqual(['admin', 'metallurgist', 'operator', 'qa'])
    expect(isRole('foreman')).toBe(false)
    expect(isRole(1)).toBe(false)
  })
})
