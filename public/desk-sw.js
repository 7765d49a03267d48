// The ring desk's offline copy. Registered by the desk pages for /clubs/<slug>/desk only, so that a
// tablet that reloads while the Wi-Fi is down still opens the desk, with its queue of unsent
// entries (kept in localStorage by the page). Pages and the app's scripts come from the network
// when it answers and from this copy when it does not; API calls, the live stream and every write
// pass straight through.
const CACHE = 'unscathed-desk-v1'
const DESK_PAGE = /^\/clubs\/[^/]+\/desk(?:\/|$)/

self.addEventListener('install', () => {
  self.skipWaiting()
})

self.addEventListener('activate', (event) => {
  event.waitUntil((async () => {
    for (const name of await caches.keys()) {
      if (name.startsWith('unscathed-desk-') && name !== CACHE) await caches.delete(name)
    }
    await self.clients.claim()
  })())
})

// The page names what it loaded before this worker controlled it: itself and its scripts and styles.
self.addEventListener('message', (event) => {
  const data = event.data
  if (!data || data.type !== 'keep' || !Array.isArray(data.urls)) return
  event.waitUntil((async () => {
    const cache = await caches.open(CACHE)
    for (const url of data.urls) {
      if (typeof url !== 'string' || !keeps(new URL(url, self.location.origin))) continue
      try {
        const res = await fetch(url, { credentials: 'same-origin' })
        if (res.ok && !res.redirected) await cache.put(cacheKey(new URL(res.url)), res)
      }
      catch {
        // Offline already: it is kept the next time.
      }
    }
  })())
})

function keeps(url) {
  return url.origin === self.location.origin && (DESK_PAGE.test(url.pathname) || url.pathname.startsWith('/_nuxt/'))
}

// A page is kept once, whatever its query; scripts by their full address.
function cacheKey(url) {
  return DESK_PAGE.test(url.pathname) ? url.origin + url.pathname : url.href
}

async function networkFirst(request) {
  const url = new URL(request.url)
  const cache = await caches.open(CACHE)
  try {
    const res = await fetch(request)
    if (res.ok && res.type === 'basic' && !res.redirected) await cache.put(cacheKey(url), res.clone())
    return res
  }
  catch (err) {
    const kept = await cache.match(cacheKey(url))
    if (kept) return kept
    throw err
  }
}

self.addEventListener('fetch', (event) => {
  const request = event.request
  if (request.method !== 'GET') return
  const url = new URL(request.url)
  if (url.origin !== self.location.origin) return
  if (request.mode === 'navigate' ? DESK_PAGE.test(url.pathname) : url.pathname.startsWith('/_nuxt/')) {
    event.respondWith(networkFirst(request))
  }
})
