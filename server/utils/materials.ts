// The library has no delete: plans copy the values they used, so an entry that is no
// longer wanted is renamed or annotated instead, and the audit trail keeps its history.
import { asc, eq } from 'drizzle-orm'
import { materialInputSchema, type Material, type MaterialPatch, type MaterialValues } from '../../shared/schemas/material'
import { materials, type MaterialRow } from '../db/schema'
import { recordAudit } from './audit'
import { changedFields, mergedRecordInvalid, withUniqueName } from './library'

const MATERIAL_FIELDS = ['name', 'k_W_mK', 'density_kg_m3', 'specificHeat_J_kgK', 'propertiesAt_C', 'gradedProfile', 'notes', 'source'] as const

function valuesOf(material: MaterialValues): MaterialValues {
  return Object.fromEntries(MATERIAL_FIELDS.map((key) => [key, material[key]])) as MaterialValues
}

export function toMaterial(row: MaterialRow): Material {
  return {
    id: row.id,
    ...valuesOf(row as MaterialValues),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  }
}

export async function listMaterials(): Promise<Material[]> {
  const rows = await useDb().select().from(materials).orderBy(asc(materials.name))
  return rows.map(toMaterial)
}

export async function getMaterial(id: number): Promise<Material> {
  const [row] = await useDb().select().from(materials).where(eq(materials.id, id))
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Material not found' })
  return toMaterial(row)
}

export async function createMaterial(input: MaterialValues, actorId: number): Promise<Material> {
  const values = valuesOf(input)
  return await withUniqueName('material', () =>
    useDb().transaction(async (tx) => {
      const [inserted] = await tx.insert(materials).values({ ...values, createdBy: actorId }).$returningId()
      const id = inserted!.id
      await recordAudit(tx, { actorId, action: 'material.create', entityType: 'material', entityId: id, details: values })
      const [row] = await tx.select().from(materials).where(eq(materials.id, id))
      return toMaterial(row!)
    }),
  )
}

/** Applies the fields sent; writes and audits only what really changed. */
export async function updateMaterial(id: number, patch: MaterialPatch, actorId: number): Promise<Material> {
  return await withUniqueName('material', () =>
    useDb().transaction(async (tx) => {
      const [before] = await tx.select().from(materials).where(eq(materials.id, id)).for('update')
      if (!before) throw createError({ statusCode: 404, statusMessage: 'Material not found' })
      const current = valuesOf(before as MaterialValues)
      const merged = materialInputSchema.safeParse({ ...current, ...patch })
      if (!merged.success) mergedRecordInvalid(merged.error)
      const changes = changedFields(current, merged.data, MATERIAL_FIELDS)
      if (Object.keys(changes).length === 0) return toMaterial(before)
      const set = Object.fromEntries(Object.keys(changes).map((key) => [key, merged.data[key as keyof MaterialValues]]))
      await tx.update(materials).set(set).where(eq(materials.id, id))
      await recordAudit(tx, { actorId, action: 'material.update', entityType: 'material', entityId: id, details: changes })
      const [after] = await tx.select().from(materials).where(eq(materials.id, id))
      return toMaterial(after!)
    }),
  )
}
