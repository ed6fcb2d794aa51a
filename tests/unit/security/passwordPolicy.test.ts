import { describe, expect, it } from 'vitest'
import { passwordProblem } from '../../../server/security/passwordPolicy'

// The reference is the zxcvbn strength estimator (@zxcvbn-ts/core with its common
// dictionaries): scores below 3 of 4 are refused.
const owner = { email: 'june.halvorsen@kestrelbay.example', displayName: 'June Halvorsen' }

describe('password rules beyond length', () => {
  it.each([
    ['one letter twelve times', 'aaaaaaaaaaaa', /Too easy to guess/],
    ['the account\'s own e-mail', 'june.halvorsen@kestrelbay.example', /e-mail or name/],
    ['the e-mail\'s local part with digits', 'junehalvorsen2026', /e-mail or name/],
    ['the name', 'Halvorsen-June!', /e-mail or name/],
    ['a common password with digits', 'password1234', /Too easy to guess/],
    ['a keyboard row', 'qwertyuiop12', /Too easy to guess/],
    ['l33t of a dictionary word', 'Tr4nsf0rm3r!!', /Too easy to guess/],
  ])('refuses %s', (_label, password, message) => {
    expect(passwordProblem(password, owner)).toMatch(message)
  })

  it.each(['Quarry-lantern-47-bellows', 'correct horse battery staple', 'kestrel-admin-1x9'])('accepts %s', (password) => {
    expect(passwordProblem(password, owner)).toBeNull()
  })
})
