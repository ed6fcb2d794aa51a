import { describe, expect, it } from 'vitest'
import type { PoolConnection } from 'mysql2/promise'
import { FailoverPool, type NodePool } from '../../../server/db/failoverPool'

const refused = () => Object.assign(new Error('connect ECONNREFUSED'), { code: 'ECONNREFUSED' })
const notSynced = () => Object.assign(new Error('WSREP has not yet prepared node for application use'), { errno: 1047 })
const lost = () => Object.assign(new Error('Connection lost'), { code: 'PROTOCOL_CONNECTION_LOST', fatal: true })

/** A stand-in node: answers with its name, or fails with what `failure` returns. */
function fakeNode(name: string) {
  const state = { failure: undefined as (() => Error) | undefined, calls: 0, destroyed: 0, released: 0 }
  const answer = async () => {
    state.calls += 1
    if (state.failure) throw state.failure()
    return [[{ node: name }], []]
  }
  const pool = {
    query: answer,
    execute: answer,
    async getConnection() {
      if (state.failure) throw state.failure()
      const connection = { query: answer, execute: answer, destroy: () => void (state.destroyed += 1), release: () => void (state.released += 1) }
      return connection as unknown as PoolConnection
    },
    async end() {},
  } as unknown as NodePool
  return { name, pool, state }
}

function cluster() {
  let clock = 1000
  const nodes = [fakeNode('db1'), fakeNode('db2'), fakeNode('db3')]
  const pool = new FailoverPool(nodes, { restMs: 5000, now: () => clock })
  return { nodes, pool, advance: (ms: number) => (clock += ms) }
}

const answeredBy = async (result: Promise<unknown>) => ((await result) as [{ node: string }[]])[0][0]!.node

describe('FailoverPool', () => {
  it('uses the first node while it answers', async () => {
    const { pool } = cluster()
    expect(await answeredBy(pool.query('SELECT 1'))).toBe('db1')
    expect(await answeredBy(pool.execute('SELECT 1'))).toBe('db1')
  })

  it('sends a statement that never reached a down or unsynced node to the next one', async () => {
    const { nodes, pool } = cluster()
    nodes[0]!.state.failure = refused
    nodes[1]!.state.failure = notSynced
    expect(await answeredBy(pool.query('SELECT 1'))).toBe('db3')
    expect(pool.currentNode()).toBe('db3')
  })

  it('passes a failed node over for restMs, then tries it first again', async () => {
    const { nodes, pool, advance } = cluster()
    nodes[0]!.state.failure = refused
    await pool.query('SELECT 1')
    nodes[0]!.state.failure = undefined
    advance(4999)
    expect(await answeredBy(pool.query('SELECT 1'))).toBe('db2')
    advance(1)
    expect(await answeredBy(pool.query('SELECT 1'))).toBe('db1')
  })

  it('does not resend a statement whose connection died mid-way, but rests the node', async () => {
    const { nodes, pool } = cluster()
    nodes[0]!.state.failure = lost
    await expect(pool.execute('UPDATE t SET n = n + 1')).rejects.toThrow('Connection lost')
    expect(nodes[1]!.state.calls).toBe(0)
    expect(pool.currentNode()).toBe('db2')
  })

  it('hands out a connection from the next node when one refuses, and drops a connection whose node fails', async () => {
    const { nodes, pool } = cluster()
    nodes[0]!.state.failure = refused
    const connection = await pool.getConnection()
    expect(((await connection.query('SELECT 1')) as unknown as [{ node: string }[]])[0][0]!.node).toBe('db2')
    nodes[1]!.state.failure = lost
    await expect(connection.query('COMMIT')).rejects.toThrow('Connection lost')
    expect(nodes[1]!.state.destroyed).toBe(1)
    expect(pool.currentNode()).toBe('db3')
  })

  it('passes other errors through without blaming the node', async () => {
    const { nodes, pool } = cluster()
    nodes[0]!.state.failure = () => Object.assign(new Error('Duplicate entry'), { errno: 1062, code: 'ER_DUP_ENTRY' })
    await expect(pool.query('INSERT …')).rejects.toThrow('Duplicate entry')
    expect(pool.currentNode()).toBe('db1')
  })

  it('tries every node, soonest back first, when all are resting, and throws the last failure', async () => {
    const { nodes, pool } = cluster()
    for (const node of nodes) node.state.failure = refused
    await expect(pool.query('SELECT 1')).rejects.toThrow('ECONNREFUSED')
    expect(nodes.map((node) => node.state.calls)).toEqual([1, 1, 1])
    nodes[2]!.state.failure = undefined
    expect(await answeredBy(pool.query('SELECT 1'))).toBe('db3')
  })
})
