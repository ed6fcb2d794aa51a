import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type mysql from 'mysql2/promise'
import { APP_PORT, BASE_URL } from '../support/stackConfig'
import { connectTestDb } from '../support/db'
import { signInDemo, type Client } from '../support/http'

// The attacks of issue 11 item 3, replayed against the built server.
const FOREIGN_ORIGIN = `http://127.0.0.1:${APP_PORT + 1}` // another port of the same host

let admin: Client
let qa: Client
let db: mysql.Connection

beforeAll(async () => {
  ;[admin, qa] = await Promise.all([signInDemo('admin'), signInDemo('qa')])
  db = await connectTestDb()
})
afterAll(async () => {
  await db.end()
})

async function countRows(sql: string, params: unknown[] = []): Promise<number> {
  const [rows] = await db.query(sql, params)
  return Number((rows as { total: number }[])[0]!.total)
}

function post(client: Client, path: string, headers: Record<string, string>, body?: BodyInit) {
  return fetch(`${BASE_URL}${path}`, { method: 'POST', headers: { cookie: client.cookie, ...headers }, body })
}

describe('cross-site writes are refused before anything is written', () => {
  const newAdmin = { email: 'csrf-admin@kestrelbay.example', displayName: 'Forged Admin', role: 'admin', password: 'Quarry-lantern-47-bellows' }
  const forged = () => countRows('SELECT COUNT(*) AS total FROM users WHERE email = ?', [newAdmin.email])

  it('a form-encoded POST /api/users from a signed-in administrator is 415 and creates no account', async () => {
    const response = await post(admin, '/api/users', { 'content-type': 'application/x-www-form-urlencoded' }, new URLSearchParams(newAdmin))
    expect(response.status).toBe(415)
    expect((await response.json()).data.problems[0]).toEqual({ field: 'Content-Type', message: 'must be application/json, not application/x-www-form-urlencoded' })
    expect(await forged()).toBe(0)
  })

  it('a multipart POST /api/users is 415 and creates no account', async () => {
    const form = new FormData()
    for (const [key, value] of Object.entries(newAdmin)) form.append(key, value)
    const response = await post(admin, '/api/users', {}, form)
    expect(response.status).toBe(415)
    expect(await forged()).toBe(0)
  })

  it('a JSON POST /api/users from another port of the same host is 403 and creates no account', async () => {
    const response = await post(admin, '/api/users', { 'content-type': 'application/json', 'origin': FOREIGN_ORIGIN }, JSON.stringify(newAdmin))
    expect(response.status).toBe(403)
    expect((await response.json()).data.problems[0].field).toBe('Origin')
    expect(await forged()).toBe(0)
  })

  it('a same-site request without Origin (Sec-Fetch-Site: same-site) is 403', async () => {
    const response = await post(admin, '/api/users', { 'content-type': 'application/json', 'sec-fetch-site': 'same-site' }, JSON.stringify(newAdmin))
    expect(response.status).toBe(403)
    expect((await response.json()).data.problems[0].field).toBe('Sec-Fetch-Site')
    expect(await forged()).toBe(0)
  })

  it('a form-encoded approve with a foreign Origin signs no record', async () => {
    const unsigned = await countRows('SELECT COUNT(*) AS total FROM cooldown_records WHERE signed_at IS NULL')
    const [rows] = await db.query('SELECT id FROM cooldown_records WHERE signed_at IS NULL LIMIT 1')
    const id = (rows as { id: number }[])[0]?.id ?? 1
    const response = await post(qa, `/api/records/${id}/approve`, { 'content-type': 'application/x-www-form-urlencoded', 'origin': FOREIGN_ORIGIN }, 'comment=ok')
    expect(response.status).toBe(403)
    expect(await countRows('SELECT COUNT(*) AS total FROM cooldown_records WHERE signed_at IS NULL')).toBe(unsigned)
  })

  it('the sign-in endpoint keeps its form body but refuses a foreign Origin', async () => {
    const response = await fetch(`${BASE_URL}/api/auth/callback/credentials`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', 'origin': FOREIGN_ORIGIN },
      body: 'email=admin%40kestrelbay.example&password=x',
      redirect: 'manual',
    })
    expect(response.status).toBe(403)
  })

  it('a log upload keeps its multipart body but refuses a foreign Origin, storing nothing', async () => {
    const logFile = () => {
      const form = new FormData()
      form.set('file', new Blob(['time_s,T (°C)\n0,850\n1,800\n']), 'forged.csv')
      return form
    }
    const stored = await countRows('SELECT COUNT(*) AS total FROM measurement_logs')
    const forgedUpload = await post(admin, '/api/logs', { origin: FOREIGN_ORIGIN }, logFile())
    expect(forgedUpload.status).toBe(403)
    expect((await forgedUpload.json()).data.problems[0].field).toBe('Origin')
    expect(await countRows('SELECT COUNT(*) AS total FROM measurement_logs')).toBe(stored)
    const ownPreview = await post(admin, '/api/logs/preview', { origin: BASE_URL }, logFile())
    expect(ownPreview.status).toBe(200)
  })

  it('the same JSON write from the app\'s own origin goes through (control)', async () => {
    const response = await post(admin, '/api/users', { 'content-type': 'application/json', 'origin': BASE_URL }, JSON.stringify({ ...newAdmin, role: 'qa', email: 'csrf-control@kestrelbay.example' }))
    expect(response.status).toBe(201)
  })
})

describe('request bodies over 1 MB', () => {
  it('a 2 MB JSON body is 413 before it is parsed', async () => {
    const big = JSON.stringify({ comment: 'x'.repeat(2_000_000) })
    const response = await post(qa, '/api/records/1/approve', { 'content-type': 'application/json' }, big)
    expect(response.status).toBe(413)
    expect((await response.json()).data.problems[0].field).toBe('Content-Length')
  })

  it('a PATCH is limited too (the limit is not only for POST)', async () => {
    const response = await fetch(`${BASE_URL}/api/users/1`, {
      method: 'PATCH',
      headers: { 'cookie': admin.cookie, 'content-type': 'application/json' },
      body: JSON.stringify({ displayName: 'y'.repeat(1_100_000) }),
    })
    expect(response.status).toBe(413)
  })
})

describe('response headers', () => {
  it('pages forbid framing, sniffing and referrers, set a CSP with a nonce and do not say what serves them', async () => {
    const response = await fetch(`${BASE_URL}/login`)
    expect(response.status).toBe(200)
    const csp = response.headers.get('content-security-policy') ?? ''
    expect(csp).toContain('frame-ancestors \'none\'')
    expect(csp).toMatch(/script-src [^;]*'nonce-[A-Za-z0-9+/=]+'/)
    expect(csp).not.toContain('upgrade-insecure-requests')
    expect(response.headers.get('x-frame-options')).toBe('DENY')
    expect(response.headers.get('x-content-type-options')).toBe('nosniff')
    expect(response.headers.get('referrer-policy')).toBe('same-origin')
    expect(response.headers.get('x-powered-by')).toBeNull()
    expect(response.headers.get('access-control-allow-origin')).toBeNull()
    expect(response.headers.get('strict-transport-security')).toBeNull()
  })

  it('API answers carry nosniff and no x-powered-by', async () => {
    const response = await fetch(`${BASE_URL}/api/health`)
    expect(response.headers.get('x-content-type-options')).toBe('nosniff')
    expect(response.headers.get('x-powered-by')).toBeNull()
  })

  it('script bundles are sent compressed to a browser that accepts it', async () => {
    const html = await (await fetch(`${BASE_URL}/login`)).text()
    const script = html.match(/\/_nuxt\/[\w.-]+\.js/)?.[0]
    expect(script).toBeDefined()
    const plain = await fetch(`${BASE_URL}${script}`, { headers: { 'accept-encoding': 'identity' } })
    const compressed = await fetch(`${BASE_URL}${script}`, { headers: { 'accept-encoding': 'br, gzip' } })
    expect(compressed.headers.get('content-encoding')).toMatch(/^(br|gzip)$/)
    expect(plain.headers.get('content-encoding')).toBeNull()
  })
})
