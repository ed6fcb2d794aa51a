import type { Pool, PoolConnection } from 'mysql2/promise'
import { isNodeFailure, neverReachedNode } from './dbFailures'

/** What the failover pool needs of a node's pool (mysql2's promise pool, or a stand-in in tests). */
export type NodePool = Pick<Pool, 'query' | 'execute' | 'getConnection' | 'end'>

interface Node {
  name: string
  pool: NodePool
  restingUntil: number
}

export interface FailoverOptions {
  /** How long a failed node is passed over before it is tried first again. */
  restMs?: number
  now?: () => number
  onNodeFailure?: (node: string, error: unknown) => void
}

/**
 * Several database nodes behind the interface Drizzle uses of a mysql2 pool (query,
 * execute, getConnection). Each call goes to the first node in list order that has
 * not failed recently. A node that refuses connections, is not synced, or drops a
 * connection rests for `restMs`; a statement that never reached it is sent to the
 * next node at once. If every node is resting, they are tried anyway, soonest back first.
 */
export class FailoverPool {
  private readonly nodes: Node[]
  private readonly restMs: number
  private readonly now: () => number
  private readonly onNodeFailure: (node: string, error: unknown) => void

  constructor(pools: { name: string; pool: NodePool }[], options: FailoverOptions = {}) {
    if (pools.length === 0) throw new Error('FailoverPool needs at least one node')
    this.nodes = pools.map(({ name, pool }) => ({ name, pool, restingUntil: 0 }))
    this.restMs = options.restMs ?? 5000
    this.now = options.now ?? Date.now
    this.onNodeFailure = options.onNodeFailure ?? (() => {})
  }

  /** Nodes in the order to try them now. */
  private candidates(): Node[] {
    const now = this.now()
    const ready = this.nodes.filter((node) => node.restingUntil <= now)
    const resting = this.nodes.filter((node) => node.restingUntil > now).sort((a, b) => a.restingUntil - b.restingUntil)
    return [...ready, ...resting]
  }

  private rest(node: Node, error: unknown) {
    node.restingUntil = this.now() + this.restMs
    this.onNodeFailure(node.name, error)
  }

  /** The node the next call will use first (for logs and tests). */
  currentNode(): string {
    return this.candidates()[0]!.name
  }

  private async onAnyNode<T>(call: (pool: NodePool) => Promise<T>): Promise<T> {
    let lastError: unknown
    for (const node of this.candidates()) {
      try {
        return await call(node.pool)
      } catch (error) {
        if (!isNodeFailure(error)) throw error
        this.rest(node, error)
        // A statement that may have run must not run twice; the caller decides (transactions retry whole).
        if (!neverReachedNode(error)) throw error
        lastError = error
      }
    }
    throw lastError
  }

  query: NodePool['query'] = ((...args: unknown[]) => this.onAnyNode((pool) => (pool.query as (...a: unknown[]) => Promise<unknown>)(...args))) as NodePool['query']

  execute: NodePool['execute'] = ((...args: unknown[]) => this.onAnyNode((pool) => (pool.execute as (...a: unknown[]) => Promise<unknown>)(...args))) as NodePool['execute']

  /** A connection for a transaction; if its node fails mid-way, the connection is dropped and the node rests. */
  async getConnection(): Promise<PoolConnection> {
    let lastError: unknown
    for (const node of this.candidates()) {
      let connection: PoolConnection
      try {
        connection = await node.pool.getConnection()
      } catch (error) {
        if (!isNodeFailure(error)) throw error
        this.rest(node, error)
        lastError = error
        continue
      }
      return this.watched(connection, node)
    }
    throw lastError
  }

  private watched(connection: PoolConnection, node: Node): PoolConnection {
    const onFailure = (error: unknown) => {
      if (!isNodeFailure(error)) return
      this.rest(node, error)
      // Not back into the pool: Drizzle leaks a connection whose BEGIN failed, and a dead one is no use.
      connection.destroy()
    }
    return new Proxy(connection, {
      get(target, property) {
        const value = Reflect.get(target, property, target)
        if (property !== 'query' && property !== 'execute') return typeof value === 'function' ? value.bind(target) : value
        return async (...args: unknown[]) => {
          try {
            return await value.apply(target, args)
          } catch (error) {
            onFailure(error)
            throw error
          }
        }
      },
    })
  }

  async end(): Promise<void> {
    await Promise.all(this.nodes.map((node) => node.pool.end()))
  }
}
