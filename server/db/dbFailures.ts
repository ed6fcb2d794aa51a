/**
 * Sorts MariaDB errors by what the client should do about them. Drizzle wraps the
 * driver's error in `cause`; both layers are looked at.
 *
 * Error numbers are MariaDB's own: 1213 ER_LOCK_DEADLOCK (also how Galera reports a
 * transaction that failed certification or was aborted by a replicated write),
 * 1205 ER_LOCK_WAIT_TIMEOUT, 1047 ER_UNKNOWN_COM_ERROR (a Galera node that is not
 * synced: "WSREP has not yet prepared node for application use").
 */
interface DriverError {
  code?: string
  errno?: number
  fatal?: boolean
  message?: string
  cause?: unknown
}

const CONFLICT_ERRNOS = new Set([1213, 1205])
const NODE_NOT_READY_ERRNO = 1047
// Nothing reached the server: no socket, or the pool handed out a connection that had just closed.
const CONNECT_CODES = new Set(['ECONNREFUSED', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'ENOTFOUND', 'EAI_AGAIN'])
// The connection died while a statement was on it: the node is gone, the outcome unknown.
const LOST_CODES = new Set(['PROTOCOL_CONNECTION_LOST', 'ECONNRESET', 'EPIPE', 'ER_SERVER_SHUTDOWN', 'ER_CONNECTION_KILLED'])

function layers(error: unknown): DriverError[] {
  const found: DriverError[] = []
  let current = error as DriverError | undefined
  while (current && typeof current === 'object' && found.length < 4) {
    found.push(current)
    current = current.cause as DriverError | undefined
  }
  return found
}

const closedBeforeSending = (layer: DriverError) => /in closed state/.test(layer.message ?? '')

/** Another transaction won a lock or certification: running the whole transaction again can succeed. */
export function isWriteConflict(error: unknown): boolean {
  return layers(error).some((layer) => layer.errno !== undefined && CONFLICT_ERRNOS.has(layer.errno))
}

/** The statement never ran: it is safe to send it to another node. */
export function neverReachedNode(error: unknown): boolean {
  return layers(error).some(
    (layer) => layer.errno === NODE_NOT_READY_ERRNO || (layer.code !== undefined && CONNECT_CODES.has(layer.code)) || closedBeforeSending(layer),
  )
}

/** The node cannot serve now (down, unreachable, not synced, or its connection died): use another for a while. */
export function isNodeFailure(error: unknown): boolean {
  return neverReachedNode(error) || layers(error).some((layer) => layer.code !== undefined && LOST_CODES.has(layer.code))
}
