/**
 * Calibrating a quench medium over HTTP: a probe log uploaded, the fit run on a worker
 * thread with its progress streamed as JSON lines, the fitted h given back; refusals
 * (unknown channel or log, bad model, wrong role) before anything runs. Then saving a
 * fit as a medium's curves: the server fits again, writes the provenance, the new band
 * and the audit rows in one transaction; plans saved afterwards copy the new values,
 * a revision saved before recomputes exactly as it did; refusals write nothing.
 * The logs are made by the fit's own forward model at a known h (tests/support/probeLog.ts).
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { anonymous, signInDemo, type Client } from '../support/http'
import { mappingField, postLog } from '../support/logs'
import { syntheticLogCsv, syntheticProbeCsv } from '../support/probeLog'
import { BASE_URL } from '../support/stackConfig'
import { auditFor, latestAuditId } from '../support/audit'
import { createLibraryFixture, type LibraryFixture } from '../support/library'
import { pinSpec, savePlan } from '../support/plans'

const TRUE_H = 1800
const mapping = { time: 'Elapsed (s)', channels: [{ column: 'Probe centre (°C)', unit: 'C' }, { column: 'Bath (°C)', unit: 'C' }] }
let metallurgist: Client
let logId: number
/** The pin plan's own log and probe, once the plan-probe test has made them. */
let pinProbe: { logId: number; probe: { planId: number; thermocouple: { depth_m: number } } } | undefined

async function storeLog(name: string, csv: string): Promise<number> {
  const stored = await postLog(metallurgist, '/api/logs', { name, bytes: csv }, mappingField(mapping))
  expect(stored.status).toBe(201)
  return stored.body.id
}

beforeAll(async () => {
  metallurgist = await signInDemo('metallurgist')
  logId = await storeLog('probe-oil.csv', syntheticProbeCsv(TRUE_H))
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

describe('the fit’s own options', () => {
  it('fits a window of the log from a given start temperature: 0–40 s is 201 rows, and h comes back within 2 %', async () => {
    const { status, points, lines } = await fitLines(metallurgist, request({ window: { from_s: 0, to_s: 40 }, initial_C: 850 }))
    expect(status).toBe(200)
    expect(points).toBe('201 of 400')
    const { result } = lines.at(-1)
    expect(result.points).toBe(201)
    expect(Math.abs(result.h.value / TRUE_H - 1)).toBeLessThan(0.02)
  })

  it('refuses a window that holds fewer than two rows (422 naming window) and one that ends before it starts (400)', async () => {
    const empty = await fitLines(metallurgist, request({ window: { from_s: 500, to_s: 600 } }))
    expect(empty.status).toBe(422)
    expect(JSON.parse(empty.text).data.problems[0]).toMatchObject({ field: 'window', message: expect.stringContaining('holds 0 logged row(s)') })
    const backwards = await fitLines(metallurgist, request({ window: { from_s: 30, to_s: 10 } }))
    expect(backwards.status).toBe(400)
    expect(JSON.parse(backwards.text).data.problems[0]).toEqual({ field: 'window.to_s', message: 'To must be after From' })
  })

  it('takes a plan’s part as the probe: a Ø40 mm steel pin read 5 mm below its surface gives back the h its log was made with', async () => {
    const lib = await createLibraryFixture(metallurgist)
    const pin = await savePlan(metallurgist, pinSpec(lib))
    // The pin's body as the plan states it: radius 20 mm, the fixture steel, the thermocouple at x = 1 − 5/20.
    const csv = syntheticLogCsv(800, { geometry: 'rod', size_m: 0.02, material: lib.values.steel, x: 0.75, step_s: 1, rows: 300 })
    const pinLog = await storeLog('pin-oil.csv', csv)
    const probe = { planId: pin.planId, thermocouple: { depth_m: 0.005 } }
    pinProbe = { logId: pinLog, probe }
    const { status, lines } = await fitLines(metallurgist, request({ logId: pinLog, probe }))
    expect(status).toBe(200)
    expect(Math.abs(lines.at(-1).result.h.value / 800 - 1)).toBeLessThan(0.02)
    const tooDeep = await fitLines(metallurgist, request({ logId: pinLog, probe: { ...probe, thermocouple: { depth_m: 0.03 } } }))
    expect(tooDeep.status).toBe(422)
    expect(JSON.parse(tooDeep.text).data.problems[0]).toMatchObject({ field: 'probe.thermocouple.depth_m', message: expect.stringContaining('20 mm below its surface') })
    const noPlan = await fitLines(metallurgist, request({ logId: pinLog, probe: { ...probe, planId: 999999 } }))
    expect(noPlan.status).toBe(422)
    expect(JSON.parse(noPlan.text).data.problems[0].field).toBe('probe.planId')
  })
})

describe('saving a fit as the medium’s curve', () => {
  let lib: LibraryFixture
  let admin: Client

  beforeAll(async () => {
    admin = await signInDemo('admin')
    lib = await createLibraryFixture(metallurgist)
  })

  const save = (client: Client, overrides: Record<string, unknown> = {}) => client.request('/api/calibrations', { method: 'POST', body: { ...request(), quenchantId: lib.oilId, ...overrides } })
  const calibrationCount = async () => (await metallurgist.request('/api/calibrations')).body.length

  it('refuses bad requests, other roles and fits it must not save, and writes nothing', async () => {
    // Signing in is audited too: the other roles sign in before the audit trail's last entry is noted.
    const others = [await signInDemo('qa'), await signInDemo('operator')]
    const before = { count: await calibrationCount(), audit: await latestAuditId(admin), oil: (await metallurgist.request(`/api/quenchants/${lib.oilId}`)).body }
    const missing = await metallurgist.request('/api/calibrations', { method: 'POST', body: request() })
    expect(missing.status).toBe(400)
    expect(missing.body.data.problems).toEqual([{ field: 'quenchantId', message: 'Choose a quench medium' }])
    const unknown = await save(metallurgist, { quenchantId: 999999 })
    expect(unknown.status).toBe(422)
    expect(unknown.body.data.problems[0]).toMatchObject({ field: 'quenchantId', message: 'no quench medium with id 999999 in the library' })
    // The log was made with one h everywhere: the 1000 °C knot is above anything it reached.
    const undetermined = await save(metallurgist, { model: { kind: 'curve', knots_C: [60, 200, 400, 600, 850, 1000] } })
    expect(undetermined.status).toBe(422)
    expect(undetermined.body.data.problems).toEqual([{ field: 'model.knots_C.5', message: expect.stringContaining('does not determine the knot at 1000 °C') }])
    // The log cooled towards 60 °C; a fit told the bath was at 300 °C cannot follow it below 300.
    const misfit = await save(metallurgist, { bath_C: 300 })
    expect(misfit.status).toBe(422)
    expect(misfit.body.data.problems[0]).toMatchObject({ field: 'model', message: expect.stringContaining('more than the 5 K a saved curve may miss by') })
    for (const other of others) expect((await save(other)).status).toBe(403)
    expect((await save(anonymous())).status).toBe(401)
    // Everyone reads where the library's curves came from; signed-out callers do not.
    expect((await others[1]!.request('/api/calibrations')).status).toBe(200)
    expect((await anonymous().request('/api/calibrations')).status).toBe(401)
    expect(await calibrationCount()).toBe(before.count)
    expect(await latestAuditId(admin)).toBe(before.audit)
    expect((await metallurgist.request(`/api/quenchants/${lib.oilId}`)).body).toEqual(before.oil)
  })

  it('saves the server’s own fit with provenance and audit; old revisions keep their values, new plans take the new ones', async () => {
    const oldPlan = await savePlan(metallurgist, pinSpec(lib))
    const oldRevision = (await metallurgist.request(`/api/plans/${oldPlan.planId}/revisions/1`)).body

    const saved = await save(metallurgist)
    expect(saved.status).toBe(201)
    const calibration = saved.body
    const h = calibration.fitted.h.value
    expect(Math.abs(h / TRUE_H - 1)).toBeLessThan(0.02)
    expect(calibration).toMatchObject({ quenchantId: lib.oilId, logId, logFileName: 'probe-oil.csv', channel: 'Probe centre (°C)', bath_C: 60, model: 'constant', points: 400 })
    expect(calibration.probe).toMatchObject({ preset: 'iso-9950', plan: null, geometry: 'rod', size_m: 0.00625, x: 0 })
    expect(calibration.window).toEqual({ from_s: 0, to_s: 79.8 })
    expect(calibration.rms_K).toBeLessThan(0.5)
    expect(calibration.createdBy).toBe('Mira Okonkwo')

    // The fixture oil had no curves: a flat curve over the log's span, band from its 500 / 800 / 1200 coefficients.
    const oil = (await metallurgist.request(`/api/quenchants/${lib.oilId}`)).body
    expect(oil.hTypical_W_m2K).toBe(h)
    expect(oil.hLow_W_m2K).toBeCloseTo((h * 500) / 800, 6)
    expect(oil.hHigh_W_m2K).toBeCloseTo((h * 1200) / 800, 6)
    expect(oil.coolingCurves.typical.map((p: { h: number }) => p.h)).toEqual([h, h, h])
    expect(oil.coolingCurves).toEqual(calibration.curves)
    expect(oil.curveSource).toContain(`calibration ${calibration.id}) from log "probe-oil.csv"`)
    expect(oil.curveSource).toContain('rms 0.')

    const listed = (await metallurgist.request('/api/calibrations')).body
    expect(listed[0]).toEqual(calibration)
    const audit = await auditFor(admin, 'quenchant', lib.oilId)
    expect(audit.map((a: { action: string }) => a.action).slice(0, 2)).toEqual(['quenchant.calibrate', 'quenchant.update'])
    expect(audit[0].details).toMatchObject({ calibration: calibration.id, log: logId, model: 'constant', points: 400 })

    // The revision saved before the calibration recomputes from its own snapshot, exactly as before.
    const again = (await metallurgist.request(`/api/plans/${oldPlan.planId}/revisions/1`)).body
    expect(again.result).toEqual(oldRevision.result)
    expect(again.spec.library.quenchants.find((q: { id: number }) => q.id === lib.oilId).hTypical_W_m2K).toBe(800)
    // A plan saved afterwards copies the calibrated medium.
    const newPlan = await savePlan(metallurgist, pinSpec(lib))
    const snapshot = (await metallurgist.request(`/api/plans/${newPlan.planId}`)).body.spec.library.quenchants.find((q: { id: number }) => q.id === lib.oilId)
    expect(snapshot.hTypical_W_m2K).toBe(h)
    expect(newPlan.summary.quenchToHandling_s).not.toBe(oldPlan.summary.quenchToHandling_s)
  })

  it('saves a curve with an undetermined knot once the person confirms, the band kept at each knot', async () => {
    const knots_C = [60, 200, 400, 600, 850, 1000]
    const saved = await save(metallurgist, { quenchantId: lib.waterId, bath_C: 60, model: { kind: 'curve', knots_C }, acceptUndeterminedKnots: true })
    expect(saved.status).toBe(201)
    const water = (await metallurgist.request(`/api/quenchants/${lib.waterId}`)).body
    expect(water.coolingCurves.typical.map((p: { T_C: number }) => p.T_C)).toEqual(knots_C)
    // A curve leaves the single coefficients alone (the fixture water: 2500 / 3000 / 3500) and moves the bath to the fit's.
    expect([water.hLow_W_m2K, water.hTypical_W_m2K, water.hHigh_W_m2K, water.bath_C]).toEqual([2500, 3000, 3500, 60])
    // At the undetermined 1000 °C knot (no uncertainty) the band is the medium's own ratios, 2500/3000 and 3500/3000.
    const at1000 = (curve: { T_C: number; h: number }[]) => curve.find((p) => p.T_C === 1000)!.h
    expect(at1000(water.coolingCurves.low) / at1000(water.coolingCurves.typical)).toBeCloseTo(2500 / 3000, 9)
    expect(at1000(water.coolingCurves.high) / at1000(water.coolingCurves.typical)).toBeCloseTo(3500 / 3000, 9)
  })

  it('keeps a plan probe in the provenance: the plan, its revision and the thermocouple’s depth in words', async () => {
    expect(pinProbe).toBeDefined()
    const saved = await save(metallurgist, { ...pinProbe, quenchantId: lib.oil25Id })
    expect(saved.status).toBe(201)
    expect(saved.body.probe).toMatchObject({ preset: null, plan: { id: pinProbe!.probe.planId, revision: 1 }, geometry: 'rod', size_m: 0.02, x: 0.75 })
    expect(saved.body.probe.label).toMatch(/^Plan "Pin Ø40 oil then air .*" revision 1: Round bar Ø40 mm, Test steel .*, thermocouple 5 mm below the surface$/)
    expect(Math.abs(saved.body.fitted.h.value / 800 - 1)).toBeLessThan(0.02)
  })
})
