// The club site's breakdowns (server/api/public/posts) and its feeds.

export interface PublicPostSummary {
  slug: string
  title: string
  summary: string
  publishedAt: string
  updatedAt: string
  authorName: string | null
  url: string
}

export interface PublicPostView {
  club: PublicClub
  post: PublicPostSummary & { html: string }
  openGraph: { url: string, image: string | null }
}

/** `<link rel="alternate">` to the club's RSS and Atom feeds, for readers and feed finders. */
export function useFeedLinks(slug: () => string, clubName: () => string | undefined) {
  useHead({
    link: () => [
      { rel: 'alternate', type: 'application/rss+xml', title: `${clubName() ?? 'Club'} breakdowns (RSS)`, href: `/site/${slug()}/feed.rss` },
      { rel: 'alternate', type: 'application/atom+xml', title: `${clubName() ?? 'Club'} breakdowns (Atom)`, href: `/site/${slug()}/feed.atom` },
    ],
  })
}

const DATE = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' })

export const postDate = (iso: string) => DATE.format(new Date(iso))
