import { calibrationSaveSchema } from '../../../shared/schemas/calibration'
import { saveCalibration } from '../../measurements/saveCalibration'

// The request is the fit's own again: the server fits it on the worker thread and saves what it computed.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'media.calibrate')
  const request = await readValid(event, calibrationSaveSchema)
  setResponseStatus(event, 201)
  return await saveCalibration(request, user)
})
