/**
 * The command line on the inputs that once hung it or crashed it with a stack trace:
 * each ends with "field: message" on stderr and exit 2.
 */
import { spawn } from 'node:child_process'
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { ANSWER_WITHIN_MS, PATHOLOGICAL_CASES } from './pathologicalCases'

describe('the command line refuses the pathological cases with field: message and exit 2', () => {
  const folder = mkdtempSync(join(tmpdir(), 'terminates-'))
  /** Runs the CLI on a case; a hang is cut off at 60 s (status null). */
  const cli = (input: unknown, name: string) =>
    new Promise<{ status: number | null; stderr: string; ms: number }>((resolve) => {
      const file = join(folder, `${name}.json`)
      writeFileSync(file, JSON.stringify(input))
      const start = performance.now()
      const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/cooldown.ts', file], { timeout: 60_000 })
      let stderr = ''
      child.stderr.on('data', (chunk) => (stderr += chunk))
      child.on('close', (status) => resolve({ status, stderr, ms: performance.now() - start }))
    })

  it('every case exits 2 with its field on stderr, within 5 s of a trivially bad case (the CLI start-up on a busy machine)', async () => {
    // One at a time: parallel start-ups on a shared two-core machine only measure each other.
    const baseline = await cli({ geometry: 'cube' }, 'baseline')
    expect(baseline.status).toBe(2)
    for (const [i, pathological] of PATHOLOGICAL_CASES.entries()) {
      const run = await cli(pathological.input, `case-${i}`)
      expect(run.status).toBe(2)
      expect(run.stderr.startsWith(`${pathological.field}: `)).toBe(true)
      expect(run.stderr).toMatch(pathological.message)
      expect(run.stderr).not.toMatch(/\bat .*\.ts:\d+/)
      expect(run.ms - baseline.ms).toBeLessThan(ANSWER_WITHIN_MS)
    }
  }, 600_000)
})
