export default defineNuxtRouteMiddleware(() => {
  if (isHydratingServerPage()) return
  const { loggedIn } = useUserSession()
  if (loggedIn.value) return navigateTo('/clubs')
})
