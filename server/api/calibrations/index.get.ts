import { listCalibrations } from '../../measurements/saveCalibration'

// Every role reads the library, and with it where each medium's curves came from.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'library.read')
  return await listCalibrations()
})
