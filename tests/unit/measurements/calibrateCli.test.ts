/**
 * The calibration input's refusals (each names its field) and the command line:
 * JSON on stdout and exit 0 for a good input, `field: message` on stderr and exit 2
 * for a bad one.
 */
import { spawnSync } from 'node:child_process'
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { parseFit } from '../../../server/measurements/fitSchema'

/** A lumped steel cube's cooling with h = 500 W/m²K: θ = exp(−t/τ), τ = ρc(V/A)/h (Bi = 0.06, near lumped). */
function goodInput() {
  const tau = (7650 * 620 * (0.003 / 1)) / 500
  const t_s = Array.from({ length: 40 }, (_, i) => i * 2)
  return {
    geometry: 'slab',
    size_m: 0.003,
    material: { k: 26, rho: 7650, cp: 620 },
    ambient_C: 20,
    at: 'centre',
    log: { t_s, T_C: t_s.map((t) => 20 + 830 * Math.exp(-t / tau)) },
    model: { kind: 'constant' },
  } as Record<string, unknown>
}

const withLog = (log: Record<string, unknown>) => ({ ...goodInput(), log: { ...(goodInput().log as object), ...log } })

describe('the calibration input', () => {
  it.each([
    ['a text temperature', withLog({ T_C: [850, 840, 'x', ...Array(37).fill(700)] }), 'log.T_C.2: not a number'],
    ['time going backwards', withLog({ t_s: [0, 2, 1, ...Array.from({ length: 37 }, (_, i) => 3 + i)] }), 'log.t_s.2: times must strictly increase'],
    ['a negative time', withLog({ t_s: [-1, ...Array.from({ length: 39 }, (_, i) => i)] }), 'log.t_s.0: must be 0 or later'],
    ['unequal columns', withLog({ T_C: [850, 800] }), 'log.T_C: has 2 values for 40 times'],
    ['knots out of order', { ...goodInput(), model: { kind: 'curve', knots_C: [20, 400, 300] } }, 'model.knots_C.2: knots must strictly increase'],
    ['too few knots', { ...goodInput(), model: { kind: 'curve', knots_C: [20, 400] } }, 'model.knots_C: a curve needs at least three knots'],
    ['an unknown model', { ...goodInput(), model: { kind: 'spline' } }, 'model.kind: kind must be "constant" or "curve"'],
    ['a bad thermocouple place', { ...goodInput(), at: { x: 1.5 } }, 'at.x: must be between 0 and 1'],
    ['a material without k', { ...goodInput(), material: { rho: 7650, cp: 620 } }, 'material.k: a uniform material needs k (> 0)'],
    ['no material', { ...goodInput(), material: undefined }, 'material: required'],
    ['a zero size', { ...goodInput(), size_m: 0 }, 'size_m: must be greater than 0'],
    ['fewer points than parameters allow', { ...goodInput(), log: { t_s: [0, 1, 2, 3], T_C: [850, 800, 760, 720] }, model: { kind: 'curve', knots_C: [20, 400, 800] } }, 'log.t_s: needs at least 5 points to fit 3 parameter(s)'],
  ])('refuses %s', (_, input, message) => {
    expect(() => parseFit(input)).toThrow(message)
  })
})

describe('npm run calibrate', () => {
  const dir = mkdtempSync(join(tmpdir(), 'slakewise-calibrate-'))
  const run = (input: unknown) => {
    const file = join(dir, 'fit.json')
    writeFileSync(file, JSON.stringify(input))
    return spawnSync('npx', ['tsx', 'scripts/calibrate.ts', file], { encoding: 'utf8' })
  }

  it('prints the fitted h with its statistics and exits 0', () => {
    const out = run(goodInput())
    expect(out.status).toBe(0)
    const result = JSON.parse(out.stdout)
    expect(Object.keys(result)).toEqual(['h', 'rms_K', 'maxAbs_K', 'points', 'iterations', 'uncertainty', 'warnings'])
    // Bi = 0.058: the slab centre lags the lumped curve a little, so the fit lands just above 500.
    expect(result.h).toBeGreaterThan(500)
    expect(result.h).toBeLessThan(520)
    expect(result.points).toBe(40)
    expect(result.uncertainty.h).toBeGreaterThan(0)
  }, 60_000)

  it('prints knots ascending for a curve model', () => {
    const out = run({ ...goodInput(), model: { kind: 'curve', knots_C: [20, 300, 600, 850] } })
    expect(out.status).toBe(0)
    const result = JSON.parse(out.stdout)
    expect(result.hCurve.map((k: { T_C: number }) => k.T_C)).toEqual([20, 300, 600, 850])
    expect(result.uncertainty).toHaveLength(4)
  }, 60_000)

  it('exits 2 with field: message on stderr for a bad input', () => {
    const out = run(withLog({ T_C: [850, 840, 'x', ...Array(37).fill(700)] }))
    expect(out.status).toBe(2)
    expect(out.stderr.trim()).toBe('log.T_C.2: not a number')
    expect(out.stdout).toBe('')
  }, 60_000)

  it('exits 2 for a file that is not JSON', () => {
    const file = join(dir, 'broken.json')
    writeFileSync(file, '{ "geometry": ')
    const out = spawnSync('npx', ['tsx', 'scripts/calibrate.ts', file], { encoding: 'utf8' })
    expect(out.status).toBe(2)
    expect(out.stderr).toContain('broken.json: ')
  }, 60_000)
})
