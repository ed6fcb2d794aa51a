import { describe, expect, it } from 'vitest'
import { refuseWrite, type WriteRequest } from '../../../server/security/writeRequests'
import { appOrigins } from '../../../server/security/appOrigins'

const APP = 'http://127.0.0.1:3000'
const json = (over: Partial<WriteRequest> = {}): WriteRequest => ({
  method: 'POST',
  path: '/api/users',
  contentType: 'application/json',
  contentLength: '20',
  transferEncoding: undefined,
  origin: APP,
  secFetchSite: 'same-origin',
  ...over,
})

describe('which API writes are refused (CSRF, media type, size)', () => {
  it.each([
    ['a JSON write from the app itself', json(), null],
    ['a JSON write from a client that is no browser (no Origin, no Sec-Fetch-Site)', json({ origin: undefined, secFetchSite: undefined }), null],
    ['a body-less POST from the app', json({ contentType: undefined, contentLength: undefined }), null],
    ['a read from anywhere', json({ method: 'GET', origin: 'http://evil.example' }), null],
    ['a page outside the API', json({ path: '/login', origin: 'http://evil.example' }), null],
    ['next-auth sign-in form from the app', json({ path: '/api/auth/callback/credentials', contentType: 'application/x-www-form-urlencoded' }), null],
    ['another port of the same host', json({ origin: 'http://127.0.0.1:3001' }), 403],
    ['another site, form-encoded, on the auth endpoint', json({ path: '/api/auth/callback/credentials', origin: 'http://evil.example', contentType: 'application/x-www-form-urlencoded' }), 403],
    ['Sec-Fetch-Site same-site without Origin', json({ origin: undefined, secFetchSite: 'same-site' }), 403],
    ['Sec-Fetch-Site cross-site without Origin', json({ origin: undefined, secFetchSite: 'cross-site' }), 403],
    ['form-encoded', json({ contentType: 'application/x-www-form-urlencoded' }), 415],
    ['multipart', json({ contentType: 'multipart/form-data; boundary=x' }), 415],
    ['text/plain (a no-pre-flight fetch)', json({ contentType: 'text/plain' }), 415],
    ['a PATCH of 1 000 001 bytes', json({ method: 'PATCH', contentLength: '1000001' }), 413],
    ['exactly 1 000 000 bytes', json({ contentLength: '1000000' }), null],
    ['a chunked body with no length', json({ contentLength: undefined, transferEncoding: 'chunked' }), 411],
    ['a 5 MB multipart log upload (the route applies its own 10 MB limit)', json({ path: '/api/logs', contentType: 'multipart/form-data; boundary=x', contentLength: '5000000' }), null],
    ['a multipart log preview from the app', json({ path: '/api/logs/preview', contentType: 'multipart/form-data; boundary=x' }), null],
    ['a multipart log upload from another port of the same host', json({ path: '/api/logs', contentType: 'multipart/form-data; boundary=x', origin: 'http://127.0.0.1:3001' }), 403],
    ['a multipart POST to a path that only starts like the upload route', json({ path: '/api/logs/7/parts', contentType: 'multipart/form-data; boundary=x' }), 415],
  ])('%s', (_label, request, status) => {
    expect(refuseWrite(request, [APP])?.status ?? null).toBe(status)
  })

  it('accepts the request origin and the configured addresses (AUTH_ORIGIN, NUXT_SITE_ORIGIN) as the app', () => {
    expect(appOrigins('http://10.0.0.5:3000', ['https://slake.shop.example/api/auth', 'https://slake.shop.example:8443', undefined, 'not a url'])).toEqual([
      'http://10.0.0.5:3000',
      'https://slake.shop.example',
      'https://slake.shop.example:8443',
    ])
  })
})
