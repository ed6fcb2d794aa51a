import { describe, expect, it } from 'vitest'
import { retryTransient } from '../../../server/db/retryTransaction'

const deadlock = () => Object.assign(new Error('Failed query: commit'), { cause: Object.assign(new Error('Deadlock found'), { errno: 1213 }) })

function recorder() {
  const waits: number[] = []
  return { waits, policy: { attempts: 5, baseDelayMs: 20, random: () => 0.5, sleep: async (ms: number) => void waits.push(ms) } }
}

describe('retryTransient', () => {
  it('runs a transaction that lost a certification race again until it commits', async () => {
    const { waits, policy } = recorder()
    let runs = 0
    const result = await retryTransient(async () => {
      runs += 1
      if (runs < 3) throw deadlock()
      return 'committed'
    }, policy)
    expect(result).toBe('committed')
    expect(runs).toBe(3)
    // Half of 20 ms, then half of 40 ms (random() = 0.5): exponential backoff with jitter.
    expect(waits).toEqual([10, 20])
  })

  it('gives up after the bound and throws the last conflict', async () => {
    const { waits, policy } = recorder()
    let runs = 0
    await expect(retryTransient(async () => {
      runs += 1
      throw deadlock()
    }, policy)).rejects.toThrow('Failed query: commit')
    expect(runs).toBe(5)
    expect(waits).toEqual([10, 20, 40, 80])
  })

  it('never repeats a transaction that failed for its own reasons', async () => {
    const { policy } = recorder()
    let runs = 0
    const refusal = Object.assign(new Error('Furnace 1 is taken by KB-2026-0001'), { statusCode: 409 })
    await expect(retryTransient(async () => {
      runs += 1
      throw refusal
    }, policy)).rejects.toBe(refusal)
    expect(runs).toBe(1)
  })

  it('runs again when the node failed (the failover pool then picks another)', async () => {
    const { policy } = recorder()
    let runs = 0
    const result = await retryTransient(async () => {
      runs += 1
      if (runs === 1) throw Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:3410'), { code: 'ECONNREFUSED' })
      return runs
    }, policy)
    expect(result).toBe(2)
  })
})
