import { planLibraryOptions } from '../../planning/plans'

// The materials and quenchants a plan can use, with the values the editor shows beside them.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'library.read')
  return await planLibraryOptions()
})
