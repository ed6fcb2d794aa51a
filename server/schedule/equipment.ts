import { asc, eq } from 'drizzle-orm'
import { createError } from 'h3'
import type { z } from 'zod'
import { furnaceStations, furnaces, quenchStations, type FurnaceRow } from '../db/schema'
import type { furnaceInputSchema, stationInputSchema } from '../../shared/schemas/schedule'
import type { Furnace, QuenchStation } from '../../shared/types/schedule'
import type { Transaction } from '../db/client'
import { recordAudit } from '../utils/audit'
import { isDuplicateKey } from '../utils/dbErrors'
import { useDb } from '../utils/db'

type FurnaceData = z.output<typeof furnaceInputSchema>
type StationData = z.output<typeof stationInputSchema>

function nameTaken(): never {
  throw createError({ statusCode: 409, statusMessage: 'Name already in use', data: { problems: [{ field: 'name', message: 'Another one already has this name' }] } })
}

function toFurnace(row: FurnaceRow, stationIds: number[]): Furnace {
  const { createdAt: _c, updatedAt: _u, ...rest } = row
  return { ...rest, stationIds }
}

export async function listFurnaces(): Promise<Furnace[]> {
  const db = useDb()
  const [rows, links] = await Promise.all([db.select().from(furnaces).orderBy(asc(furnaces.name)), db.select().from(furnaceStations)])
  return rows.map((row) => toFurnace(row, links.filter((link) => link.furnaceId === row.id).map((link) => link.stationId).sort((a, b) => a - b)))
}

export async function listStations(): Promise<QuenchStation[]> {
  const rows = await useDb().select().from(quenchStations).orderBy(asc(quenchStations.name))
  return rows.map(({ createdAt: _c, updatedAt: _u, ...rest }) => rest)
}

async function setStations(tx: Transaction, furnaceId: number, stationIds: number[]) {
  await tx.delete(furnaceStations).where(eq(furnaceStations.furnaceId, furnaceId))
  if (stationIds.length === 0) return
  const known = await tx.select({ id: quenchStations.id }).from(quenchStations)
  const unknown = stationIds.filter((id) => !known.some((row) => row.id === id))
  if (unknown.length) {
    throw createError({ statusCode: 400, statusMessage: 'Unknown quench station', data: { problems: [{ field: 'stationIds', message: `No quench station with id ${unknown.join(', ')}` }] } })
  }
  await tx.insert(furnaceStations).values([...new Set(stationIds)].map((stationId) => ({ furnaceId, stationId })))
}

export async function saveFurnace(id: number | null, input: Partial<FurnaceData>, actorId: number): Promise<Furnace> {
  try {
    const savedId = await useDb().transaction(async (tx) => {
      const { stationIds, ...values } = input
      let furnaceId: number
      if (id === null) {
        ;[{ id: furnaceId }] = await tx.insert(furnaces).values(values as FurnaceData).$returningId()
      } else {
        furnaceId = id
        const [before] = await tx.select({ id: furnaces.id }).from(furnaces).where(eq(furnaces.id, furnaceId)).for('update')
        if (!before) throw createError({ statusCode: 404, statusMessage: 'Furnace not found' })
        if (Object.keys(values).length) await tx.update(furnaces).set(values).where(eq(furnaces.id, furnaceId))
      }
      if (stationIds !== undefined) await setStations(tx, furnaceId, stationIds)
      await recordAudit(tx, { actorId, action: id === null ? 'furnace.create' : 'furnace.update', entityType: 'furnace', entityId: furnaceId, details: input })
      return furnaceId
    })
    return (await listFurnaces()).find((furnace) => furnace.id === savedId)!
  } catch (error) {
    if (isDuplicateKey(error)) nameTaken()
    throw error
  }
}

export async function saveStation(id: number | null, input: Partial<StationData>, actorId: number): Promise<QuenchStation> {
  try {
    const savedId = await useDb().transaction(async (tx) => {
      let stationId: number
      if (id === null) {
        ;[{ id: stationId }] = await tx.insert(quenchStations).values(input as StationData).$returningId()
      } else {
        stationId = id
        const [before] = await tx.select({ id: quenchStations.id }).from(quenchStations).where(eq(quenchStations.id, stationId)).for('update')
        if (!before) throw createError({ statusCode: 404, statusMessage: 'Quench station not found' })
        if (Object.keys(input).length) await tx.update(quenchStations).set(input).where(eq(quenchStations.id, stationId))
      }
      await recordAudit(tx, { actorId, action: id === null ? 'station.create' : 'station.update', entityType: 'quench_station', entityId: stationId, details: input })
      return stationId
    })
    return (await listStations()).find((station) => station.id === savedId)!
  } catch (error) {
    if (isDuplicateKey(error)) nameTaken()
    throw error
  }
}
