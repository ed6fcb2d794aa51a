import { createHash } from 'node:crypto'
import type { H3Event } from 'h3'

/**
 * Tags the answer with a weak ETag (a hash of `identityJson`, the JSON of the part of the
 * body that matters to the client; taken as text so a caller can send the same text
 * without serialising twice) and sets 304 when the client already holds it. Returns true
 * when the handler should answer without a body. `no-cache` makes browsers ask every
 * time, so a change is never hidden behind a cached copy.
 */
export function answeredUnchanged(event: H3Event, identityJson: string): boolean {
  const tag = `W/"${createHash('sha256').update(identityJson).digest('base64url').slice(0, 27)}"`
  setResponseHeader(event, 'etag', tag)
  setResponseHeader(event, 'cache-control', 'private, no-cache')
  const held = getRequestHeader(event, 'if-none-match')
  if (!held || !held.split(',').some((candidate) => candidate.trim() === tag)) return false
  setResponseStatus(event, 304)
  return true
}
