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
      // The ring desk's offline copy of pages holds this account's view; unsent entries stay in their queue.
      if (import.meta.client && 'caches' in window) await caches.delete('unscathed-desk-v1').catch(() => false)
      pending.value = false
    }
    await navigateTo('/')
  }

  return { signOut, pending }
}
