import { execFile, spawn } from 'node:child_process'
import { statSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { promisify } from 'node:util'
import { afterAll, describe, expect, it } from 'vitest'
import { APP_PORT, AUTH_SECRET, BASE_URL, RECORD_SEAL_KEY } from '../support/stackConfig'
import { testDatabaseUrl } from '../support/db'
import { demoUser, signInAs } from '../support/http'
import { until } from '../support/poll'

// Issue 11 items 2 and 6: a shop's first administrator without a published password,
// demo sign-ins off loopback, and the start-up refusal of bad secrets. Commands and
// extra servers start slowly on a loaded machine, hence the long timeouts.
const root = fileURLToPath(new URL('../..', import.meta.url))
const run = promisify(execFile)

function createAdmin(email: string, name: string) {
  return run('node_modules/.bin/tsx', ['scripts/create-admin.ts', '--email', email, '--name', name], { cwd: root, env: { ...process.env, DATABASE_URL: testDatabaseUrl() } })
}

/** A second server on the same test database, with its own port and environment. */
function startServer(port: number, env: Record<string, string>) {
  let output = ''
  const child = spawn('node', ['.output/server/index.mjs'], {
    cwd: root,
    stdio: ['ignore', 'pipe', 'pipe'],
    env: {
      ...process.env,
      DATABASE_URL: testDatabaseUrl(),
      AUTH_ORIGIN: `http://127.0.0.1:${port}/api/auth`,
      PORT: String(port),
      NUXT_AUTH_SECRET: AUTH_SECRET,
      NUXT_RECORD_SEAL_KEY: RECORD_SEAL_KEY,
      OUTBOX_WORKER: 'off',
      NODE_ENV: 'production',
      ...env,
    },
  })
  child.stdout.on('data', (chunk) => (output += chunk))
  child.stderr.on('data', (chunk) => (output += chunk))
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)))
  return { child, exited, output: () => output }
}

const started: ReturnType<typeof startServer>[] = []
afterAll(() => {
  for (const server of started) server.child.kill('SIGTERM')
})

describe('the first administrator', { timeout: 180_000 }, () => {
  const email = `first-admin-${Date.now()}@kestrelbay.example`

  it('is created by a command that prints a generated password once; the account must change it before anything else', async () => {
    const { stdout } = await createAdmin(email, 'Ines Marwick')
    const generated = stdout.match(/one-time password: (\S+)/)?.[1]
    expect(generated).toMatch(/^[A-Za-z0-9_-]{20}$/)
    const client = (await signInAs(email, generated!))!
    expect(client).not.toBeNull()
    const session = await client.request('/api/auth/session')
    expect(session.body.user).toMatchObject({ email, role: 'admin', mustChangePassword: true })
    const blocked = await client.request('/api/users')
    expect(blocked.status).toBe(403)
    expect(blocked.body.statusMessage).toBe('Choose your own password first')

    const changed = await client.request('/api/account/password', { method: 'POST', body: { currentPassword: generated, newPassword: 'Lathe-meadow-38-cinder' } })
    expect(changed.status).toBe(204)
    const own = (await signInAs(email, 'Lathe-meadow-38-cinder'))!
    expect((await own.request('/api/users')).status).toBe(200)
    expect((await own.request('/api/auth/session')).body.user.mustChangePassword).toBe(false)
  })

  it('refuses a second account with the same e-mail and a bad address, creating nothing', async () => {
    await expect(createAdmin(email, 'Ines Again')).rejects.toMatchObject({ code: 1, stderr: expect.stringContaining('already has an account; nothing was created') })
    await expect(createAdmin('not-an-address', 'Some One')).rejects.toMatchObject({ code: 2, stderr: expect.stringContaining('--email: Enter a valid e-mail address') })
  })
})

describe('the demo shop', { timeout: 180_000 }, () => {
  it('is announced while its accounts exist', async () => {
    expect(await (await fetch(`${BASE_URL}/api/demo-shop`)).json()).toEqual({ demoShop: true })
  })

  it('demo sign-ins are refused when the server listens on every interface; other accounts still sign in', async () => {
    const port = APP_PORT + 7
    const server = startServer(port, { NITRO_HOST: '0.0.0.0' })
    started.push(server)
    await until(() => fetch(`http://127.0.0.1:${port}/api/health`).then((r) => r.ok, () => false), (ok) => ok, 120, 'second server up')
    const via = { baseUrl: `http://127.0.0.1:${port}`, address: '198.51.100.200' }
    expect(await signInAs(demoUser('admin').email, demoUser('admin').password, via)).toBeNull()
    const email = `lan-user-${Date.now()}@kestrelbay.example`
    const { stdout } = await createAdmin(email, 'Odile Brennan')
    const generated = stdout.match(/one-time password: (\S+)/)![1]!
    expect(await signInAs(email, generated, via)).not.toBeNull()
  })
})

describe('secrets at start-up', { timeout: 180_000 }, () => {
  it.each([
    ['the .env.example auth secret', { NUXT_AUTH_SECRET: 'change-me-to-a-long-random-string' }, 'NUXT_AUTH_SECRET still holds a placeholder ("change-me")'],
    ['a 10-character seal key', { NUXT_RECORD_SEAL_KEY: 'short-key1' }, 'NUXT_RECORD_SEAL_KEY has 10 characters; at least 32 are needed'],
    ['a repeated-letter auth secret', { NUXT_AUTH_SECRET: 'x'.repeat(48) }, 'NUXT_AUTH_SECRET is too easy to guess'],
  ])('refuses to start with %s, saying which and why', async (_label, env, message) => {
    const server = startServer(APP_PORT + 8, env)
    started.push(server)
    const code = await Promise.race([server.exited, new Promise<string>((resolve) => setTimeout(() => resolve('still running'), 120_000))])
    expect(code).toBe(1)
    expect(server.output()).toContain(message)
  })

  it('the private database password is generated and kept owner-readable in .data', () => {
    const url = new URL(testDatabaseUrl())
    expect(url.password).toMatch(/^[0-9a-f]{48}$/)
    expect(statSync(`${root}.data/test/app-password`).mode & 0o777).toBe(0o600)
  })
})
