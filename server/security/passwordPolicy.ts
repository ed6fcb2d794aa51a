/**
 * What a password must be beyond its length (at least 12, shared/schemas/user.ts): not
 * built from the account's own e-mail or name, and rated at least "safely unguessable"
 * (score 3 of 4, about 10^8 guesses) by the zxcvbn strength estimator with its common
 * passwords, names and keyboard patterns.
 */
import { createError } from 'h3'
import { ZxcvbnFactory } from '@zxcvbn-ts/core'
import { adjacencyGraphs, dictionary } from '@zxcvbn-ts/language-common'

export const MIN_STRENGTH_SCORE = 3

const estimator = new ZxcvbnFactory({ dictionary, graphs: adjacencyGraphs })

export interface PasswordOwner {
  email: string
  displayName: string
}

function squeeze(text: string): string {
  return text.toLowerCase().replace(/[^\p{L}\p{N}]/gu, '')
}

/** Why the password is refused for this account, or null when it is acceptable. */
export function passwordProblem(password: string, owner: PasswordOwner): string | null {
  const candidate = squeeze(password)
  const localPart = squeeze(owner.email.split('@')[0] ?? '')
  const ownWords = [squeeze(owner.email), localPart, squeeze(owner.displayName), ...owner.displayName.split(/\s+/).map(squeeze)]
  if (ownWords.some((word) => word.length >= 3 && candidate.includes(word))) {
    return 'Must not contain the account\'s e-mail or name'
  }
  const rating = estimator.check(password, [owner.email, localPart, owner.displayName, ...owner.displayName.split(/\s+/)])
  if (rating.score < MIN_STRENGTH_SCORE) {
    return 'Too easy to guess: use a longer phrase of unrelated words, or mix in digits and symbols'
  }
  return null
}

/** 422 naming the field when the password is refused. */
export function assertPasswordAcceptable(password: string, owner: PasswordOwner, field = 'password'): void {
  const problem = passwordProblem(password, owner)
  if (problem) {
    throw createError({ statusCode: 422, statusMessage: 'Password refused', data: { problems: [{ field, message: problem }] } })
  }
}
