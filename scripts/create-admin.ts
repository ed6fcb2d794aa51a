// Creates a shop's administrator with a generated password, printed once here and nowhere
// else; the account can do nothing but choose its own password until it has.
// usage: npx tsx scripts/create-admin.ts --email lead@yourshop.example --name "Full Name"
import { parseArgs } from 'node:util'
import { randomBytes } from 'node:crypto'
import { createDatabase, databaseUrl } from '../server/db/client'
import { users } from '../server/db/schema'
import { hashPassword } from '../server/utils/password'
import { recordAudit } from '../server/utils/audit'
import { userCreateSchema } from '../shared/schemas/user'

const { values } = parseArgs({ options: { email: { type: 'string' }, name: { type: 'string' } } })
const parsed = userCreateSchema.pick({ email: true, displayName: true }).safeParse({ email: values.email, displayName: values.name })
if (!parsed.success) {
  for (const issue of parsed.error.issues) console.error(`[admin] ${issue.path[0] === 'displayName' ? '--name' : '--email'}: ${issue.message}`)
  console.error('[admin] usage: npx tsx scripts/create-admin.ts --email lead@yourshop.example --name "Full Name"')
  process.exit(2)
}

// 120 random bits, shown once: long enough for the console, never stored in clear.
const password = randomBytes(15).toString('base64url')
const { db, pool } = createDatabase(databaseUrl())
try {
  const id = await db.transaction(async (tx) => {
    const [{ id }] = await tx
      .insert(users)
      .values({ ...parsed.data, role: 'admin', passwordHash: await hashPassword(password), mustChangePassword: true })
      .$returningId()
    await recordAudit(tx, { actorId: id, action: 'user.create', entityType: 'user', entityId: id, details: { email: parsed.data.email, role: 'admin', by: 'admin:create command' } })
    return id
  })
  console.log(`[admin] administrator ${parsed.data.email} created (user ${id}).`)
  console.log(`[admin] one-time password: ${password}`)
  console.log('[admin] It is shown only now. Sign in with it and Slakewise will ask for a password of your own.')
} catch (error) {
  const duplicate = (error as { cause?: { code?: string } }).cause?.code === 'ER_DUP_ENTRY'
  console.error(duplicate ? `[admin] ${parsed.data.email} already has an account; nothing was created.` : `[admin] could not create the administrator: ${(error as Error).message}`)
  process.exitCode = 1
} finally {
  await pool.end()
}
