import { createError } from 'h3'
import { isSealKey } from './canonical'

/**
 * What the record service needs from its deployment, built at the edge: from
 * useRuntimeConfig() in the server (server/utils/shopConfig.ts), by the seed script
 * outside Nuxt. Empty values are refused only where they are needed, so a missing
 * key or address stops the records, not every batch move.
 */
export interface RecordConfig {
  /** Seals records and sign-offs (HMAC-SHA-256). */
  sealKey: string
  /** Printed on hold-time sheets. */
  shopName: string
  /** The address people open links in mail at, without a trailing slash. */
  publicOrigin: string
}

/**
 * The public origin: the one configured, else the auth origin without its /api/auth
 * path (it must already be the address browsers use); empty when neither is set.
 */
export function publicOriginOf(configured: string | undefined, authOrigin: string | undefined): string {
  if (configured) return configured.replace(/\/+$/, '')
  if (authOrigin) return authOrigin.replace(/\/api\/auth\/?$/, '').replace(/\/+$/, '')
  return ''
}

export function recordUrl(config: Pick<RecordConfig, 'publicOrigin'>, id: number): string {
  if (!config.publicOrigin) throw new Error('Neither PUBLIC_ORIGIN nor AUTH_ORIGIN is set, so mail cannot link to the record')
  return `${config.publicOrigin}/records/${id}`
}

/**
 * The key that seals records and sign-offs (NUXT_RECORD_SEAL_KEY). Keep it with the
 * server and its backups, apart from the database: with the database alone nobody
 * can re-seal an edited record, and without the key no record can be checked.
 */
export function sealKeyOf(config: Pick<RecordConfig, 'sealKey'>): string {
  if (!isSealKey(config.sealKey)) {
    throw createError({ statusCode: 503, statusMessage: 'Records cannot be sealed or checked: NUXT_RECORD_SEAL_KEY is not set to a secret of at least 32 characters' })
  }
  return config.sealKey
}
