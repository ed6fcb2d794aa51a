/**
 * Runs a calibration fit on a worker thread of its own, so a fit of a second or two
 * never holds the request thread: streamed as newline-delimited JSON for the page
 * (shared/types/calibration.ts), ending with the result, a refusal or a failure, or
 * awaited whole when a save fits the request again.
 */
// The route types pull this file into the app's type check too, which does not see server/*.d.ts by itself.
// eslint-disable-next-line @typescript-eslint/triple-slash-reference -- an ambient module declaration cannot be imported
/// <reference path="./fitWorkerUrl.d.ts" />
import { Worker } from 'node:worker_threads'
import { fitWorkerUrl } from '#fit-worker'
import type { FitInput } from '../measurements/fitSchema'
import type { CalibrationMessage as FitMessage, CalibrationProgress } from '../../shared/types/calibration'

/** A fit the page asks for finishes in seconds; one still running after this is stopped. */
export const FIT_TIME_LIMIT_S = 60

export type FitEnd = Exclude<FitMessage, { progress: CalibrationProgress }>

/** Starts a fit; `onProgress` hears each step, `onEnd` the last message exactly once. Returns a stop. */
function startFit(input: FitInput, onProgress: (message: FitMessage) => void, onEnd: (last: FitEnd) => void): () => void {
  let ended = false
  const worker = new Worker(new URL(fitWorkerUrl()), { workerData: input })
  const end = (last: FitEnd) => {
    if (ended) return
    ended = true
    clearTimeout(timer)
    onEnd(last)
    void worker.terminate()
  }
  const timer = setTimeout(() => end({ failed: { message: `the fit ran longer than its ${FIT_TIME_LIMIT_S} s limit and was stopped` } }), FIT_TIME_LIMIT_S * 1000)
  worker.on('message', (message: FitMessage) => ('progress' in message ? onProgress(message) : end(message)))
  worker.on('error', (error: Error) => end({ failed: { message: `the fit stopped: ${error.message}` } }))
  worker.on('exit', () => end({ failed: { message: 'the fit stopped without a result' } }))
  return () => {
    ended = true
    clearTimeout(timer)
    void worker.terminate()
  }
}

export function fitStream(input: FitInput): ReadableStream<Uint8Array> {
  const encoder = new TextEncoder()
  let stop: (() => void) | undefined
  return new ReadableStream<Uint8Array>({
    start(controller) {
      const send = (message: FitMessage) => controller.enqueue(encoder.encode(`${JSON.stringify(message)}\n`))
      stop = startFit(input, send, (last) => {
        send(last)
        controller.close()
      })
    },
    cancel() {
      // The page went away: nobody reads the result.
      stop?.()
    },
  })
}

/** The fit's result, or its refusal or failure, once it has run to the end. */
export function fitOnce(input: FitInput): Promise<FitEnd> {
  return new Promise((resolve) => startFit(input, () => {}, resolve))
}
