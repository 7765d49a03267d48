// The readers page's and the result-card panel's views of the API
// (server/api/clubs/[clubId]/readers, …/tournaments/[tournamentId]/result-mail).

export type SubscriberStatus = 'pending' | 'confirmed' | 'unsubscribed'

export interface MailingView {
  id: number
  kind: 'post' | 'cards'
  postId: number | null
  tournamentId: number | null
  subject: string
  status: 'queued' | 'running' | 'done' | 'failed'
  total: number
  sent: number
  failed: number
  error: string | null
  createdAt: string
  finishedAt: string | null
}

export interface ReaderView {
  id: number
  email: string
  status: SubscriberStatus
  createdAt: string
  confirmedAt: string | null
  unsubscribedAt: string | null
}

export interface ReadersView {
  counts: Record<SubscriberStatus, number>
  readers: ReaderView[]
  mailings: MailingView[]
  postsWaiting: number
}

export interface ResultMailView {
  ready: boolean
  fightersWithEmail: number
  mailing: MailingView | null
}

export const mailingActive = (m: MailingView | null | undefined) => m?.status === 'queued' || m?.status === 'running'

/** The mailing's state in words, for its progress bar. */
export function mailingProgressText(m: MailingView): string {
  const noun = m.kind === 'post' ? 'reader' : 'fighter'
  if (m.status === 'queued') return m.error ? `Waiting to try again: ${m.error}` : 'Waiting for a worker…'
  if (m.status === 'running') return m.total === 0 ? 'Finding the recipients…' : `${m.sent} of ${m.total} sent`
  if (m.status === 'failed') return m.error ?? 'The mailing failed.'
  const base = `Sent to ${m.sent} ${m.sent === 1 ? noun : `${noun}s`}`
  return m.error ? `${base}; ${m.error}` : base
}

/** Calls `refresh` every `ms` while `active()` holds, from mount to unmount; `follow()` starts it again. */
export function useFollow(active: () => boolean, refresh: () => Promise<unknown>, ms: number) {
  let timer: ReturnType<typeof setTimeout> | null = null
  function follow() {
    if (timer) clearTimeout(timer)
    timer = null
    if (active()) {
      timer = setTimeout(async () => {
        await refresh()
        follow()
      }, ms)
    }
  }
  onMounted(follow)
  onBeforeUnmount(() => timer && clearTimeout(timer))
  return follow
}
