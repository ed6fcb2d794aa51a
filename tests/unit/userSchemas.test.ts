import { describe, expect, it } from 'vitest'
import { signInSchema, userCreateSchema, userUpdateSchema } from '../../shared/schemas/user'

const valid = { email: ' Someone@KestrelBay.example ', displayName: 'Some One', role: 'qa', password: 'ten-chars-or-more' }

describe('user schemas', () => {
  it('normalises the e-mail to trimmed lower case', () => {
    expect(userCreateSchema.parse(valid).email).toBe('someone@kestrelbay.example')
  })

  it.each([
    [{ ...valid, email: 'nope' }, 'email', 'Enter a valid e-mail address'],
    [{ ...valid, displayName: 'A' }, 'displayName', 'Name needs at least 2 characters'],
    [{ ...valid, role: 'boss' }, 'role', 'Role must be one of: admin, metallurgist, operator, qa'],
    [{ ...valid, password: 'short' }, 'password', 'Password needs at least 12 characters'],
    [{ ...valid, password: undefined }, 'password', 'Password is required'],
  ])('refuses %j at %s', (input, field, message) => {
    const result = userCreateSchema.safeParse(input)
    expect(result.success).toBe(false)
    expect(result.error!.issues.map((issue) => [issue.path.join('.'), issue.message])).toContainEqual([field, message])
  })

  it('refuses unknown keys instead of ignoring them', () => {
    expect(userCreateSchema.safeParse({ ...valid, passwordHash: 'x' }).success).toBe(false)
  })

  it('an update needs at least one change', () => {
    expect(userUpdateSchema.safeParse({}).success).toBe(false)
    expect(userUpdateSchema.parse({ active: false })).toEqual({ active: false })
  })

  it('sign-in needs a password but does not judge its length', () => {
    expect(signInSchema.safeParse({ email: 'a@b.example', password: '' }).success).toBe(false)
    expect(signInSchema.safeParse({ email: 'a@b.example', password: 'x' }).success).toBe(true)
  })
})
