/**
 * A calibration from a stored log: the chosen channel over the chosen time window
 * (thinned to at most MAX_CALIBRATION_POINTS rows, which tell the fit as much as a fast
 * logger's thousands and keep it within a couple of seconds), the probe's body and
 * thermocouple (a preset, or a saved plan's part: planProbe.ts), the start
 * temperature, the bath and the model, as the fit's input (fitSchema.ts). The fit
 * itself runs on a worker thread (server/workers/fitRunner.ts).
 *
 * The window's first row is the fit's time zero: the body is taken as uniform at the
 * start temperature there, so a window should start when the probe enters the bath.
 */
import { createError } from 'h3'
import type { CalibrationRequest } from '../../shared/schemas/calibration'
import type { CalibrationProbe } from '../../shared/types/calibration'
import { FitError, parseFit, type FitInput } from './fitSchema'
import { readLogSeries } from './logStore'
import { planProbeBody, type ProbeBody } from './planProbe'
import { PROBE_PRESETS } from './probes'
import { evenRows } from '../../shared/evenRows'

export const MAX_CALIBRATION_POINTS = 600

/** Indexes of the rows whose times lie in [from_s, to_s]. */
export function windowRows(t_s: ArrayLike<number>, window: { from_s: number; to_s: number } | undefined): number[] {
  const rows: number[] = []
  for (let i = 0; i < t_s.length; i++) if (!window || (t_s[i] >= window.from_s && t_s[i] <= window.to_s)) rows.push(i)
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
  probe: CalibrationProbe
  initial_C: number
  /** The window the fit used, in the log's own seconds. */
  window: { from_s: number; to_s: number }
}

async function probeBody(probe: CalibrationRequest['probe']): Promise<ProbeBody> {
  if (typeof probe === 'object') return await planProbeBody(probe)
  const preset = PROBE_PRESETS.find((p) => p.id === probe)
  if (!preset) unprocessable('probe', `no probe preset "${probe}"`)
  return {
    description: { preset: preset.id, plan: null, label: preset.name, geometry: preset.geometry, size_m: preset.size_m, x: preset.at === 'centre' ? 0 : 1 },
    material: preset.material,
  }
}

export async function calibrationInput(request: CalibrationRequest): Promise<CalibrationInput> {
  const { t_s, channels } = await readLogSeries(request.logId)
  const channel = channels.find((c) => c.name === request.channel)
  if (!channel) unprocessable('channel', `the log has no channel "${request.channel}"; it has ${channels.map((c) => `"${c.name}"`).join(', ')}`)
  const body = await probeBody(request.probe)
  const inWindow = windowRows(t_s, request.window)
  if (inWindow.length < 2) unprocessable('window', `holds ${inWindow.length} logged row(s); the log runs from ${t_s[0]} s to ${t_s[t_s.length - 1]} s`)
  const rows = evenRows(inWindow.length, MAX_CALIBRATION_POINTS).map((i) => inWindow[i])
  const start_s = t_s[rows[0]]
  const initial_C = request.initial_C ?? channel.T_C[rows[0]]
  const input: FitInput = {
    geometry: body.description.geometry,
    size_m: body.description.size_m,
    material: body.material,
    initial_C,
    ambient_C: request.bath_C,
    at: { x: body.description.x },
    log: { t_s: rows.map((i) => t_s[i] - start_s), T_C: rows.map((i) => channel.T_C[i]) },
    model: request.model,
  }
  try {
    parseFit(input)
  } catch (error) {
    if (error instanceof FitError) unprocessable(error.field, error.message.slice(error.field.length + 2))
    throw error
  }
  return { input, points: rows.length, rows: t_s.length, probe: body.description, initial_C, window: { from_s: start_s, to_s: t_s[rows[rows.length - 1]] } }
}
