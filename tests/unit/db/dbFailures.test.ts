import { describe, expect, it } from 'vitest'
import { isNodeFailure, isWriteConflict, neverReachedNode } from '../../../server/db/dbFailures'

// Error numbers and codes as MariaDB and mysql2 report them (MariaDB error reference:
// 1213 ER_LOCK_DEADLOCK, 1205 ER_LOCK_WAIT_TIMEOUT, 1047 ER_UNKNOWN_COM_ERROR, 1062 ER_DUP_ENTRY).
const driver = (fields: Record<string, unknown>) => Object.assign(new Error(String(fields.message ?? 'driver error')), fields)
const wrapped = (cause: Error) => Object.assign(new Error('Failed query: …'), { cause })

describe('database error classes', () => {
  it.each([
    ['deadlock / Galera certification failure', driver({ errno: 1213, code: 'ER_LOCK_DEADLOCK' }), true, false, false],
    ['lock wait timeout', driver({ errno: 1205, code: 'ER_LOCK_WAIT_TIMEOUT' }), true, false, false],
    ['node not synced', driver({ errno: 1047, code: 'ER_UNKNOWN_COM_ERROR', message: 'WSREP has not yet prepared node for application use' }), false, true, true],
    ['connection refused', driver({ code: 'ECONNREFUSED' }), false, true, true],
    ['connect timeout', driver({ code: 'ETIMEDOUT' }), false, true, true],
    ['connection closed before the command', driver({ fatal: true, message: 'Can\'t add new command when connection is in closed state' }), false, true, true],
    ['connection lost mid-statement', driver({ code: 'PROTOCOL_CONNECTION_LOST', fatal: true }), false, true, false],
    ['server shutting down', driver({ errno: 1053, code: 'ER_SERVER_SHUTDOWN' }), false, true, false],
    ['duplicate key', driver({ errno: 1062, code: 'ER_DUP_ENTRY' }), false, false, false],
    ['an HTTP 409 thrown by a service', Object.assign(new Error('Furnace 1 is taken'), { statusCode: 409 }), false, false, false],
  ])('%s', (_label, error, conflict, nodeFailure, neverRan) => {
    for (const shape of [error, wrapped(error)]) {
      expect(isWriteConflict(shape)).toBe(conflict)
      expect(isNodeFailure(shape)).toBe(nodeFailure)
      expect(neverReachedNode(shape)).toBe(neverRan)
    }
  })
})
