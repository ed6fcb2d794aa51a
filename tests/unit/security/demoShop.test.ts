import { describe, expect, it } from 'vitest'
import { demoSignInsAllowed } from '../../../server/security/demoShop'

describe('demo sign-ins only on loopback', () => {
  it.each([
    [{ NITRO_HOST: '127.0.0.1' }, true],
    [{ NITRO_HOST: '127.0.1.1' }, true],
    [{ NITRO_HOST: '::1' }, true],
    [{ NITRO_HOST: '[::1]' }, true],
    [{ HOST: 'localhost' }, true],
    [{ NITRO_HOST: '0.0.0.0' }, false],
    [{ NITRO_HOST: '::' }, false],
    [{ NITRO_HOST: '192.168.10.4' }, false],
    [{}, false],
  ])('%j → %s', (env, allowed) => {
    expect(demoSignInsAllowed(env as NodeJS.ProcessEnv)).toBe(allowed)
  })
})
