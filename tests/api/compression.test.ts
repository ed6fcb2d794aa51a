import { request } from 'node:http'
import { gunzipSync } from 'node:zlib'
import { beforeAll, describe, expect, it } from 'vitest'
import { BASE_URL } from '../support/stackConfig'
import { signInDemo, type Client } from '../support/http'

let metallurgist: Client
/** A plan's detail: its curve makes it tens of kilobytes. */
let planPath = ''
beforeAll(async () => {
  metallurgist = await signInDemo('metallurgist')
  planPath = `/api/plans/${(await metallurgist.request('/api/plans')).body[0].id}`
})

/** A GET whose body is read as sent (Node's fetch would unzip it). */
function rawGet(path: string, headers: Record<string, string>) {
  return new Promise<{ headers: Record<string, unknown>; body: Buffer }>((resolve, reject) => {
    request(`${BASE_URL}${path}`, { headers }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (chunk: Buffer) => chunks.push(chunk))
      res.on('end', () => resolve({ headers: res.headers, body: Buffer.concat(chunks) }))
    })
      .on('error', reject)
      .end()
  })
}

describe('compression', () => {
  it('gzips an API answer for a client that accepts it; unzipped, it is the same JSON', async () => {
    const plain = await rawGet(planPath, { cookie: metallurgist.cookie, accept: 'application/json' })
    expect(plain.headers['content-encoding']).toBeUndefined()
    const zipped = await rawGet(planPath, { 'cookie': metallurgist.cookie, 'accept': 'application/json', 'accept-encoding': 'gzip, deflate' })
    expect(zipped.headers['content-encoding']).toBe('gzip')
    expect(String(zipped.headers.vary)).toMatch(/accept-encoding/i)
    expect(zipped.headers['content-type']).toMatch(/^application\/json/)
    expect(zipped.body.length).toBeLessThan(plain.body.length)
    expect(JSON.parse(gunzipSync(zipped.body).toString('utf8'))).toEqual(JSON.parse(plain.body.toString('utf8')))
  })

  it('gzips a rendered page; sends small answers and clients without gzip as they are', async () => {
    const page = await rawGet('/login', { 'accept-encoding': 'gzip' })
    expect(page.headers['content-encoding']).toBe('gzip')
    expect(gunzipSync(page.body).toString('utf8')).toContain('<html')
    const health = await rawGet('/api/health', { 'accept-encoding': 'gzip' })
    expect(health.headers['content-encoding']).toBeUndefined()
    const identity = await rawGet('/login', { 'accept-encoding': 'identity' })
    expect(identity.headers['content-encoding']).toBeUndefined()
    expect(identity.body.toString('utf8')).toContain('<html')
  })
})
