/**
 * A clock that ticks once a second in the browser and follows the server's time:
 * each answer's `serverNow` corrects the tablet's own clock, so countdowns agree
 * with the times the server writes, without asking the server every second.
 */
export function useServerClock() {
  const offset = ref(0)
  const now = ref(Date.now())
  let timer: ReturnType<typeof setInterval> | undefined

  function sync(serverNow: number) {
    offset.value = serverNow - Date.now()
    now.value = serverNow
  }

  onMounted(() => {
    now.value = Date.now() + offset.value
    timer = setInterval(() => (now.value = Date.now() + offset.value), 250)
  })
  onBeforeUnmount(() => clearInterval(timer))

  return { now, sync }
}
