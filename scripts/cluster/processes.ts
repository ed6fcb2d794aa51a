/** The processes `npm run test:cluster` runs beside the Galera cluster: app instances and a mail catcher. */
import { execFileSync, spawn, type ChildProcess } from 'node:child_process'
import { once } from 'node:events'
import { fileURLToPath } from 'node:url'
import { waitFor } from '../../tests/support/server'

export const root = fileURLToPath(new URL('../..', import.meta.url))

export function sh(command: string, args: string[], env: NodeJS.ProcessEnv = process.env): string {
  return execFileSync(command, args, { cwd: root, env, encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'] })
}

export const cluster = (...args: string[]) => sh('bash', ['scripts/cluster.sh', ...args])

export async function startMailCatcher(smtpPort: number, webPort: number): Promise<ChildProcess> {
  const child = spawn(`${root}node_modules/.bin/maildev`, ['--smtp', String(smtpPort), '--ip', '127.0.0.1', '--web', String(webPort), '--web-ip', '127.0.0.1', '--silent'], { cwd: root, stdio: 'ignore' })
  await waitFor(`http://127.0.0.1:${webPort}/api/healthz`, 'The mail catcher', 90)
  return child
}

/** A built server on `port`; its DATABASE_URL lists the nodes in the order it should prefer them. */
export async function startInstance(port: number, env: Record<string, string>, log: string[]): Promise<ChildProcess> {
  const child = spawn('node', ['.output/server/index.mjs'], { cwd: root, stdio: ['ignore', 'ignore', 'pipe'], env: { ...process.env, ...env, PORT: String(port), NITRO_HOST: '127.0.0.1', NODE_ENV: 'production' } })
  child.stderr!.setEncoding('utf8').on('data', (text: string) => log.push(...text.trim().split('\n').map((line) => `[:${port}] ${line}`)))
  await waitFor(`http://127.0.0.1:${port}/api/health`, `The app instance on port ${port}`, 90)
  return child
}

export async function stop(child: ChildProcess | undefined): Promise<void> {
  if (!child || child.exitCode !== null) return
  child.kill('SIGTERM')
  await once(child, 'exit')
}
