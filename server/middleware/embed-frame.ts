// The public clip player (/embed/…) is made to sit in an iframe of the club site, which this app
// serves itself ('self'); other sites that may frame it are listed in NUXT_EMBED_FRAME_ANCESTORS.
// CSP Level 3, frame-ancestors: https://www.w3.org/TR/CSP3/#directive-frame-ancestors
const ORIGIN = /^https?:\/\/[\w.-]+(?::\d{1,5})?$/

export default defineEventHandler((event) => {
  if (!event.path.startsWith('/embed/')) return
  const extra = String(useRuntimeConfig(event).embedFrameAncestors ?? '').split(/[\s,]+/).filter(origin => ORIGIN.test(origin))
  setResponseHeader(event, 'content-security-policy', ['frame-ancestors', '\'self\'', ...extra].join(' '))
})
