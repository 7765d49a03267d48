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
      if (import.meta.client && 'caches' in window) {
        for (const name of await caches.keys().catch(() => [])) {
          if (name.startsWith('unscathed-desk-')) await caches.delete(name).catch(() => false)
        }
      }
      pending.value = false
    }
    await navigateTo('/')
  }

  return { signOut, pending }
}
