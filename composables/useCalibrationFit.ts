import type { CalibrationMessage, CalibrationProgress, CalibrationResult } from '~~/shared/types/calibration'
import type { CalibrationRequest } from '~~/shared/schemas/calibration'

/**
 * Runs a calibration fit (POST /api/calibrations/fit) and reads its stream of JSON
 * lines as they come: `progress` after each step, then `result` or `problem`.
 */
export function useCalibrationFit() {
  const running = ref(false)
  const progress = ref<CalibrationProgress | null>(null)
  const result = shallowRef<CalibrationResult | null>(null)
  const problem = ref<string | null>(null)
  const points = ref('')

  function take(message: CalibrationMessage) {
    if ('progress' in message) progress.value = message.progress
    else if ('result' in message) result.value = message.result
    else if ('refused' in message) problem.value = message.refused.message
    else problem.value = message.failed.message
  }

  async function run(request: CalibrationRequest) {
    running.value = true
    progress.value = null
    result.value = null
    problem.value = null
    try {
      const response = await fetch('/api/calibrations/fit', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(request) })
      if (!response.ok || !response.body) {
        const body = await response.json().catch(() => null)
        const first = body?.data?.problems?.[0]
        problem.value = first ? `${first.field}: ${first.message}` : (body?.statusMessage ?? `The fit was refused (${response.status})`)
        return
      }
      points.value = response.headers.get('x-fit-points') ?? ''
      const reader = response.body.pipeThrough(new TextDecoderStream()).getReader()
      let pending = ''
      for (;;) {
        const { value, done } = await reader.read()
        if (done) break
        pending += value
        const lines = pending.split('\n')
        pending = lines.pop() ?? ''
        for (const line of lines) if (line.trim()) take(JSON.parse(line) as CalibrationMessage)
      }
      if (!result.value && !problem.value) problem.value = 'The fit ended without a result'
    } catch (error) {
      problem.value = `The fit could not be run: ${(error as Error).message}`
    } finally {
      running.value = false
    }
  }

  return { running, progress, result, problem, points, run }
}
