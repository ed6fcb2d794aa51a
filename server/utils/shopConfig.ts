import { publicOriginOf, type RecordConfig } from '../records/config'
import type { BookingConfig } from '../schedule/booking'

/**
 * The deployment's settings the domain services take as parameters, read from the
 * runtime config (NUXT_SHOP_NAME, NUXT_LOAD_PREFIX, NUXT_SITE_ORIGIN,
 * NUXT_RECORD_SEAL_KEY). Mail links fall back to AUTH_ORIGIN, which nuxt-auth itself
 * reads from the environment at run time.
 */
export function useShopConfig(): BookingConfig & RecordConfig {
  const config = useRuntimeConfig()
  return {
    shopName: config.shopName,
    loadPrefix: config.loadPrefix,
    sealKey: config.recordSealKey,
    publicOrigin: publicOriginOf(config.siteOrigin, process.env.AUTH_ORIGIN),
  }
}
