import { floorCountdown } from '~~/shared/floorCountdown'
import { dueMoment, newlyDue } from '~~/shared/floorAlerts'
import type { FloorBatch, FloorResponse } from '~~/shared/types/schedule'

const SETTING_KEY = 'slakewise.floor.alert'

/**
 * An optional beep and vibration when a load's quench or release falls due, chosen per
 * device (a tablet by the quench tank, not the office). Moments already due when the
 * floor opens are taken as known, so opening the page does not ring.
 */
export function useDueAlert(floor: Ref<FloorResponse | null>, now: Ref<number>) {
  const enabled = ref(false)
  const announced = new Set<string>()
  let primed = false

  onMounted(() => (enabled.value = localStorage.getItem(SETTING_KEY) === 'on'))
  watch(enabled, (on) => localStorage.setItem(SETTING_KEY, on ? 'on' : 'off'))

  function ring() {
    navigator.vibrate?.([300, 150, 300])
    const AudioContextClass = window.AudioContext
    if (!AudioContextClass) return
    const audio = new AudioContextClass()
    const tone = audio.createOscillator()
    tone.frequency.value = 880
    tone.connect(audio.destination)
    tone.start()
    tone.stop(audio.currentTime + 0.4)
    tone.onended = () => audio.close()
  }

  watch([floor, now], () => {
    if (!floor.value) return
    const { batches, settings } = floor.value
    // Which moment is due needs no curve, only the handling temperature of the caption.
    const dueOf = (b: FloorBatch) => dueMoment(floorCountdown({ ...b, summary: { handling_C: b.handling_C } }, now.value, settings.temperWithin_s))
    const due = new Map(batches.map((b) => [b.id, dueOf(b)]))
    const fresh = newlyDue(due, announced)
    for (const key of fresh) announced.add(key)
    // The first answer only records what is already due.
    if (primed && fresh.length && enabled.value) ring()
    primed = true
  })

  return { enabled }
}
