import { beforeAll, describe, expect, it } from 'vitest'
import bessel from 'bessel'
import { runCase } from '../../server/thermal/runCase'
import { referenceTimeToCentre_s } from '../support/productReference'
import { pointValue } from '../../shared/pointSeries'
import { DEMO_PLANS } from '../../server/db/demo/plans'
import { anonymous, signInDemo, type Client } from '../support/http'
import { createLibraryFixture, type LibraryFixture } from '../support/library'
import { bisect } from '../support/bisect'
import { auditFor } from '../support/audit'
import { savePlan, pinSpec } from '../support/plans'
import { booking, createLine } from '../support/schedule'
import { TEMPERATURE_DEPENDENT_METHOD } from '../../server/thermal/temperatureDependent'

let metallurgist: Client
let lib: LibraryFixture

beforeAll(async () => {
  metallurgist = await signInDemo('metallurgist')
  lib = await createLibraryFixture(metallurgist)
})

/** A 40 mm bar from 850 °C: 60 s in oil, then still air until the centre is below 100 °C; soak at 850 °C. */
function barSpec(diameter_m = 0.04) {
  return {
    name: `Bar ${diameter_m * 1000} mm oil then air`,
    part: { shape: 'round-bar', diameter_m },
    materialId: lib.steelId,
    start_C: 850,
    stages: [{ quenchantId: lib.oilId, duration_s: 60 }, { quenchantId: lib.airId }],
    handling: { below_C: 100 },
    soak: { furnace_C: 850, tolerance_K: 10, minimumSoak_s: 1800 },
  }
}

/** The same bar written directly as an engine case, by hand (radius = half the diameter). */
function barCase(diameter_m: number, hOil: number, hAir: number) {
  const { steel, oil, air } = lib.values
  return {
    geometry: 'rod',
    size_m: diameter_m / 2,
    material: { k: steel.k, rho: steel.rho, cp: steel.cp },
    initial_C: 850,
    stages: [
      { surface: { h: hOil, ambient_C: oil.bath_C }, duration_s: 60 },
      { surface: { h: hAir, ambient_C: air.bath_C } },
    ],
    target: { at: 'centre', below_C: 100 },
  }
}

describe('plans: compute and save', () => {
  let created: any

  it('creates a plan whose quench-to-handling time is runCase on the equivalent case, and the same bar low/high at the quenchant spread', async () => {
    const response = await metallurgist.request('/api/plans', { method: 'POST', body: barSpec() })
    expect(response.status).toBe(201)
    created = response.body
    expect(created.revision).toBe(1)
    const { oil, air } = lib.values
    // Source: the engine itself, called directly on a hand-written case.
    const direct = runCase(barCase(0.04, oil.h, air.h)).targetTime_s as number
    expect(created.result.quenchToHandling_s).toBeCloseTo(direct, 6)
    expect(created.result.band.low.quenchToHandling_s).toBeCloseTo(runCase(barCase(0.04, oil.hLow, air.hLow)).targetTime_s as number, 6)
    expect(created.result.band.high.quenchToHandling_s).toBeCloseTo(runCase(barCase(0.04, oil.hHigh, air.hHigh)).targetTime_s as number, 6)
    expect(created.result.band.low.quenchToHandling_s).toBeGreaterThan(direct)
    expect(created.result.band.high.quenchToHandling_s).toBeLessThan(direct)
    // PlanSummary contract: the stored series reads the handling temperature at the handling time.
    const summary = created.result.summary
    expect(summary.quenchToHandling_s).toBe(created.result.quenchToHandling_s)
    expect(summary.handling_C).toBe(100)
    expect(pointValue(summary.handlingPointSeries, summary.quenchToHandling_s)).toBeCloseTo(100, 6)
    // The saved spec carries the library values it was computed with.
    expect(created.spec.library.material).toMatchObject({ id: lib.steelId, k_W_mK: 40, density_kg_m3: 7850, specificHeat_J_kgK: 475 })
    expect(created.spec.library.quenchants.map((q: { id: number }) => q.id).sort()).toEqual([lib.oilId, lib.airId].sort())
  })

  it('soak heat-up matches the one-term rod solution with the radiation-plus-convection furnace coefficient', () => {
    // Incropera et al., Fundamentals of Heat and Mass Transfer, eq. 1.9 (linearised radiation)
    // and §5.6.2 eqs. 5.49–5.52 (one-term infinite cylinder, exact here: Fo ≫ 0.2).
    const Tf = 850 + 273.15
    const Ts = (850 + 20) / 2 + 273.15
    const h = 10 + 0.8 * 5.670374419e-8 * (Tf * Tf + Ts * Ts) * (Tf + Ts)
    const { k, rho, cp } = lib.values.steel
    const R = 0.02
    const bi = (h * R) / k
    const J = (x: number, n: number) => bessel.besselj(x, n)
    const zeta = bisect((z) => z * J(z, 1) - bi * J(z, 0), 1e-9, 2.404825557695773)
    const C1 = ((2 / zeta) * J(zeta, 1)) / (J(zeta, 0) ** 2 + J(zeta, 1) ** 2)
    const theta = (840 - 850) / (20 - 850)
    const fo = -Math.log(theta / C1) / (zeta * zeta)
    const expected = (fo * R * R * rho * cp) / k
    const soak = created.result.soak
    expect(soak.furnaceHFrom).toBe('common-practice')
    expect(soak.furnaceH_W_m2K).toBeCloseTo(h, 9)
    expect(soak.heatUp_s / expected - 1).toBeLessThan(1e-6)
    expect(soak.heatUp_s / expected - 1).toBeGreaterThan(-1e-6)
    expect(soak.total_s).toBeCloseTo(soak.heatUp_s + 1800, 6)
    expect(created.result.summary.soak).toEqual({ furnace_C: 850, heatUp_s: soak.heatUp_s, minimumSoak_s: 1800, total_s: soak.total_s })
  })

  it('reports Biot numbers h·R/k and h·(V/A)/k per stage, and Fo = αt/R² at the handling time', () => {
    // Closed forms: V/A of a long bar is D/4 (ends ignored).
    const [oilStage, airStage] = created.result.stages
    expect(oilStage.biot).toBeCloseTo((800 * 0.02) / 40, 12)
    expect(oilStage.biotLumped).toBeCloseTo((800 * 0.01) / 40, 12)
    expect(airStage.biot).toBeCloseTo((15 * 0.02) / 40, 12)
    const alpha = 40 / (7850 * 475)
    expect(created.result.fourierAtHandling).toBeCloseTo((alpha * created.result.quenchToHandling_s) / 0.02 ** 2, 9)
    expect(created.result.oneTermValid).toBe(true)
    expect(oilStage.modes[0].timeConstant_s).toBeCloseTo(1 / oilStage.modes[0].decayRate_per_s, 9)
  })

  it('an edit is a new revision; the first stays retrievable with its own result; a thicker bar is slower', async () => {
    const revised = await metallurgist.request(`/api/plans/${created.id}/revisions`, { method: 'POST', body: { ...barSpec(0.05), note: 'Thicker stock' } })
    expect(revised.status).toBe(201)
    expect(revised.body.revision).toBe(2)
    expect(revised.body.note).toBe('Thicker stock')
    expect(revised.body.result.quenchToHandling_s).toBeCloseTo(runCase(barCase(0.05, 800, 15)).targetTime_s as number, 6)
    expect(revised.body.result.quenchToHandling_s).toBeGreaterThan(created.result.quenchToHandling_s)
    expect(revised.body.revisions.map((r: { revision: number }) => r.revision)).toEqual([2, 1])

    const first = await metallurgist.request(`/api/plans/${created.id}/revisions/1`)
    expect(first.status).toBe(200)
    expect(first.body.spec.part.diameter_m).toBe(0.04)
    expect(first.body.result.quenchToHandling_s).toBeCloseTo(created.result.quenchToHandling_s, 9)
    const latest = await metallurgist.request(`/api/plans/${created.id}`)
    expect(latest.body.revision).toBe(2)
    expect((await metallurgist.request(`/api/plans/${created.id}/revisions/9`)).status).toBe(404)
  })

  it('a saved revision recomputes from its copied values after the library row changes', async () => {
    const edit = (k_W_mK: number) => metallurgist.request(`/api/materials/${lib.steelId}`, { method: 'PATCH', body: { k_W_mK } })
    expect((await edit(20)).status).toBe(200)
    try {
      const first = await metallurgist.request(`/api/plans/${created.id}/revisions/1`)
      expect(first.body.result.quenchToHandling_s).toBeCloseTo(created.result.quenchToHandling_s, 9)
    } finally {
      await edit(40)
    }
  })

  it('duplicates from the stored values and lists plans with headline times', async () => {
    const copy = await metallurgist.request(`/api/plans/${created.id}/duplicate`, { method: 'POST' })
    expect(copy.status).toBe(201)
    expect(copy.body.id).not.toBe(created.id)
    expect(copy.body.name).toBe(`Copy of ${barSpec(0.05).name}`)
    expect(copy.body.spec.part.diameter_m).toBe(0.05)
    const list = await metallurgist.request('/api/plans')
    const row = list.body.find((p: { id: number }) => p.id === created.id)
    expect(row).toMatchObject({ latestRevision: 2, shape: 'round-bar', handling_C: 100 })
    expect(row.quenchToHandling_s).toBeGreaterThan(created.result.quenchToHandling_s)
  })

  it('every write is in the audit trail', async () => {
    const actions = (await auditFor(await signInDemo('admin'), 'plan', created.id)).map((e: { action: string }) => e.action)
    expect(actions).toEqual(expect.arrayContaining(['plan.create', 'plan.revise']))
  })

  it('exports the curve as CSV with units in the header', async () => {
    const plan = await metallurgist.request(`/api/plans/${created.id}/revisions/1`)
    const csv = await metallurgist.request(`/api/plans/${created.id}/curve.csv?revision=1`)
    expect(csv.status).toBe(200)
    const lines = (csv.body as string).trim().split('\r\n')
    expect(lines[0]).toBe('time (s),centre (°C),surface (°C),mean (°C),handling point at low coefficients (°C),handling point at high coefficients (°C)')
    expect(lines.length).toBe(plan.body.result.curve.t_s.length + 1)
    expect(lines[1]!.split(',').map(Number)).toEqual([0, 850, 850, 850, 850, 850])
    const i = 300
    const cells = lines[i + 1]!.split(',').map(Number)
    expect(cells[0]).toBeCloseTo(plan.body.result.curve.t_s[i], 3)
    expect(cells[1]).toBeCloseTo(plan.body.result.curve.centre_C[i], 3)
    const fahrenheit = await metallurgist.request(`/api/plans/${created.id}/curve.csv?revision=1&temperature=F`)
    // 850 °C = 1562 °F (°F = °C × 9/5 + 32).
    expect((fahrenheit.body as string).split('\r\n')[1]).toBe('0.000,1562.000,1562.000,1562.000,1562.000,1562.000')
  })

  it('the finite-difference check agrees with the series to well under a kelvin', async () => {
    const check = await metallurgist.request('/api/plans/check', { method: 'POST', body: barSpec() })
    expect(check.status).toBe(200)
    expect(check.body.maxDifference_K).toBeGreaterThan(0)
    expect(check.body.maxDifference_K).toBeLessThan(0.05)
  })
})

describe('plans: search, filter and archive', () => {
  it('finds a plan by part of its name or material and by shape; archiving hides it from the list and the booking form, keeps it readable and its booked load intact', async () => {
    const admin = await signInDemo('admin')
    const plan = await savePlan(metallurgist, pinSpec(lib))
    const detail = (await metallurgist.request(`/api/plans/${plan.planId}`)).body as { name: string }
    const line = await createLine(admin, 'Archive')
    const booked = await metallurgist.request('/api/batches', { method: 'POST', body: booking(plan.planRevisionId, line, Date.UTC(2033, 5, 1) + Math.floor(Math.random() * 1e6) * 60_000, 'Archive check') })
    expect(booked.status).toBe(201)
    const ids = async (query: string) => ((await metallurgist.request(`/api/plans${query}`)).body as { id: number }[]).map((p) => p.id)

    const token = detail.name.split(' ').at(-1)!
    expect(await ids(`?q=${encodeURIComponent(token.toUpperCase())}`)).toEqual([plan.planId])
    expect(await ids(`?q=${encodeURIComponent(token)}&shape=round-bar`)).toEqual([plan.planId])
    expect(await ids(`?q=${encodeURIComponent(token)}&shape=plate`)).toEqual([])

    const archived = await metallurgist.request(`/api/plans/${plan.planId}/archive`, { method: 'POST', body: { archived: true } })
    expect(archived.status).toBe(200)
    expect(await ids(`?q=${encodeURIComponent(token)}`)).toEqual([])
    expect(await ids(`?q=${encodeURIComponent(token)}&archived=true`)).toEqual([plan.planId])
    const options = (await metallurgist.request('/api/schedule/plan-revisions')).body as { planRevisionId: number }[]
    expect(options.some((o) => o.planRevisionId === plan.planRevisionId)).toBe(false)
    expect((await metallurgist.request(`/api/plans/${plan.planId}`)).status).toBe(200)
    expect((await metallurgist.request(`/api/batches/${booked.body.id}`)).body).toMatchObject({ planRevisionId: plan.planRevisionId, state: 'planned' })
    expect((await auditFor(admin, 'plan', plan.planId))[0]).toMatchObject({ action: 'plan.archive', details: { name: detail.name } })

    expect((await metallurgist.request(`/api/plans/${plan.planId}/archive`, { method: 'POST', body: { archived: false } })).status).toBe(200)
    expect(await ids(`?q=${encodeURIComponent(token)}`)).toEqual([plan.planId])
    expect((await (await signInDemo('operator')).request(`/api/plans/${plan.planId}/archive`, { method: 'POST', body: { archived: true } })).status).toBe(403)
    const bad = await metallurgist.request(`/api/plans/${plan.planId}/archive`, { method: 'POST', body: { archived: 'yes' } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.problems).toEqual([{ field: 'archived', message: 'Archived must be true or false' }])
    expect((await metallurgist.request('/api/plans?shape=cube')).status).toBe(400)
    expect((await metallurgist.request('/api/plans/99999999/archive', { method: 'POST', body: { archived: true } })).status).toBe(404)
  })
})

describe('plans: refusals', () => {
  it.each([
    ['part.diameter_m', (s: any) => ({ ...s, part: { shape: 'round-bar', diameter_m: -0.04 } })],
    ['part.shape', (s: any) => ({ ...s, part: { shape: 'cone', diameter_m: 0.04 } })],
    ['stages.0.duration_s', (s: any) => ({ ...s, stages: [{ quenchantId: s.stages[0].quenchantId }, s.stages[1]] })],
    ['handling.below_C', (s: any) => ({ ...s, handling: { below_C: 900 } })],
    ['soak.tolerance_K', (s: any) => ({ ...s, soak: { ...s.soak, tolerance_K: -1 } })],
    ['materialId', (s: any) => ({ ...s, materialId: 999999 })],
    ['stages.1.quenchantId', (s: any) => ({ ...s, stages: [s.stages[0], { quenchantId: 999999 }] })],
  ])('400 naming %s', async (field, change) => {
    for (const path of ['/api/plans', '/api/plans/preview']) {
      const response = await metallurgist.request(path, { method: 'POST', body: change(barSpec()) })
      expect(response.status, path).toBe(400)
      expect(response.body.data.problems.map((p: { field: string }) => p.field)).toContain(field)
    }
  })

  it('422 naming handling.below_C when nothing in the quench is that cold', async () => {
    const response = await metallurgist.request('/api/plans/preview', { method: 'POST', body: { ...barSpec(), handling: { below_C: 20 } } })
    expect(response.status).toBe(422)
    expect(response.body.data.problems[0].field).toBe('handling.below_C')
  })

  it('a short cylinder quenched in oil at 60 °C then cooled in air at 25 °C computes by superposition, and the finite-difference check agrees within 0.2 K', async () => {
    const body = { ...barSpec(), part: { shape: 'cylinder', diameter_m: 0.04, length_m: 0.1 } }
    const preview = await metallurgist.request('/api/plans/preview', { method: 'POST', body })
    expect(preview.status).toBe(200)
    // Shorter than the long bar of the same diameter: the end faces cool it too.
    const bar = await metallurgist.request('/api/plans/preview', { method: 'POST', body: barSpec() })
    expect(preview.body.quenchToHandling_s).toBeLessThan(bar.body.quenchToHandling_s)
    const check = await metallurgist.request('/api/plans/check', { method: 'POST', body })
    expect(check.status).toBe(200)
    expect(check.body.maxDifference_K).toBeLessThan(0.2)
  })

  it('operators and QA read plans but get 403 on every write; signed out is 401', async () => {
    const plan = (await metallurgist.request('/api/plans', { method: 'POST', body: barSpec() })).body
    for (const role of ['operator', 'qa'] as const) {
      const client = await signInDemo(role)
      expect((await client.request(`/api/plans/${plan.id}`)).status).toBe(200)
      expect((await client.request('/api/plans', { method: 'POST', body: barSpec() })).status).toBe(403)
      expect((await client.request(`/api/plans/${plan.id}/revisions`, { method: 'POST', body: barSpec() })).status).toBe(403)
      expect((await client.request(`/api/plans/${plan.id}/duplicate`, { method: 'POST' })).status).toBe(403)
    }
    expect((await anonymous().request('/api/plans')).status).toBe(401)
    expect((await metallurgist.request('/api/plans/999999')).status).toBe(404)
  })
})

describe('plans: short cylinder by product solutions', () => {
  it('a 40 × 100 mm cylinder in 25 °C oil then 25 °C air cools faster than the 40 mm bar and its series meets the handling temperature', async () => {
    const spec = {
      ...barSpec(),
      name: 'Short cylinder',
      part: { shape: 'cylinder', diameter_m: 0.04, length_m: 0.1 },
      stages: [{ quenchantId: lib.oil25Id, duration_s: 60 }, { quenchantId: lib.airId }],
    }
    const cylinder = await metallurgist.request('/api/plans/preview', { method: 'POST', body: spec })
    expect(cylinder.status).toBe(200)
    const bar = await metallurgist.request('/api/plans/preview', { method: 'POST', body: { ...spec, part: { shape: 'round-bar', diameter_m: 0.04 } } })
    // The ends add cooling surface: the short cylinder must be quicker than the infinite bar.
    expect(cylinder.body.quenchToHandling_s).toBeLessThan(bar.body.quenchToHandling_s)
    expect(cylinder.body.method).toBe('product')
    expect(pointValue(cylinder.body.summary.handlingPointSeries, cylinder.body.quenchToHandling_s)).toBeCloseTo(100, 1)
  })

  it('one stage: the centre time equals the closed-form short-cylinder product solution', async () => {
    // Source: tests/support/productReference.ts (Carslaw & Jaeger §1.15 product of the rod and slab series, bisected roots).
    const spec = { ...barSpec(), name: 'Short cylinder, oil only', part: { shape: 'cylinder', diameter_m: 0.04, length_m: 0.1 }, stages: [{ quenchantId: lib.oil25Id }] }
    const response = await metallurgist.request('/api/plans/preview', { method: 'POST', body: spec })
    expect(response.status).toBe(200)
    const expected = referenceTimeToCentre_s(
      {
        directions: [
          { geometry: 'rod', size_m: 0.02 },
          { geometry: 'slab', size_m: 0.05 },
        ],
        k_W_mK: 40,
        rhoCp_J_m3K: 7850 * 475,
        h_W_m2K: 800,
        initial_C: 850,
        ambient_C: 25,
      },
      100,
    )
    expect(response.body.quenchToHandling_s / expected - 1).toBeLessThan(1e-6)
    expect(response.body.quenchToHandling_s / expected - 1).toBeGreaterThan(-1e-6)
  })
})

describe('plans: the seeded demo shop', () => {
  it('every demo plan was saved by the planner and opens in the editor with the demo library it names', async () => {
    const list = (await metallurgist.request('/api/plans')).body as { id: number; name: string; quenchToHandling_s: number }[]
    for (const demo of DEMO_PLANS) {
      const row = list.find((p) => p.name === demo.name)
      expect(row, demo.name).toBeDefined()
      const opened = await metallurgist.request(`/api/plans/${row!.id}`)
      expect(opened.status).toBe(200)
      expect(opened.body.spec.library.material.name).toBe(demo.material)
      expect(opened.body.spec.library.quenchants.map((q: { name: string }) => q.name).sort()).toEqual([...new Set(demo.stages.map((s) => s.quenchant))].sort())
      expect(opened.body.spec.quenchDelayAllowance_s).toBe(demo.quenchDelayAllowance_s)
      // The stored summary (what the schedule books from) is the editor's result, recomputed from the stored values.
      expect(opened.body.result.quenchToHandling_s).toBeCloseTo(row!.quenchToHandling_s, 9)
      expect(opened.body.revisions[0].createdBy).toBe('Mira Okonkwo')
    }
  })
})

describe('plans: temperature tables and cooling curves', () => {
  // A medium-carbon steel table shaped like the engine tests' (quenchFixtures.ts: common practice,
  // from memory) and still air as a convection curve plus radiation at emissivity 0.8 (oxidised
  // steel, common practice); the band curves are the typical one scaled by 0.7 and 1.5. Air keeps
  // the sub-step solves few, so the test stays well inside the engine budget on a loaded machine.
  const table = [
    { T_C: 20, k: 51, cp: 460, rho: 7850 },
    { T_C: 400, k: 42, cp: 590 },
    { T_C: 700, k: 31, cp: 900 },
    { T_C: 740, k: 29.5, cp: 1400 },
    { T_C: 850, k: 26, cp: 620 },
    { T_C: 1000, k: 27.5, cp: 640 },
  ]
  const curve = [
    { T_C: 25, h: 6 },
    { T_C: 300, h: 9 },
    { T_C: 900, h: 11 },
  ]
  const scaled = (f: number) => curve.map((p) => ({ T_C: p.T_C, h: p.h * f }))
  let spec: Record<string, unknown>

  beforeAll(async () => {
    const suffix = `${Date.now()}-${Math.floor(Math.random() * 1e6)}`
    const steel = await metallurgist.request('/api/materials', {
      method: 'POST',
      body: { name: `Table steel ${suffix}`, k_W_mK: 51, density_kg_m3: 7850, specificHeat_J_kgK: 460, propertyTable: table, propertyTableSource: 'test table', source: 'test' },
    })
    const air = await metallurgist.request('/api/quenchants', {
      method: 'POST',
      body: {
        name: `Curve air ${suffix}`,
        kind: 'still-air',
        hLow_W_m2K: 5,
        hTypical_W_m2K: 15,
        hHigh_W_m2K: 80,
        bath_C: 25,
        coolingCurves: { low: scaled(0.7), typical: curve, high: scaled(1.5) },
        emissivity: 0.8,
        curveSource: 'test curve',
        source: 'test',
      },
    })
    expect([steel.status, air.status]).toEqual([201, 201])
    spec = {
      name: 'Table bar in still air',
      part: { shape: 'round-bar', diameter_m: 0.03 },
      materialId: steel.body.id,
      start_C: 850,
      stages: [{ quenchantId: air.body.id }],
      handling: { below_C: 300 },
    }
  })

  /** The same bar by hand as an engine case; `physics` picks the table and a curve or the single values. */
  const barCase = (h: { hCurve: { T_C: number; h: number }[] } | { h: number }, tables: boolean) => ({
    geometry: 'rod',
    size_m: 0.015,
    material: tables ? { table: table.map((r) => ({ ...r, rho: 7850 })) } : { k: 51, rho: 7850, cp: 460 },
    initial_C: 850,
    stages: [{ surface: { ...h, ambient_C: 25, ...('hCurve' in h ? { emissivity: 0.8 } : {}) } }],
    target: { at: 'centre', below_C: 300 },
  })

  it('a plan returns the temperature-dependent time and the constant-property one, with the band from the low and high curves', async () => {
    const response = await metallurgist.request('/api/plans/preview', { method: 'POST', body: spec })
    expect(response.status).toBe(200)
    const result = response.body
    // Source: the engine run directly on hand-written cases.
    expect(result.quenchToHandling_s).toBeCloseTo(runCase(barCase({ hCurve: curve }, true)).targetTime_s as number, 6)
    expect(result.band.low.quenchToHandling_s).toBeCloseTo(runCase(barCase({ hCurve: scaled(0.7) }, true)).targetTime_s as number, 6)
    expect(result.physics.constantPropertyToHandling_s).toBeCloseTo(runCase(barCase({ h: 15 }, false)).targetTime_s as number, 6)
    expect(result.physics).toMatchObject({ temperatureDependent: true, method: TEMPERATURE_DEPENDENT_METHOD })
    expect(result.summary.slowEndToHandling_s).toBe(result.band.low.quenchToHandling_s)
    expect(result.band.high.quenchToHandling_s).toBeLessThan(result.quenchToHandling_s)
    expect(pointValue(result.summary.handlingPointSeries, result.quenchToHandling_s)).toBeCloseTo(300, 6)
    // Radiation dominates while the bar is hot: εσ(T_s² + T∞²)(T_s + T∞) is 77 W/m²K at 800 °C (Incropera eq. 1.9) against 11 of convection.
    expect(result.stages[0].hSeen_W_m2K.max).toBeGreaterThan(77 + 11)
  }, 60_000)

  it('the finite-difference check uses the non-linear Crank–Nicolson and agrees within 0.2 K', async () => {
    const check = await metallurgist.request('/api/plans/check', { method: 'POST', body: spec })
    expect(check.status).toBe(200)
    expect(check.body.how).toMatch(/^non-linear Crank–Nicolson/)
    expect(check.body.maxDifference_K).toBeLessThan(0.2)
  }, 60_000)

  it('saved, the revision keeps the table and curves; asking for the single values gives the constant-property time', async () => {
    const saved = await metallurgist.request('/api/plans', { method: 'POST', body: spec })
    expect(saved.status).toBe(201)
    expect(saved.body.spec.library.material.propertyTable).toEqual(table)
    expect(saved.body.spec.library.quenchants[0].coolingCurves.typical).toEqual(curve)
    const constant = await metallurgist.request('/api/plans/preview', { method: 'POST', body: { ...spec, physics: 'constant' } })
    expect(constant.body.quenchToHandling_s).toBeCloseTo(saved.body.result.physics.constantPropertyToHandling_s, 9)
    expect(constant.body.physics.temperatureDependent).toBe(false)
    const bad = await metallurgist.request('/api/plans/preview', { method: 'POST', body: { ...spec, physics: 'quantum' } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.problems[0].field).toBe('physics')
  }, 60_000)
})
