export interface ApiErrorBody {
  statusCode?: number
  statusMessage?: string
  message?: string
  data?: { fields?: Record<string, string> }
}

function bodyOf(err: unknown): ApiErrorBody | undefined {
  if (!err || typeof err !== 'object' || !('data' in err)) return undefined
  const data = (err as { data: unknown }).data
  return data && typeof data === 'object' ? data as ApiErrorBody : undefined
}

/** The HTTP status of a failed $fetch/useFetch call, or undefined when the server was not reached. */
export function apiStatus(err: unknown): number | undefined {
  if (!err || typeof err !== 'object') return undefined
  const e = err as { statusCode?: unknown, status?: unknown }
  const status = e.statusCode ?? e.status ?? bodyOf(err)?.statusCode
  return typeof status === 'number' && status > 0 ? status : undefined
}

export function apiFieldErrors(err: unknown): Record<string, string> {
  const fields = bodyOf(err)?.data?.fields
  if (!fields || typeof fields !== 'object') return {}
  return Object.fromEntries(Object.entries(fields).filter(([, message]) => typeof message === 'string'))
}

export function apiErrorMessage(err: unknown, fallback = 'Something went wrong. Please try again.'): string {
  const status = apiStatus(err)
  const message = bodyOf(err)?.message
  if (status === undefined) return 'We could not reach the server. Check the connection and try again.'
  if (status === 429) return message || 'Too many attempts in a short time. Wait a minute, then try again.'
  if (status >= 500) return fallback
  return message || fallback
}
