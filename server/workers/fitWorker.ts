/**
 * Worker-thread entry of one calibration fit: fits `workerData` (a fit input) and posts
 * each accepted step, then the result. Bundled on its own by modules/workerEntries.ts,
 * so it imports framework-free code only. A refusal travels as a value (errors lose
 * their class crossing threads).
 */
import { parentPort, workerData } from 'node:worker_threads'
import { runThisThreadInBackground } from './backgroundPriority'
import { fitCoolingLog } from '../measurements/fit'
import { FitError } from '../measurements/fitSchema'
import type { CalibrationMessage as FitMessage } from '../../shared/types/calibration'

runThisThreadInBackground()

const post = (message: FitMessage) => parentPort?.postMessage(message)

try {
  post({ result: fitCoolingLog(workerData, (progress) => post({ progress })) })
} catch (error) {
  if (!(error instanceof FitError)) throw error
  post({ refused: { field: error.field, message: error.message } })
}
