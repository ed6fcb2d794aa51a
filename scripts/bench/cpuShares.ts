// Where the machine's CPU went during a benchmark run (Linux /proc, proc(5)): the CPU
// time of named processes (all their threads) and of the whole machine, sampled before
// and after, so a ratio can be read against what the load generator, the database and
// everything else on the machine took from the same cores.
import { execFileSync } from 'node:child_process'
import { readFileSync } from 'node:fs'

const ticksPerSecond = Number(execFileSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).trim())

/** utime + stime of a process (fields 14 and 15 of /proc/<pid>/stat, after the parenthesised name), in s. */
function processSeconds(pid: number): number {
  const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ')
  return (Number(fields[11]) + Number(fields[12])) / ticksPerSecond
}

/** Busy and total CPU time of the machine over all cores (the first line of /proc/stat), in s. */
function machineSeconds(): { busy: number; total: number } {
  const [, ...values] = readFileSync('/proc/stat', 'utf8').split('\n')[0]!.trim().split(/\s+/)
  const ticks = values.map(Number)
  // user nice system idle iowait irq softirq steal (guest time is already inside user).
  const total = ticks.slice(0, 8).reduce((a, b) => a + b, 0)
  const idle = ticks[3]! + ticks[4]!
  return { busy: (total - idle) / ticksPerSecond, total: total / ticksPerSecond }
}

export type CpuShares = Record<string, number>

/**
 * Starts a sample; the returned function ends it and gives each named process's CPU use
 * in cores (CPU seconds per wall-clock second), plus `others` (every other process on
 * the machine) and `idle`. `self` is this process (load generator and all).
 */
export function sampleCpu(processes: Record<string, number>): () => CpuShares {
  const startedAt = process.hrtime.bigint()
  const self = process.cpuUsage()
  const machine = machineSeconds()
  const before = Object.fromEntries(Object.entries(processes).map(([name, pid]) => [name, processSeconds(pid)]))
  return () => {
    const wall = Number(process.hrtime.bigint() - startedAt) / 1e9
    const used = process.cpuUsage(self)
    const shares: CpuShares = { self: (used.user + used.system) / 1e6 / wall }
    for (const [name, pid] of Object.entries(processes)) shares[name] = (processSeconds(pid) - before[name]!) / wall
    const after = machineSeconds()
    const known = Object.values(shares).reduce((a, b) => a + b, 0)
    shares.others = Math.max(0, (after.busy - machine.busy) / wall - known)
    shares.idle = (after.total - machine.total - (after.busy - machine.busy)) / wall
    return shares
  }
}

export const formatShares = (shares: CpuShares): string =>
  Object.entries(shares)
    .map(([name, cores]) => `${name} ${cores.toFixed(2)}`)
    .join(', ')
