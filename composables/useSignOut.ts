export function useSignOut() {
  const { clear } = useUserSession()
  const account = useAccountStore()
  const pending = ref(false)

  async function signOut() {
    pending.value = true
    try {
      await clear()
    }
    finally {
      account.reset()
      clearNuxtData()
      pending.value = false
    }
    await navigateTo('/')
  }

  return { signOut, pending }
}
