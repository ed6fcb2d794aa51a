/**
 * The built server as the test stack runs it: the global setup starts the first
 * instance, and the two-instance test a second one on the same database.
 */
import { spawn, type ChildProcess } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { AUTH_SECRET, BASE_URL, MAIL_SMTP_PORT, RECORD_SEAL_KEY } from './stackConfig'
import { DEMO_LOAD_PREFIX, DEMO_SHOP_NAME } from '../../server/db/demo/shop'

const root = fileURLToPath(new URL('../..', import.meta.url))

/** What every instance shares: one database, one public origin, one auth secret and seal key. */
export function sharedServerEnv(databaseUrl: string): NodeJS.ProcessEnv {
  return {
    ...process.env,
    DATABASE_URL: databaseUrl,
    AUTH_ORIGIN: `${BASE_URL}/api/auth`,
    NUXT_AUTH_SECRET: AUTH_SECRET,
    NUXT_RECORD_SEAL_KEY: RECORD_SEAL_KEY,
    NUXT_SHOP_NAME: DEMO_SHOP_NAME,
    NUXT_LOAD_PREFIX: DEMO_LOAD_PREFIX,
  }
}

export async function waitFor(url: string, what: string, seconds = 60): Promise<void> {
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

/** Starts `node .output/server/index.mjs` on `port` and waits for its health check. */
export async function startServer(databaseUrl: string, port: number): Promise<ChildProcess> {
  const server = spawn('node', ['.output/server/index.mjs'], {
    cwd: root,
    stdio: ['ignore', 'ignore', 'inherit'],
    env: {
      ...sharedServerEnv(databaseUrl),
      PORT: String(port),
      NITRO_HOST: '127.0.0.1',
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
  try {
    await waitFor(`http://127.0.0.1:${port}/api/health`, `The Slakewise server on port ${port}`)
  } catch (error) {
    server.kill('SIGTERM')
    throw error
  }
  return server
}
