import sanitizeHtml from 'sanitize-html'

// The one gate between a breakdown's text and a reader's browser: whatever the markdown or an
// embed produced, only these tags and attributes leave the server. No scripts, no event handlers,
// no style, no javascript: or data: links, and no frames but our own clip player.

const EMBED_CLASSES = ['embed', 'embed-clip', 'embed-pool', 'embed-match', 'embed-card', 'embed-notice', 'embed-score', 'embed-meta']

/** True for exactly `/embed/clips/<digits>` on our own origin (or relative to it). */
export function isOwnPlayer(src: string | undefined): boolean {
  if (!src) return false
  const path = /^\/embed\/clips\/\d{1,10}$/
  if (path.test(src)) return true
  const origin = new URL(useRuntimeConfig().appUrl).origin
  return src.startsWith(`${origin}/`) && path.test(src.slice(origin.length))
}

const OPTIONS: sanitizeHtml.IOptions = {
  allowedTags: [
    'h2', 'h3', 'h4', 'h5', 'h6', 'p', 'br', 'hr', 'blockquote', 'pre', 'code', 'em', 'strong', 'del', 's', 'sub', 'sup',
    'ul', 'ol', 'li', 'a', 'img', 'figure', 'figcaption', 'div', 'span',
    'table', 'caption', 'thead', 'tbody', 'tr', 'th', 'td', 'iframe',
  ],
  allowedAttributes: {
    'a': ['href', 'title', 'rel'],
    'img': ['src', 'alt', 'title', 'width', 'height', 'loading'],
    'iframe': ['src', 'title', 'width', 'height', 'loading', 'allowfullscreen'],
    'th': ['scope', 'colspan', 'rowspan'],
    'td': ['colspan', 'rowspan'],
    'ol': ['start'],
    'div': ['tabindex'],
    '*': ['class', 'role', 'aria-label'],
  },
  allowedClasses: { '*': EMBED_CLASSES },
  allowedSchemes: ['http', 'https', 'mailto'],
  allowedSchemesByTag: { img: ['http', 'https'], iframe: ['http', 'https'] },
  allowedSchemesAppliedToAttributes: ['href', 'src', 'cite'],
  allowProtocolRelative: false,
  // Headings start at h2: the page's own title is the h1.
  transformTags: {
    h1: 'h2',
    a: sanitizeHtml.simpleTransform('a', { rel: 'nofollow noopener' }),
  },
  exclusiveFilter: frame => frame.tag === 'iframe' && !isOwnPlayer(frame.attribs.src),
  disallowedTagsMode: 'discard',
}

export function sanitizePostHtml(html: string): string {
  return sanitizeHtml(html, OPTIONS)
}
