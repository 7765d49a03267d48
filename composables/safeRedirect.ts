/** Only same-site paths: never `//host` or `/\host`, which browsers treat as another site. */
export function safeRedirect(value: unknown, fallback = '/clubs'): string {
  const path = Array.isArray(value) ? value[0] : value
  if (typeof path !== 'string' || !path.startsWith('/') || path.startsWith('//') || path.startsWith('/\\')) return fallback
  return path
}
