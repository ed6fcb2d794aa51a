import { demoShopActive } from '../security/demoAccounts'

// Public: the header says "Demo shop" while demo sign-ins with published passwords can be used.
export default defineEventHandler(async () => ({ demoShop: await demoShopActive() }))
