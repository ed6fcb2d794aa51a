/**
 * The test mail catcher (maildev) on the test ports, as a detached process whose pid is
 * kept in a file: the global setup starts it, and a test (in another process) can stop
 * it to play a mail-server outage and start it again, with or without extra options.
 */
import { spawn } from 'node:child_process'
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { MAIL_API, MAIL_SMTP_PORT, MAIL_WEB_PORT } from './stackConfig'
import { until } from './poll'

const root = fileURLToPath(new URL('../..', import.meta.url))
const pidFile = `${root}.data/test-maildev.pid`

async function healthy(): Promise<boolean> {
  try {
    return (await fetch(`${MAIL_API}/api/healthz`)).ok
  } catch {
    return false
  }
}

/** Starts maildev; `extraArgs` e.g. ['--incoming-user', 'u', '--incoming-pass', 'p'] makes it refuse unauthenticated mail. */
export async function startMailCatcher(extraArgs: string[] = []): Promise<void> {
  await stopMailCatcher()
  if (await healthy()) throw new Error(`Something else already answers on ${MAIL_API}; stop it or choose other test ports`)
  mkdirSync(`${root}.data`, { recursive: true })
  const child = spawn(
    `${root}node_modules/.bin/maildev`,
    ['--smtp', String(MAIL_SMTP_PORT), '--ip', '127.0.0.1', '--web', String(MAIL_WEB_PORT), '--web-ip', '127.0.0.1', '--silent', ...extraArgs],
    { cwd: root, stdio: 'ignore', detached: true },
  )
  child.unref()
  writeFileSync(pidFile, String(child.pid))
  await until(healthy, (up) => up, 30, 'The mail catcher did not answer')
}

/** Stops the maildev this helper started (by its recorded pid) and waits until it is gone. */
export async function stopMailCatcher(): Promise<void> {
  let pid: number
  try {
    pid = Number(readFileSync(pidFile, 'utf8'))
  } catch {
    return
  }
  try {
    process.kill(pid, 'SIGTERM')
  } catch {
    // already gone
  }
  rmSync(pidFile, { force: true })
  await until(healthy, (up) => !up, 30, 'The mail catcher did not stop')
}

export interface CaughtMail {
  id: string
  subject: string
  to: { address: string }[]
  html: string
  text: string
  attachments?: { generatedFileName: string; filename: string; contentType: string; size: number }[]
}

export async function caughtMail(): Promise<CaughtMail[]> {
  const response = await fetch(`${MAIL_API}/api/email`)
  if (!response.ok) throw new Error(`maildev answered ${response.status}`)
  return (await response.json()) as CaughtMail[]
}

export async function clearCaughtMail(): Promise<void> {
  await fetch(`${MAIL_API}/api/email/all`, { method: 'DELETE' })
}

/**
 * An attachment's bytes. Under load maildev has answered 500 for an attachment of a message
 * it had just listed, then served it moments later, so a refusal is asked again for up to 10 s.
 */
export async function caughtAttachment(mail: CaughtMail, generatedFileName: string): Promise<Buffer> {
  const read = () => fetch(`${MAIL_API}/api/email/${mail.id}/attachment/${generatedFileName}`)
  const response = await until(read, (answer) => answer.ok, 10, `attachment ${generatedFileName} served`).catch(() => read())
  if (!response.ok) throw new Error(`attachment ${generatedFileName}: ${response.status}`)
  return Buffer.from(await response.arrayBuffer())
}

/** Polls the catcher until `select` picks `count` messages (no more), or throws with what it saw. */
export async function waitForMail(select: (mail: CaughtMail) => boolean, count: number, seconds = 30): Promise<CaughtMail[]> {
  let seen: CaughtMail[] = []
  try {
    await until(async () => (seen = (await caughtMail()).filter(select)).length, (found) => found >= count, seconds, `Expected ${count} message(s)`)
  } catch (error) {
    throw new Error(`${(error as Error).message}; saw ${seen.length}`, { cause: error })
  }
  return seen
}
