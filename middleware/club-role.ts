import type { Role } from '#shared/utils/roles'

declare module '#app' {
  interface PageMeta {
    /** Club roles that may open the page; empty or absent admits every member. */
    roles?: readonly Role[]
  }
}

// Navigation only: the server answers 404/403 on its own for every club route.
export default defineNuxtRouteMiddleware(async (to) => {
  if (isHydratingServerPage()) return
  const { loggedIn } = useUserSession()
  if (!loggedIn.value) return navigateTo({ path: '/sign-in', query: { redirect: to.fullPath } })

  const account = useAccountStore()
  try {
    await account.load()
  }
  catch (err) {
    if (apiStatus(err) === 401) return navigateTo({ path: '/sign-in', query: { redirect: to.fullPath } })
    return abortNavigation(createError({
      status: apiStatus(err) ?? 503,
      statusText: 'Account not loaded',
      message: 'We could not load your clubs just now.',
      fatal: true,
    }))
  }

  const slug = typeof to.params.slug === 'string' ? to.params.slug : ''
  const club = account.clubBySlug(slug)
  if (!club) {
    return abortNavigation(createError({
      status: 404,
      statusText: 'Not Found',
      message: 'There is no club at this address, or you are not one of its members.',
      fatal: true,
    }))
  }

  const wanted = to.meta.roles ?? []
  if (wanted.length > 0 && !hasAnyRole(club.roles, wanted)) {
    const names = wanted.map(role => ROLE_LABELS[role]).join(' or ')
    return abortNavigation(createError({
      status: 403,
      statusText: 'Forbidden',
      message: `This part of ${club.name} needs the ${names} role.`,
      fatal: true,
    }))
  }

  account.lastSlug = slug
})
