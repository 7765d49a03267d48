import type { Ref } from 'vue'
import { clampMs } from '#shared/footage/marks'

/**
 * Follows a <video>: its time in milliseconds (every animation frame while it plays, so marks and
 * overlays keep up), whether it plays, and the few controls the clip pages need.
 */
export function useClipVideo(video: Readonly<Ref<HTMLVideoElement | null>>, durationMs: () => number) {
  const currentMs = ref(0)
  const playing = ref(false)
  const ready = ref(false)
  const failed = ref(false)
  let frame = 0

  const read = () => {
    if (video.value) currentMs.value = Math.round(video.value.currentTime * 1000)
  }
  const follow = () => {
    read()
    frame = playing.value ? requestAnimationFrame(follow) : 0
  }

  const listeners: Record<string, () => void> = {
    play: () => {
      playing.value = true
      cancelAnimationFrame(frame)
      frame = requestAnimationFrame(follow)
    },
    pause: () => {
      playing.value = false
      read()
    },
    ended: () => {
      playing.value = false
      read()
    },
    seeked: read,
    timeupdate: read,
    loadedmetadata: () => {
      ready.value = true
      failed.value = false
      read()
    },
    error: () => {
      failed.value = true
    },
  }

  watch(video, (element, old) => {
    for (const [name, listener] of Object.entries(listeners)) {
      old?.removeEventListener(name, listener)
      element?.addEventListener(name, listener)
    }
    if (element && element.readyState >= 1) listeners.loadedmetadata!()
  }, { immediate: true })

  onBeforeUnmount(() => cancelAnimationFrame(frame))

  function seek(ms: number) {
    const target = clampMs(ms, durationMs())
    currentMs.value = target
    if (video.value) video.value.currentTime = target / 1000
  }

  async function toggle() {
    const element = video.value
    if (!element) return
    if (element.paused) await element.play().catch(() => undefined)
    else element.pause()
  }

  function pause() {
    video.value?.pause()
  }

  return { currentMs, playing, ready, failed, seek, toggle, pause }
}
