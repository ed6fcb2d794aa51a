import { execFileSync, spawn } from 'node:child_process'
import { mkdtempSync, statSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'

const lib = fileURLToPath(new URL('../../../scripts/lib.sh', import.meta.url))

describe('scripts/lib.sh', () => {
  it('writes secrets under .data readable by their owner only (0600, folder 0700)', () => {
    const dir = mkdtempSync(join(tmpdir(), 'slakewise-secret-'))
    const secret = execFileSync('bash', ['-c', `source ${lib} && umask 022 && ensure_secret probe-key`], { cwd: dir, encoding: 'utf8' })
    expect(secret).toMatch(/^[0-9a-f]{64}$/)
    expect(statSync(join(dir, '.data/probe-key')).mode & 0o777).toBe(0o600)
    expect(statSync(join(dir, '.data')).mode & 0o777).toBe(0o700)
  })

  it('stop_process ends a server busy in a computation that ignores TERM, after the grace period', async () => {
    // It says "busy" once its TERM handler is in place and the loop is about to start.
    const busy = spawn('node', ['-e', 'process.on(\'SIGTERM\', () => {}); process.stdout.write(\'busy\', () => { for (;;) {} })'], { stdio: ['ignore', 'pipe', 'ignore'] })
    await new Promise((resolve) => busy.stdout.once('data', resolve))
    const started = Date.now()
    execFileSync('bash', ['-c', `source ${lib} && stop_process ${busy.pid} 1`], { stdio: 'ignore' })
    const exited = await new Promise<NodeJS.Signals | null>((resolve) => busy.once('exit', (_code, signal) => resolve(signal)))
    expect(exited).toBe('SIGKILL')
    // One second of grace, then KILL; the margin is for a loaded test machine.
    expect(Date.now() - started).toBeLessThan(15_000)
  })
})
