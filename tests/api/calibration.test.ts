/**
 * Calibrating a quench medium over HTTP: a probe log uploaded, the fit run on a worker
 * thread with its progress streamed as JSON lines, the fitted h given back; refusals
 * (unknown channel or log, bad model, wrong role) before anything runs.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { signInDemo, type Client } from '../support/http'
import { mappingField, postLog } from '../support/logs'
import { syntheticProbeCsv } from '../support/probeLog'
import { BASE_URL } from '../support/stackConfig'

const TRUE_H = 1800
let metallurgist: Client
let logId: number

beforeAll(async () => {
  metallurgist = await signInDemo('metallurgist')
  const mapping = { time: 'Elapsed (s)', channels: [{ column: 'Probe centre (°C)', unit: 'C' }, { column: 'Bath (°C)', unit: 'C' }] }
  const stored = await postLog(metallurgist, '/api/logs', { name: 'probe-oil.csv', bytes: syntheticProbeCsv(TRUE_H) }, mappingField(mapping))
  expect(stored.status).toBe(201)
  logId = stored.body.id
})

async function fitLines(client: Client, body: unknown) {
  const response = await fetch(`${BASE_URL}/api/calibrations/fit`, {
    method: 'POST',
    headers: { 'cookie': client.cookie, 'content-type': 'application/json', 'accept': 'application/json' },
    body: JSON.stringify(body),
  })
  const text = await response.text()
  return { status: response.status, points: response.headers.get('x-fit-points'), text, lines: response.ok ? text.trim().split('\n').map((l) => JSON.parse(l)) : [] }
}

const request = (overrides: Record<string, unknown> = {}) => ({ logId, channel: 'Probe centre (°C)', probe: 'iso-9950', bath_C: 60, model: { kind: 'constant' }, ...overrides })

describe('fitting a probe log', () => {
  it('streams progress, then gives back the h that made the log within 2 %, within 0.5 K rms', async () => {
    const { status, points, lines } = await fitLines(metallurgist, request())
    expect(status).toBe(200)
    expect(points).toBe('400 of 400')
    const progress = lines.filter((l) => 'progress' in l)
    expect(progress.length).toBeGreaterThan(0)
    expect(progress[0].progress.iteration).toBe(1)
    const { result } = lines.at(-1)
    expect(Math.abs(result.h.value / TRUE_H - 1)).toBeLessThan(0.02)
    expect(result.rms_K).toBeLessThan(0.5)
    expect(result.h.uncertainty).toBeGreaterThan(0)
    expect(result.coolingRate.measured.length).toBe(396)
  })

  it('a curve model gives one h per knot and says which knots the log cannot determine', async () => {
    const { lines } = await fitLines(metallurgist, request({ model: { kind: 'curve', knots_C: [60, 200, 400, 600, 850, 1000] } }))
    const { result } = lines.at(-1)
    expect(result.hCurve.map((k: { T_C: number }) => k.T_C)).toEqual([60, 200, 400, 600, 850, 1000])
    expect(result.hCurve.find((k: { T_C: number }) => k.T_C === 1000)).toMatchObject({ determined: false, uncertainty: null })
    expect(result.warnings.some((w: string) => w.startsWith('knot at 1000 °C is not determined by the log'))).toBe(true)
    // The log was made at one h everywhere: the knots it sees come back near it.
    for (const knot of result.hCurve.filter((k: { T_C: number }) => k.T_C >= 200 && k.T_C <= 600)) expect(Math.abs(knot.h / TRUE_H - 1)).toBeLessThan(0.1)
  })

  it('refuses an unknown channel (422), an unknown log (404), a two-knot curve (400) and other roles (403)', async () => {
    const channel = await fitLines(metallurgist, request({ channel: 'Core' }))
    expect(channel.status).toBe(422)
    expect(JSON.parse(channel.text).data.problems[0]).toMatchObject({ field: 'channel' })
    expect((await fitLines(metallurgist, request({ logId: 999999 }))).status).toBe(404)
    const knots = await fitLines(metallurgist, request({ model: { kind: 'curve', knots_C: [100, 500] } }))
    expect(knots.status).toBe(400)
    expect(JSON.parse(knots.text).data.problems[0]).toEqual({ field: 'model.knots_C', message: 'A curve needs at least three knots' })
    for (const role of ['qa', 'operator'] as const) expect((await fitLines(await signInDemo(role), request())).status).toBe(403)
  })
})
