import { materialInputSchema, type MaterialValues } from '../../shared/schemas/material'
import { materials } from '../db/schema'
import { libraryStore } from './library'

const store = libraryStore<MaterialValues>({
  table: materials,
  entity: 'material',
  fields: ['name', 'k_W_mK', 'density_kg_m3', 'specificHeat_J_kgK', 'propertiesAt_C', 'gradedProfile', 'propertyTable', 'propertyTableSource', 'notes', 'source'],
  schema: materialInputSchema,
})

export const listMaterials = store.list
export const getMaterial = store.get
export const createMaterial = store.create
export const updateMaterial = store.update
