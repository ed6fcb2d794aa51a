import { quenchantInputSchema, type QuenchantValues } from '../../shared/schemas/quenchant'
import { quenchants } from '../db/schema'
import { libraryStore } from './library'

const store = libraryStore<QuenchantValues>({
  table: quenchants,
  entity: 'quenchant',
  fields: ['name', 'kind', 'hTypical_W_m2K', 'hLow_W_m2K', 'hHigh_W_m2K', 'bath_C', 'coolingCurves', 'emissivity', 'curveSource', 'notes', 'source'],
  schema: quenchantInputSchema,
})

export const listQuenchants = store.list
export const getQuenchant = store.get
export const createQuenchant = store.create
export const updateQuenchant = store.update
export const updateQuenchantWithin = store.updateWithin
