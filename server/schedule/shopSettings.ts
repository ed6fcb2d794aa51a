import type { Database, Transaction } from '../db/client'
import { shopSettings } from '../db/schema'
import { DEFAULT_SHOP_SETTINGS, type ShopSettings } from '../../shared/schedule'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'

/** The shop's scheduling figures: stored values over the product defaults. */
export async function readShopSettings(db: Database | Transaction = useDb()): Promise<ShopSettings> {
  const rows = await db.select().from(shopSettings)
  const settings = { ...DEFAULT_SHOP_SETTINGS }
  for (const row of rows) if (row.key in settings) settings[row.key as keyof ShopSettings] = row.value
  return settings
}

export async function updateShopSettings(change: Partial<ShopSettings>, actorId: number): Promise<ShopSettings> {
  return await useDb().transaction(async (tx) => {
    for (const [key, value] of Object.entries(change)) {
      if (value === undefined) continue
      await tx.insert(shopSettings).values({ key, value, updatedBy: actorId }).onDuplicateKeyUpdate({ set: { value, updatedBy: actorId } })
    }
    await recordAudit(tx, { actorId, action: 'settings.update', entityType: 'shop_settings', details: change })
    return await readShopSettings(tx)
  })
}
