import { defineStore } from 'pinia'

export interface AccountUser {
  id: number
  email: string
  name: string
}

export interface AccountClub {
  id: number
  slug: string
  name: string
  roles: string[]
  primaryColor: string
  secondaryColor: string
  logoUrl: string | null
}

interface AccountResponse {
  user: AccountUser
  clubs: AccountClub[]
}

export const useAccountStore = defineStore('account', () => {
  // Captured at setup so that server-side loads forward the visitor's cookie.
  const requestFetch = useRequestFetch()

  const user = ref<AccountUser | null>(null)
  const clubs = ref<AccountClub[]>([])
  const loaded = ref(false)
  const lastSlug = ref<string | null>(null)
  let inFlight: Promise<void> | null = null

  async function load(force = false): Promise<void> {
    if (loaded.value && !force) return
    if (inFlight) return inFlight
    inFlight = requestFetch<AccountResponse>('/api/account')
      .then((response) => {
        user.value = response.user
        clubs.value = [...response.clubs].sort((a, b) => a.name.localeCompare(b.name))
        loaded.value = true
      })
      .finally(() => {
        inFlight = null
      })
    return inFlight
  }

  function clubBySlug(slug: string): AccountClub | undefined {
    return clubs.value.find(club => club.slug === slug)
  }

  const isAdminAnywhere = computed(() => clubs.value.some(club => club.roles.includes('admin')))

  function setUser(next: AccountUser) {
    user.value = next
  }

  function reset() {
    user.value = null
    clubs.value = []
    loaded.value = false
    lastSlug.value = null
  }

  return { user, clubs, loaded, lastSlug, isAdminAnywhere, load, clubBySlug, setUser, reset }
})
