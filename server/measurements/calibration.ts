/**
 * A calibration from a stored log: the chosen channel (thinned to at most
 * MAX_CALIBRATION_POINTS rows, which tell the fit as much as a fast logger's thousands
 * and keep it within a couple of seconds), the probe's body and thermocouple, the bath
 * and the model, as the fit's input (fitSchema.ts). The fit itself runs on a worker
 * thread (server/workers/fitRunner.ts).
 */
import { createError } from 'h3'
import type { CalibrationRequest } from '../../shared/schemas/calibration'
import { FitError, parseFit, type FitInput } from './fitSchema'
import { readLogSeries } from './logStore'
import { PROBE_PRESETS } from './probes'

export const MAX_CALIBRATION_POINTS = 600

/** Every k-th row (k as small as keeps at most `limit`), always with the last. */
export function evenRows(count: number, limit: number): number[] {
  const stride = Math.max(1, Math.ceil((count - 1) / (limit - 1)))
  const rows: number[] = []
  for (let i = 0; i < count; i += stride) rows.push(i)
  if (rows[rows.length - 1] !== count - 1) rows.push(count - 1)
  return rows
}

function unprocessable(field: string, message: string): never {
  throw createError({ statusCode: 422, statusMessage: 'Calibration refused', message: `${field}: ${message}`, data: { problems: [{ field, message }] } })
}

export interface CalibrationInput {
  input: FitInput
  /** Rows of the log the fit uses, of `rows` logged. */
  points: number
  rows: number
}

export async function calibrationInput(request: CalibrationRequest): Promise<CalibrationInput> {
  const { t_s, channels } = await readLogSeries(request.logId)
  const channel = channels.find((c) => c.name === request.channel)
  if (!channel) unprocessable('channel', `the log has no channel "${request.channel}"; it has ${channels.map((c) => `"${c.name}"`).join(', ')}`)
  const probe = PROBE_PRESETS.find((p) => p.id === request.probe)
  if (!probe) unprocessable('probe', `no probe preset "${request.probe}"`)
  const rows = evenRows(t_s.length, MAX_CALIBRATION_POINTS)
  const input: FitInput = {
    geometry: probe.geometry,
    size_m: probe.size_m,
    material: probe.material,
    ambient_C: request.bath_C,
    at: probe.at,
    log: { t_s: rows.map((i) => t_s[i]), T_C: rows.map((i) => channel.T_C[i]) },
    model: request.model,
  }
  try {
    parseFit(input)
  } catch (error) {
    if (error instanceof FitError) unprocessable(error.field, error.message.slice(error.field.length + 2))
    throw error
  }
  return { input, points: rows.length, rows: t_s.length }
}
