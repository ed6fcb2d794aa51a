// Once hydration is done, times switch from UTC to the reader's own zone (composables/useFormatTime.ts).
// Not at app:mounted: pages that await their data hydrate after it, inside <Suspense>,
// and would meet local times where the server wrote UTC.
export default defineNuxtPlugin((nuxtApp) => {
  nuxtApp.hooks.hookOnce('app:suspense:resolve', () => {
    useState('local-time').value = true
  })
})
