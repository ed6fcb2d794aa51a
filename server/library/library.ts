// The library has no delete: plans copy the values they used, so an entry that is no
// longer wanted is renamed or annotated instead, and the audit trail keeps its history.
import { asc, eq } from 'drizzle-orm'
import { createError } from 'h3'
import { z } from 'zod'
import type { Database, Transaction } from '../db/client'
import type { materials, quenchants } from '../db/schema'
import { recordAudit } from '../utils/audit'
import { isDuplicateKey } from '../utils/dbErrors'
import { invalidRequest } from '../utils/validation'
import { useDb } from '../utils/db'

/** The `[id]` of a library route. */
export const libraryIdParams = z.object({
  id: z.coerce.number({ message: 'Id must be a number' }).int('Id must be a whole number').positive('Id must be positive'),
})

/**
 * `{ field: { from, to } }` for each field whose value differs; JSON comparison so a
 * graded profile (an array) counts as unchanged when its points are equal.
 */
function changedFields<T extends object>(before: T, after: T, keys: readonly (keyof T & string)[]): Record<string, { from: unknown; to: unknown }> {
  const changes: Record<string, { from: unknown; to: unknown }> = {}
  for (const key of keys) {
    if (JSON.stringify(before[key]) !== JSON.stringify(after[key])) changes[key] = { from: before[key], to: after[key] }
  }
  return changes
}

/** Runs a library write; the unique name index turns a clash into a 409 naming `name`. */
async function withUniqueName<T>(what: string, work: () => Promise<T>): Promise<T> {
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

/** What the library store reads of a row besides the entry's own fields. */
interface Stamped {
  id: number
  createdAt: Date
  updatedAt: Date
}

export type LibraryEntry<V> = V & { id: number; createdAt: string; updatedAt: string }

interface LibraryKind<V extends Record<string, unknown>> {
  table: typeof materials | typeof quenchants
  /** Lower case, as in messages and audit actions: 'material', 'quenchant'. */
  entity: 'material' | 'quenchant'
  /** The entry's fields, in the order the API returns them. */
  fields: readonly (keyof V & string)[]
  /** The full-record schema a merged patch must still pass. */
  schema: z.ZodType<V>
}

/**
 * List, read, create and patch for one kind of library entry, each write audited in
 * its transaction and a name clash answered with a 409 naming `name`.
 */
export function libraryStore<V extends Record<string, unknown>>({ table, entity, fields, schema }: LibraryKind<V>) {
  const notFound = () => createError({ statusCode: 404, statusMessage: `${entity[0].toUpperCase()}${entity.slice(1)} not found` })
  const valuesOf = (source: V): V => Object.fromEntries(fields.map((key) => [key, source[key]])) as V
  // Drizzle types a query on a union of tables loosely; each row read here is one of this kind.
  const toEntry = (row: unknown): LibraryEntry<V> => {
    const stamped = row as Stamped
    return { id: stamped.id, ...valuesOf(row as V), createdAt: stamped.createdAt.toISOString(), updatedAt: stamped.updatedAt.toISOString() }
  }
  const readRow = async (db: Database | Transaction, id: number) => (await db.select().from(table).where(eq(table.id, id)))[0]

  async function updateWithin(tx: Transaction, id: number, patch: Partial<V>, actorId: number): Promise<LibraryEntry<V>> {
    const [before] = await tx.select().from(table).where(eq(table.id, id)).for('update')
    if (!before) throw notFound()
    const current = valuesOf(before as V)
    const merged = schema.safeParse({ ...current, ...patch })
    // Valid field by field but not once merged with the stored record (e.g. low above typical).
    if (!merged.success) invalidRequest(merged.error, 'request body')
    const changes = changedFields(current, merged.data, fields)
    if (Object.keys(changes).length === 0) return toEntry(before)
    const set = Object.fromEntries(Object.keys(changes).map((key) => [key, merged.data[key as keyof V]]))
    await tx.update(table).set(set).where(eq(table.id, id))
    await recordAudit(tx, { actorId, action: `${entity}.update`, entityType: entity, entityId: id, details: changes })
    return toEntry(await readRow(tx, id))
  }

  return {
    async list(): Promise<LibraryEntry<V>[]> {
      const rows = await useDb().select().from(table).orderBy(asc(table.name))
      return rows.map(toEntry)
    },

    async get(id: number): Promise<LibraryEntry<V>> {
      const row = await readRow(useDb(), id)
      if (!row) throw notFound()
      return toEntry(row)
    },

    async create(input: V, actorId: number): Promise<LibraryEntry<V>> {
      const values = valuesOf(input)
      return await withUniqueName(entity, () =>
        useDb().transaction(async (tx) => {
          const [inserted] = await tx.insert(table).values({ ...values, createdBy: actorId } as never).$returningId()
          const id = inserted!.id
          await recordAudit(tx, { actorId, action: `${entity}.create`, entityType: entity, entityId: id, details: values })
          return toEntry(await readRow(tx, id))
        }),
      )
    },

    /** Applies the fields sent; writes and audits only what really changed. */
    async update(id: number, patch: Partial<V>, actorId: number): Promise<LibraryEntry<V>> {
      return await withUniqueName(entity, () => useDb().transaction((tx) => updateWithin(tx, id, patch, actorId)))
    },

    /** The same inside a caller's transaction, for a change that writes more beside it (a calibration's provenance). */
    updateWithin,
  }
}
