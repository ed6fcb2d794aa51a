import { secretProblems } from '../security/secrets'

const MAKE_ONE = 'Make one with: node -e "console.log(require(\'crypto\').randomBytes(32).toString(\'hex\'))"'

// Refuses to start with a missing, placeholder or guessable secret, before any request,
// instead of failing at the first sign-in or, for the seal key, the first released load.
export default defineNitroPlugin(() => {
  if (import.meta.prerender) return
  const config = useRuntimeConfig()
  const problems = secretProblems([
    { name: 'NUXT_AUTH_SECRET', value: config.authSecret, hint: MAKE_ONE },
    { name: 'NUXT_RECORD_SEAL_KEY', value: config.recordSealKey, hint: `${MAKE_ONE} (and keep a copy with your backups: records sealed under it can only be checked with it)` },
  ])
  if (problems.length === 0) return
  for (const problem of problems) console.error(`[slakewise] ${problem}`)
  console.error('[slakewise] not starting: fix the secrets above (README, "Putting Slakewise on the shop network").')
  process.exit(1)
})
