import { randomBytes } from 'node:crypto'
import { hashPassword, verifyPassword } from '../utils/password'

let dummyHash: Promise<string> | undefined

/**
 * Checks the password against a hash no account has, so an unknown e-mail costs the
 * same scrypt work as a known one and answer times do not tell which addresses exist.
 */
export async function spendPasswordCheckOnUnknownAccount(password: string): Promise<false> {
  dummyHash ??= hashPassword(randomBytes(24).toString('base64url'))
  await verifyPassword(password, await dummyHash)
  return false
}
