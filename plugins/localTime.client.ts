// Once the app is mounted (hydration done), times switch from UTC to the reader's own zone (composables/useFormatTime.ts).
export default defineNuxtPlugin((nuxtApp) => {
  nuxtApp.hook('app:mounted', () => {
    useState('local-time').value = true
  })
})
