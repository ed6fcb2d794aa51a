/**
 * Runs a calibration fit on a worker thread of its own, so a fit of a second or two
 * never holds the request thread, and streams its progress as newline-delimited JSON
 * (shared/types/calibration.ts), ending with the result, a refusal or a failure.
 */
// The route types pull this file into the app's type check too, which does not see server/*.d.ts by itself.
// eslint-disable-next-line @typescript-eslint/triple-slash-reference -- an ambient module declaration cannot be imported
/// <reference path="./fitWorkerUrl.d.ts" />
import { Worker } from 'node:worker_threads'
import { fitWorkerUrl } from '#fit-worker'
import type { FitInput } from '../measurements/fitSchema'
import type { CalibrationMessage as FitMessage } from '../../shared/types/calibration'

/** A fit the page asks for finishes in seconds; one still running after this is stopped. */
export const FIT_TIME_LIMIT_S = 60

export function fitStream(input: FitInput): ReadableStream<Uint8Array> {
  const encoder = new TextEncoder()
  let worker: Worker | undefined
  return new ReadableStream<Uint8Array>({
    start(controller) {
      let ended = false
      const end = (last?: FitMessage) => {
        if (ended) return
        ended = true
        clearTimeout(timer)
        if (last) controller.enqueue(encoder.encode(`${JSON.stringify(last)}\n`))
        controller.close()
        void worker?.terminate()
      }
      worker = new Worker(new URL(fitWorkerUrl()), { workerData: input })
      const timer = setTimeout(() => end({ failed: { message: `the fit ran longer than its ${FIT_TIME_LIMIT_S} s limit and was stopped` } }), FIT_TIME_LIMIT_S * 1000)
      worker.on('message', (message: FitMessage) => {
        if ('progress' in message) controller.enqueue(encoder.encode(`${JSON.stringify(message)}\n`))
        else end(message)
      })
      worker.on('error', (error: Error) => end({ failed: { message: `the fit stopped: ${error.message}` } }))
      worker.on('exit', () => end({ failed: { message: 'the fit stopped without a result' } }))
    },
    cancel() {
      // The page went away: nobody reads the result.
      void worker?.terminate()
    },
  })
}
