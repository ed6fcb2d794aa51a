/**
 * Global setup for the api and e2e tiers: a fresh test database on its own MariaDB
 * instance, the mail catcher and the built server, all on loopback and on ports of
 * their own. Both tiers name this file; the reference count makes them share one stack.
 */
import { execFileSync, type ChildProcess } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { APP_PORT } from '../support/stackConfig'
import { startMailCatcher, stopMailCatcher } from '../support/mailCatcher'
import { sharedServerEnv, startServer } from '../support/server'

const root = fileURLToPath(new URL('../..', import.meta.url))

interface Stack {
  users: number
  children: ChildProcess[]
}
const registry = globalThis as typeof globalThis & { __slakewiseStack?: Promise<Stack> }

function run(command: string, args: string[], env: NodeJS.ProcessEnv = process.env): string {
  return execFileSync(command, args, { cwd: root, env, encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'] })
}

async function startStack(): Promise<Stack> {
  run('bash', ['scripts/db.sh', 'reset', 'test'])
  const databaseUrl = run('bash', ['scripts/db.sh', 'url', 'test']).trim()
  const env = sharedServerEnv(databaseUrl)
  run('npx', ['tsx', 'scripts/migrate.ts'], env)
  run('npx', ['tsx', 'scripts/seed.ts'], env)
  run('bash', ['-c', 'source scripts/lib.sh && mkdir -p .data && build_if_stale'])

  // Detached and tracked by a pid file, so the outbox tests can stop and restart it.
  await startMailCatcher()
  const server = await startServer(databaseUrl, APP_PORT)
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
