/**
 * Global setup for the api and e2e tiers: a fresh test database on its own MariaDB
 * instance, the mail catcher and the built server, all on loopback and on ports of
 * their own. Both tiers name this file; the reference count makes them share one stack.
 */
import { execFileSync, spawn, type ChildProcess } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { APP_PORT, AUTH_SECRET, BASE_URL, MAIL_SMTP_PORT, RECORD_SEAL_KEY } from '../support/stackConfig'
import { startMailCatcher, stopMailCatcher } from '../support/mailCatcher'
import { DEMO_LOAD_PREFIX, DEMO_SHOP_NAME } from '../../server/db/demo/shop'

const root = fileURLToPath(new URL('../..', import.meta.url))

interface Stack {
  users: number
  children: ChildProcess[]
}
const registry = globalThis as typeof globalThis & { __slakewiseStack?: Promise<Stack> }

function run(command: string, args: string[], env: NodeJS.ProcessEnv = process.env): string {
  return execFileSync(command, args, { cwd: root, env, encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'] })
}

async function waitFor(url: string, what: string, seconds = 60): Promise<void> {
  const deadline = Date.now() + seconds * 1000
  while (Date.now() < deadline) {
    try {
      if ((await fetch(url)).ok) return
    } catch {
      // not up yet
    }
    await new Promise((resolve) => setTimeout(resolve, 250))
  }
  throw new Error(`${what} did not answer at ${url} within ${seconds} s`)
}

async function startStack(): Promise<Stack> {
  run('bash', ['scripts/db.sh', 'reset', 'test'])
  const databaseUrl = run('bash', ['scripts/db.sh', 'url', 'test']).trim()
  const env = { ...process.env, DATABASE_URL: databaseUrl, AUTH_ORIGIN: `${BASE_URL}/api/auth`, NUXT_RECORD_SEAL_KEY: RECORD_SEAL_KEY, NUXT_SHOP_NAME: DEMO_SHOP_NAME, NUXT_LOAD_PREFIX: DEMO_LOAD_PREFIX }
  run('npx', ['tsx', 'scripts/migrate.ts'], env)
  run('npx', ['tsx', 'scripts/seed.ts'], env)
  run('bash', ['-c', 'source scripts/lib.sh && mkdir -p .data && build_if_stale'])

  // Detached and tracked by a pid file, so the outbox tests can stop and restart it.
  await startMailCatcher()
  const server = spawn('node', ['.output/server/index.mjs'], {
    cwd: root,
    stdio: ['ignore', 'ignore', 'inherit'],
    env: {
      ...env,
      PORT: String(APP_PORT),
      NITRO_HOST: '127.0.0.1',
      NUXT_AUTH_SECRET: AUTH_SECRET,
      SMTP_URL: `smtp://127.0.0.1:${MAIL_SMTP_PORT}`,
      // A quick outbox so mail tests take seconds: poll every 0.3 s, retry after 0.3 s doubling to 1.5 s.
      OUTBOX_POLL_MS: '300',
      OUTBOX_RETRY_BASE_MS: '300',
      OUTBOX_RETRY_MAX_MS: '1500',
      NODE_ENV: 'production',
      // The sign-in limit tests pose as many client addresses through X-Forwarded-For.
      SLAKEWISE_TRUST_PROXY: '1',
    },
  })
  await waitFor(`${BASE_URL}/api/health`, 'The Slakewise server')
  return { users: 0, children: [server] }
}

export async function setup() {
  registry.__slakewiseStack ??= startStack()
  const stack = await registry.__slakewiseStack
  stack.users += 1
}

export async function teardown() {
  const stack = await registry.__slakewiseStack
  if (!stack) return
  stack.users -= 1
  if (stack.users > 0) return
  for (const child of stack.children) child.kill('SIGTERM')
  await stopMailCatcher()
  run('bash', ['scripts/db.sh', 'stop', 'test'])
  delete registry.__slakewiseStack
}
