import { asc, eq } from 'drizzle-orm'
import { quenchantInputSchema, type Quenchant, type QuenchantPatch, type QuenchantValues } from '../../shared/schemas/quenchant'
import { quenchants, type QuenchantRow } from '../db/schema'
import { recordAudit } from './audit'
import { changedFields, mergedRecordInvalid, withUniqueName } from './library'

const QUENCHANT_FIELDS = ['name', 'kind', 'hTypical_W_m2K', 'hLow_W_m2K', 'hHigh_W_m2K', 'bath_C', 'notes', 'source'] as const

function valuesOf(quenchant: QuenchantValues): QuenchantValues {
  return Object.fromEntries(QUENCHANT_FIELDS.map((key) => [key, quenchant[key]])) as QuenchantValues
}

export function toQuenchant(row: QuenchantRow): Quenchant {
  return {
    id: row.id,
    ...valuesOf(row as QuenchantValues),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  }
}

export async function listQuenchants(): Promise<Quenchant[]> {
  const rows = await useDb().select().from(quenchants).orderBy(asc(quenchants.name))
  return rows.map(toQuenchant)
}

export async function getQuenchant(id: number): Promise<Quenchant> {
  const [row] = await useDb().select().from(quenchants).where(eq(quenchants.id, id))
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Quenchant not found' })
  return toQuenchant(row)
}

export async function createQuenchant(input: QuenchantValues, actorId: number): Promise<Quenchant> {
  const values = valuesOf(input)
  return await withUniqueName('quenchant', () =>
    useDb().transaction(async (tx) => {
      const [inserted] = await tx.insert(quenchants).values({ ...values, createdBy: actorId }).$returningId()
      const id = inserted!.id
      await recordAudit(tx, { actorId, action: 'quenchant.create', entityType: 'quenchant', entityId: id, details: values })
      const [row] = await tx.select().from(quenchants).where(eq(quenchants.id, id))
      return toQuenchant(row!)
    }),
  )
}

/** Applies the fields sent; writes and audits only what really changed. */
export async function updateQuenchant(id: number, patch: QuenchantPatch, actorId: number): Promise<Quenchant> {
  return await withUniqueName('quenchant', () =>
    useDb().transaction(async (tx) => {
      const [before] = await tx.select().from(quenchants).where(eq(quenchants.id, id)).for('update')
      if (!before) throw createError({ statusCode: 404, statusMessage: 'Quenchant not found' })
      const current = valuesOf(before as QuenchantValues)
      const merged = quenchantInputSchema.safeParse({ ...current, ...patch })
      if (!merged.success) mergedRecordInvalid(merged.error)
      const changes = changedFields(current, merged.data, QUENCHANT_FIELDS)
      if (Object.keys(changes).length === 0) return toQuenchant(before)
      const set = Object.fromEntries(Object.keys(changes).map((key) => [key, merged.data[key as keyof QuenchantValues]]))
      await tx.update(quenchants).set(set).where(eq(quenchants.id, id))
      await recordAudit(tx, { actorId, action: 'quenchant.update', entityType: 'quenchant', entityId: id, details: changes })
      const [after] = await tx.select().from(quenchants).where(eq(quenchants.id, id))
      return toQuenchant(after!)
    }),
  )
}
