import { missingParts, partRange } from '#shared/footage'
import type { RingMatch } from '#shared/footage'

// Footage in the browser: the views of server/api/clubs/[clubId]/recordings/… and clips/…, and the
// resumable upload that sends a file's parts straight to object storage.

export interface RecordingView {
  id: number
  eventId: number
  ring: number
  title: string
  fileName: string
  contentType: string
  bytes: number
  status: 'uploading' | 'probing' | 'ready' | 'failed'
  error: string | null
  partSize: number
  partCount: number
  durationMs: number | null
  frameRate: number | null
  width: number | null
  height: number | null
  startsAt: string | null
  startSource: 'file' | 'entered' | null
  offsetMs: number
  createdAt: string
}

export type RingMatchView = RingMatch

export interface ClipView {
  id: number
  recordingId: number
  matchId: number | null
  boutNumber: number | null
  title: string
  startMs: number
  endMs: number
  mode: 'copy' | 'exact'
  requestedMode: 'auto' | 'copy' | 'exact'
  toleranceMs: number
  cutStartMs: number | null
  status: 'queued' | 'cutting' | 'ready' | 'failed'
  progress: number
  durationMs: number | null
  error: string | null
  videoUrl: string | null
  posterUrl: string | null
  createdAt: string
}

export interface RecordingDetail {
  recording: RecordingView
  videoUrl: string | null
  matches: RingMatchView[]
  clips: ClipView[]
}

export function useRecordings(clubId: MaybeRefOrGetter<number>) {
  return useFetch<{ recordings: RecordingView[] }>(() => `/api/clubs/${toValue(clubId)}/recordings`, {
    key: () => `recordings-${toValue(clubId)}`,
  })
}

export function useRecording(clubId: MaybeRefOrGetter<number>, recordingId: MaybeRefOrGetter<number>) {
  return useFetch<RecordingDetail>(() => `/api/clubs/${toValue(clubId)}/recordings/${toValue(recordingId)}`, {
    key: () => `recording-${toValue(clubId)}-${toValue(recordingId)}`,
  })
}

/** Where an unfinished upload of a file is remembered: by name, size and last change. */
export function uploadMemoryKey(clubId: number, file: Pick<File, 'name' | 'size' | 'lastModified'>) {
  return `unscathed.upload.${clubId}.${file.name}.${file.size}.${file.lastModified}`
}

interface RememberedUpload { recordingId: number, uploadId: string }

function remembered(key: string): RememberedUpload | null {
  try {
    const value = JSON.parse(localStorage.getItem(key) ?? 'null') as RememberedUpload | null
    return value && typeof value.recordingId === 'number' && typeof value.uploadId === 'string' ? value : null
  }
  catch {
    return null
  }
}

/** Sends one part with XMLHttpRequest, which (unlike fetch) reports how far the body has gone. */
function putPart(url: string, body: Blob, onSent: (bytes: number) => void, signal: AbortSignal): Promise<string> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest()
    xhr.open('PUT', url)
    xhr.upload.onprogress = event => onSent(event.loaded)
    xhr.onload = () => {
      const etag = xhr.getResponseHeader('ETag')
      if (xhr.status >= 200 && xhr.status < 300 && etag) resolve(etag.replace(/"/g, ''))
      else reject(new Error(`the store answered ${xhr.status}`))
    }
    xhr.onerror = () => reject(new Error('the connection to the store dropped'))
    xhr.onabort = () => reject(new DOMException('stopped', 'AbortError'))
    signal.addEventListener('abort', () => xhr.abort(), { once: true })
    xhr.send(body)
  })
}

export interface UploadForm { eventId: number, ring: number, title: string }

/**
 * A resumable upload: the recording is opened once, its id kept in localStorage under the file's
 * name, size and date; choosing the same file again asks the store which parts it has and sends
 * only the rest, three at a time.
 */
export function useFootageUpload(clubId: MaybeRefOrGetter<number>) {
  const sent = ref(0)
  const total = ref(0)
  const state = ref<'idle' | 'sending' | 'finishing' | 'done' | 'interrupted'>('idle')
  const error = ref<string | null>(null)
  const fieldErrors = ref<Record<string, string>>({})
  const resumed = ref<{ had: number, of: number } | null>(null)
  let controller: AbortController | null = null
  let paused = false

  const percent = computed(() => (total.value ? Math.min(100, Math.floor((sent.value / total.value) * 100)) : 0))

  async function open(file: File, form: UploadForm): Promise<{ recordingId: number, uploadId: string, partSize: number, partCount: number, have: { partNumber: number, etag: string }[] }> {
    const club = toValue(clubId)
    const key = uploadMemoryKey(club, file)
    const known = remembered(key)
    if (known) {
      try {
        const parts = await $fetch<{ uploadId: string, partSize: number, partCount: number, parts: { partNumber: number, etag: string }[] }>(
          `/api/clubs/${club}/recordings/${known.recordingId}/parts`)
        if (parts.uploadId === known.uploadId) {
          resumed.value = { had: parts.parts.length, of: parts.partCount }
          return { recordingId: known.recordingId, uploadId: parts.uploadId, partSize: parts.partSize, partCount: parts.partCount, have: parts.parts }
        }
      }
      catch (err) {
        // Finished, given up or gone: start afresh. Anything else (no network) stops here.
        if (apiStatus(err) === undefined) throw err
      }
      localStorage.removeItem(key)
    }
    const created = await $fetch<{ id: number, uploadId: string, partSize: number, partCount: number }>(`/api/clubs/${club}/recordings`, {
      method: 'POST',
      body: { ...form, fileName: file.name, contentType: file.type || 'application/octet-stream', bytes: file.size },
    })
    localStorage.setItem(key, JSON.stringify({ recordingId: created.id, uploadId: created.uploadId } satisfies RememberedUpload))
    resumed.value = null
    return { recordingId: created.id, uploadId: created.uploadId, partSize: created.partSize, partCount: created.partCount, have: [] }
  }

  async function upload(file: File, form: UploadForm): Promise<number | null> {
    const club = toValue(clubId)
    controller?.abort()
    controller = new AbortController()
    paused = false
    const signal = controller.signal
    error.value = null
    fieldErrors.value = {}
    state.value = 'sending'
    sent.value = 0
    total.value = file.size
    try {
      const upload = await open(file, form)
      const etags = new Map(upload.have.map(p => [p.partNumber, p.etag]))
      const partBytes = (n: number) => {
        const [start, end] = partRange(n, upload.partSize, file.size)
        return end - start
      }
      const progress = new Map<number, number>()
      const done = () => [...etags.keys()].reduce((sum, n) => sum + partBytes(n), 0)
      const update = () => (sent.value = done() + [...progress.values()].reduce((a, b) => a + b, 0))
      update()
      const queue = missingParts(upload.partCount, [...etags.keys()])
      const worker = async () => {
        while (queue.length) {
          const batch = queue.splice(0, 1)
          const { urls } = await $fetch<{ urls: { partNumber: number, url: string }[] }>(`/api/clubs/${club}/recordings/${upload.recordingId}/part-urls`, {
            method: 'POST', body: { partNumbers: batch },
          })
          for (const { partNumber, url } of urls) {
            const [start, end] = partRange(partNumber, upload.partSize, file.size)
            const etag = await putPart(url, file.slice(start, end), (b) => {
              progress.set(partNumber, b)
              update()
            }, signal)
            progress.delete(partNumber)
            etags.set(partNumber, etag)
            update()
          }
        }
      }
      await Promise.all([worker(), worker(), worker()])
      state.value = 'finishing'
      await $fetch(`/api/clubs/${club}/recordings/${upload.recordingId}/complete`, {
        method: 'POST',
        body: { parts: [...etags].sort((a, b) => a[0] - b[0]).map(([partNumber, etag]) => ({ partNumber, etag })) },
      })
      localStorage.removeItem(uploadMemoryKey(club, file))
      state.value = 'done'
      return upload.recordingId
    }
    catch (err) {
      controller.abort()
      if (paused) {
        state.value = 'interrupted'
        error.value = 'Paused. Press Resume (or choose the same file again) to send the rest.'
        return null
      }
      fieldErrors.value = apiFieldErrors(err)
      const status = apiStatus(err)
      error.value = status !== undefined && status < 500
        ? apiErrorMessage(err)
        : 'The upload was interrupted. Choose the same file again (or press Resume): the parts already sent are kept.'
      state.value = 'interrupted'
      return null
    }
  }

  function stop() {
    paused = true
    controller?.abort()
  }

  return { upload, stop, sent, total, percent, state, error, fieldErrors, resumed }
}
