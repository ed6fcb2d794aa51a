// Prints the demo accounts for the start banner and keeps the README's list honest.
import { DEMO_USERS } from '../server/db/demo/shop'
import { ROLE_LABELS } from '../shared/roles'

for (const user of DEMO_USERS) {
  console.log(`    ${ROLE_LABELS[user.role].padEnd(16)} ${user.email.padEnd(34)} ${user.password}`)
}
