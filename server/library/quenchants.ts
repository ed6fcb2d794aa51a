import { quenchantInputSchema, type QuenchantValues } from '../../shared/schemas/quenchant'
import { quenchants } from '../db/schema'
import { libraryStore } from './library'

/** A medium's own fields, in the order the API returns them. */
export const QUENCHANT_FIELDS = ['name', 'kind', 'hTypical_W_m2K', 'hLow_W_m2K', 'hHigh_W_m2K', 'bath_C', 'coolingCurves', 'emissivity', 'curveSource', 'notes', 'source'] as const

const store = libraryStore<QuenchantValues>({
  table: quenchants,
  entity: 'quenchant',
  fields: QUENCHANT_FIELDS,
  schema: quenchantInputSchema,
})

export const listQuenchants = store.list
export const getQuenchant = store.get
export const createQuenchant = store.create
export const updateQuenchant = store.update
export const updateQuenchantWithin = store.updateWithin
