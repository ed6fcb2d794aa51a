// Where the test stack listens: its own ports, so a running `npm start` is never disturbed.
export const APP_PORT = Number(process.env.SLAKEWISE_TEST_APP_PORT ?? 3100)
export const BASE_URL = `http://127.0.0.1:${APP_PORT}`
export const MAIL_SMTP_PORT = Number(process.env.SLAKEWISE_TEST_SMTP_PORT ?? 1026)
export const MAIL_WEB_PORT = Number(process.env.SLAKEWISE_TEST_MAIL_WEB_PORT ?? 1081)
export const MAIL_API = `http://127.0.0.1:${MAIL_WEB_PORT}`
export const AUTH_SECRET = 'slakewise-test-secret-not-for-production'
export const RECORD_SEAL_KEY = 'slakewise-test-record-seal-key-not-for-production'
// A second server instance on the same database, for the two-instance test.
export const SECOND_APP_PORT = Number(process.env.SLAKEWISE_TEST_APP2_PORT ?? APP_PORT + 1)
