import { z } from 'zod'
import { isDuplicateKey } from './dbErrors'
import { fieldProblems } from './validation'

/** The `[id]` of a library route. */
export const libraryIdParams = z.object({
  id: z.coerce.number({ message: 'Id must be a number' }).int('Id must be a whole number').positive('Id must be positive'),
})

/**
 * `{ field: { from, to } }` for each field whose value differs; JSON comparison so a
 * graded profile (an array) counts as unchanged when its points are equal.
 */
export function changedFields<T extends object>(before: T, after: T, keys: readonly (keyof T & string)[]): Record<string, { from: unknown; to: unknown }> {
  const changes: Record<string, { from: unknown; to: unknown }> = {}
  for (const key of keys) {
    if (JSON.stringify(before[key]) !== JSON.stringify(after[key])) changes[key] = { from: before[key], to: after[key] }
  }
  return changes
}

/** Runs a library write; the unique name index turns a clash into a 409 naming `name`. */
export async function withUniqueName<T>(what: string, work: () => Promise<T>): Promise<T> {
  try {
    return await work()
  } catch (error) {
    if (isDuplicateKey(error)) {
      throw createError({
        statusCode: 409,
        statusMessage: `A ${what} with this name already exists`,
        data: { problems: [{ field: 'name', message: `Another ${what} already has this name` }] },
      })
    }
    throw error
  }
}

/** A patch that is valid field by field but not once merged with the stored record (e.g. low above typical). */
export function mergedRecordInvalid(error: z.ZodError): never {
  const problems = fieldProblems(error)
  throw createError({
    statusCode: 400,
    statusMessage: 'Invalid request body',
    message: problems[0] ? `${problems[0].field}: ${problems[0].message}` : 'Invalid request body',
    data: { problems },
  })
}
