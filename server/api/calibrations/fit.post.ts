import { calibrationRequestSchema } from '../../../shared/schemas/calibration'
import { calibrationInput } from '../../measurements/calibration'
import { fitStream } from '../../workers/fitRunner'

// Checked here (400/422 before anything runs); the fit itself runs on a worker thread and streams its progress.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'media.calibrate')
  const request = await readValid(event, calibrationRequestSchema)
  const { input, points, rows } = await calibrationInput(request)
  setResponseHeader(event, 'content-type', 'application/x-ndjson; charset=utf-8')
  setResponseHeader(event, 'x-fit-points', `${points} of ${rows}`)
  return fitStream(input)
})
