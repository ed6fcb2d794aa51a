/**
 * Start-up checks of the server's two secrets. A placeholder copied from .env.example,
 * a short value or a guessable one would let anyone forge session tokens (auth secret)
 * or re-seal an edited cooldown record (seal key), so the server refuses to start.
 */
import { ZxcvbnFactory } from '@zxcvbn-ts/core'
import { adjacencyGraphs, dictionary } from '@zxcvbn-ts/language-common'

export const MIN_SECRET_LENGTH = 32
/** About 2^66 guesses: out of reach of any offline search. */
export const MIN_SECRET_GUESSES_LOG10 = 20

const PLACEHOLDERS = ['change-me', 'changeme', 'replace-me', 'your-secret', 'placeholder', 'example']

const estimator = new ZxcvbnFactory({ dictionary, graphs: adjacencyGraphs })

export interface SecretSpec {
  name: string
  value: string | undefined
  hint: string
}

/** Why the secret is refused, or null. */
export function secretProblem(value: string | undefined): string | null {
  if (!value) return 'is not set'
  const lower = value.toLowerCase()
  const placeholder = PLACEHOLDERS.find((word) => lower.includes(word))
  if (placeholder) return `still holds a placeholder ("${placeholder}")`
  if (value.length < MIN_SECRET_LENGTH) return `has ${value.length} characters; at least ${MIN_SECRET_LENGTH} are needed`
  if (estimator.check(value.slice(0, 100)).guessesLog10 < MIN_SECRET_GUESSES_LOG10) return 'is too easy to guess (repeats or common words)'
  return null
}

/** One message per refused secret, each saying how to make a good one. */
export function secretProblems(secrets: SecretSpec[]): string[] {
  return secrets.flatMap(({ name, value, hint }) => {
    const problem = secretProblem(value)
    return problem ? [`${name} ${problem}. ${hint}`] : []
  })
}
