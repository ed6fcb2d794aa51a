import { spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { CaseError } from '../../../server/thermal/errors'
import { curveTimes, runCase } from '../../../server/thermal/runCase'

const example = JSON.parse(readFileSync('scripts/examples/oil-then-air-bar.json', 'utf8'))

describe('case validation: impossible requests name the field', () => {
  it.each([
    ['non-positive size', { size_m: 0 }, 'size_m'],
    ['non-positive property', { material: { k: 40, rho: -1, cp: 475 } }, 'material.rho'],
    ['graded table not reaching x = 1', { material: { profile: [{ x: 0, k: 5, rhoCp: 3.7e6 }, { x: 0.8, k: 5, rhoCp: 3.7e6 }] } }, 'material.profile'],
    ['initial profile not covering 0–1', { initial_C: undefined, initialProfile: [{ x: 0.1, T_C: 850 }, { x: 1, T_C: 800 }] }, 'initialProfile'],
    ['face centre on a rod', { centre: { h: 50, ambient_C: 20 } }, 'centre'],
    ['open-ended stage that is not last', { stages: [{ surface: { h: 800, ambient_C: 60 } }, { surface: { h: 15, ambient_C: 25 } }] }, 'stages.0.duration_s'],
    ['colder than anything in the case', { target: { at: 'centre', below_C: 20 } }, 'target.below_C'],
    ['hotter than anything in the case', { target: { at: 'centre', above_C: 900 } }, 'target.above_C'],
    ['surface with neither h nor fixed_C', { stages: [{ surface: { ambient_C: 25 } }] }, 'stages.0.surface.h'],
    ['unknown geometry', { geometry: 'cube' }, 'geometry'],
  ])('%s → %s', (_name, patch, field) => {
    const bad = { ...example, ...patch }
    expect(() => runCase(bad)).toThrow(CaseError)
    try {
      runCase(bad)
    } catch (error) {
      expect((error as CaseError).field).toBe(field)
    }
  })

  it('a target the final ambient can never reach (air at 25 °C after oil, centre below 30 °C reached only in the limit) is rejected on target.below_C', () => {
    // Oil at 20 °C makes 30 °C possible in principle, but the oil stage ends at 30 s and air at 40 °C follows.
    const bad = { ...example, stages: [{ surface: { h: 800, ambient_C: 20 }, duration_s: 30 }, { surface: { h: 15, ambient_C: 40 } }], target: { at: 'centre', below_C: 30 } }
    expect(() => runCase(bad)).toThrow(/target\.below_C/)
  })
})

describe('runCase on the example case', () => {
  const result = runCase(example)
  it('reports the target time, per-stage modes and a ~600-point curve reaching past it', () => {
    expect(result.targetTime_s).toBeGreaterThan(120)
    expect(result.targetTime_s).toBeLessThan(180)
    expect(result.curve.t_s.length).toBeGreaterThanOrEqual(600)
    expect(result.curve.t_s.at(-1)).toBeGreaterThan(result.targetTime_s as number)
    for (const s of result.stages) {
      expect(s.decayRates_per_s).toHaveLength(s.modes)
      expect(s.truncationError_K).toBeLessThan(0.01)
    }
  })
  it('the browser point series reproduces the centre curve (T = steady + Σ a e^{−μ(t − start)})', () => {
    const t = result.targetTime_s as number
    const stage = result.stages.find((s) => t > s.start_s && (s.end_s === null || t <= s.end_s))!
    const p = stage.pointSeries
    const value = p.steady_C + p.terms.reduce((acc, term) => acc + term.amplitude_K * Math.exp(-term.decayRate_per_s * (t - p.start_s)), 0)
    expect(value).toBeCloseTo(100, 8)
  })
  it('the finite-difference check agrees within 0.05 K', () => {
    expect(runCase(example, { check: 'finite-difference' }).check?.maxDifference_K).toBeLessThan(0.05)
  })
})

describe('curve sample times', () => {
  it('601 equal steps, stage starts and the target in order; a grid time a rounding hair from one of them gives way to it', () => {
    const hair = 60 + 1e-12
    const times = curveTimes(600, [180, hair])
    expect(times).toHaveLength(601)
    expect(times).toContain(hair)
    expect(times).not.toContain(60)
    expect(times.filter((t) => t === 180)).toHaveLength(1)
    expect(times.every((t, i) => i === 0 || t > times[i - 1])).toBe(true)
    expect(times[0]).toBe(0)
    expect(times.at(-1)).toBe(600)
  })
})

describe('CLI', () => {
  const run = (file: string) => spawnSync('npx', ['tsx', 'scripts/cooldown.ts', file], { encoding: 'utf8' })
  it('prints the result JSON for the example case', () => {
    const out = run('scripts/examples/oil-then-air-bar.json')
    expect(out.status).toBe(0)
    expect(JSON.parse(out.stdout).targetTime_s).toBeGreaterThan(0)
  }, 60_000)
  it('exits 2 with the field on stderr for a bad case', () => {
    const file = join(mkdtempSync(join(tmpdir(), 'cooldown-')), 'bad.json')
    writeFileSync(file, JSON.stringify({ ...example, size_m: -0.02 }))
    const out = run(file)
    expect(out.status).toBe(2)
    expect(out.stderr).toMatch(/^size_m: /)
    expect(out.stdout).toBe('')
  }, 60_000)
})
