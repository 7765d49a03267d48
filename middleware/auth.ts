// Navigation only: every API route checks the session and the role on the server.
export default defineNuxtRouteMiddleware(async (to) => {
  if (isHydratingServerPage()) return
  const { loggedIn, clear } = useUserSession()
  const toSignIn = () => navigateTo({ path: '/sign-in', query: { redirect: to.fullPath } })
  if (!loggedIn.value) return toSignIn()

  const account = useAccountStore()
  try {
    await account.load()
  }
  catch (err) {
    // A session cookie for an account that no longer exists: start again from sign-in.
    if (apiStatus(err) === 401) {
      await clear()
      account.reset()
      return toSignIn()
    }
  }
})
