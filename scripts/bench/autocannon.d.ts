// The parts of autocannon 9 that bench:api uses (the package ships no types).
declare module 'autocannon' {
  import type { EventEmitter } from 'node:events'

  interface Request {
    method?: string
    path?: string
    headers?: Record<string, string>
    body?: string
    setupRequest?: (request: Request) => Request
  }
  interface Options {
    url: string | string[]
    connections?: number
    duration?: number
    method?: string
    headers?: Record<string, string>
    body?: string
    requests?: Request[]
    setupClient?: (client: EventEmitter) => void
  }
  interface Result {
    requests: { average: number; total: number }
    non2xx: number
    errors: number
    timeouts: number
    duration: number
  }
  function autocannon(options: Options): Promise<Result>
  export default autocannon
}
