import { spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { caseToProblem, parseCase } from '../../../server/thermal/caseSchema'
import { CaseError } from '../../../server/thermal/errors'
import { runCase } from '../../../server/thermal/runCase'
import { TEMPERATURE_DEPENDENT_METHOD } from '../../../server/thermal/temperatureDependent'

const example = JSON.parse(readFileSync('scripts/examples/oil-quench-steel-table.json', 'utf8'))
const plain = JSON.parse(readFileSync('scripts/examples/oil-then-air-bar.json', 'utf8'))
const table = example.material.table
const oil = example.stages[0].surface

function fieldOf(input: unknown): string {
  try {
    parseCase(input)
  } catch (error) {
    if (error instanceof CaseError) return error.message
    throw error
  }
  return 'accepted'
}

describe('case tables', () => {
  it('a material table carries rho down to rows that leave it out', () => {
    const problem = caseToProblem(parseCase(example))
    const rows = problem.domain.temperatureTable ?? []
    expect(rows[4]).toEqual({ T_C: 700, k_W_mK: 31, rhoCp_J_m3K: 7680 * 900 })
    expect(rows[7].rhoCp_J_m3K).toBe(7650 * 620)
    expect(problem.stages[0].outer).toMatchObject({ type: 'convective', ambient_C: 60 })
    expect(problem.stages[0].outer.type === 'convective' && problem.stages[0].outer.hCurve?.[0]).toEqual({ T_C: 25, h_W_m2K: 300 })
    expect(problem.stages[1].outer).toMatchObject({ h_W_m2K: 12, emissivity: 0.8 })
  })

  it.each([
    ['unsorted table', { ...example, material: { table: [table[1], table[0], table[2]] } }, 'material.table.1.T_C: temperatures must strictly increase'],
    ['negative conductivity', { ...example, material: { table: [{ ...table[0], k: -5 }, table[1]] } }, 'material.table.0.k:'],
    ['one row', { ...example, material: { table: [table[0]] } }, 'material.table: a material table needs at least two rows'],
    ['no rho in the first row', { ...example, material: { table: [{ T_C: 20, k: 50, cp: 460 }, table[1]] } }, 'material.table.0.rho: the first row needs rho'],
    ['a table beside k', { ...example, material: { table, k: 40 } }, 'material.table: give one of k, rho, cp or a profile or a table'],
    ['both h and hCurve', { ...example, stages: [{ surface: { ...oil, h: 500 } }] }, 'stages.0.surface.hCurve: give either h or hCurve, not both'],
    ['two curve points', { ...example, stages: [{ surface: { ...oil, hCurve: oil.hCurve.slice(0, 2) } }] }, 'stages.0.surface.hCurve: a heat-transfer curve needs at least three points'],
    ['unsorted curve', { ...example, stages: [{ surface: { ...oil, hCurve: [oil.hCurve[2], oil.hCurve[1], oil.hCurve[3]] } }] }, 'stages.0.surface.hCurve.1.T_C: temperatures must strictly increase'],
    ['negative h in a curve', { ...example, stages: [{ surface: { ...oil, hCurve: [{ T_C: 0, h: -1 }, ...oil.hCurve.slice(1)] } }] }, 'stages.0.surface.hCurve.0.h:'],
    ['emissivity above 1', { ...example, stages: [{ surface: { h: 12, ambient_C: 25, emissivity: 1.2 } }] }, 'stages.0.surface.emissivity: must be between 0 and 1'],
    ['emissivity on a fixed surface', { ...example, stages: [{ surface: { fixed_C: 20, emissivity: 0.5 } }] }, 'stages.0.surface.fixed_C:'],
  ])('rejects %s naming the field', (_name, input, message) => {
    expect(fieldOf(input)).toContain(message)
  })

  it('the result says which method ran per stage and its estimated error, which bounds the difference from Crank–Nicolson; a constant case says the series', () => {
    const result = runCase(example, { check: 'finite-difference' })
    expect(result.stages.map((s) => s.method)).toEqual([TEMPERATURE_DEPENDENT_METHOD, TEMPERATURE_DEPENDENT_METHOD])
    for (const s of result.stages) expect(s.subStepSeries?.length).toBeGreaterThan(1)
    // The non-linear Crank–Nicolson solver at its defaults (400 cells, converged to ~0.01 K in crankNicolsonNonlinear.test.ts).
    expect(result.check?.maxDifference_K).toBeLessThan(0.3)
    expect(Math.max(...result.stages.map((s) => s.estimatedError_K))).toBeGreaterThan(result.check?.maxDifference_K as number)
    expect(result.targetTime_s).toBeGreaterThan(120)
    const constant = runCase(plain)
    expect(constant.stages.map((s) => s.method)).toEqual(['eigenmode series', 'eigenmode series'])
    expect(constant.stages[0].estimatedError_K).toBe(constant.stages[0].truncationError_K)
  }, 60_000)

  const run = (file: string) => spawnSync('npx', ['tsx', 'scripts/cooldown.ts', file], { encoding: 'utf8' })
  it('the command line exits 2 with "field: message" for a bad table', () => {
    const file = join(mkdtempSync(join(tmpdir(), 'cooldown-')), 'bad.json')
    writeFileSync(file, JSON.stringify({ ...example, material: { table: [table[1], table[0]] } }))
    const out = run(file)
    expect(out.status).toBe(2)
    expect(out.stderr.trim()).toBe('material.table.1.T_C: temperatures must strictly increase')
  }, 60_000)
})
