import type { MeResponse, MembershipSummary, PublicUser } from '#shared/types/api'
import type { Role } from '#shared/constants/roles'
import type { SignInInput, SignUpInput } from '#shared/schemas/auth'
import { effectiveRoles } from '#shared/utils/access'

// Who is signed in and which competitions they belong to. Loaded once per page load from
// /api/me (by middleware/auth.global.ts) and after each sign-in; the server stays the authority.
export const useSessionStore = defineStore('session', () => {
  // On the server, a plain $fetch would not carry the browser's cookie to /api/me.
  const requestFetch = useRequestFetch()

  const user = ref<PublicUser | null>(null)
  const memberships = ref<MembershipSummary[]>([])
  const loaded = ref(false)

  const signedIn = computed(() => user.value !== null)
  const isAdmin = computed(() => user.value?.isAdmin === true)

  function apply(me: MeResponse | null) {
    user.value = me?.user ?? null
    memberships.value = me?.memberships ?? []
    loaded.value = true
  }

  /** Loads /api/me; a 401 means signed out. Other failures are thrown for the caller to show. */
  async function load(options: { force?: boolean } = {}) {
    if (loaded.value && !options.force) return
    try {
      apply(await requestFetch<MeResponse>('/api/me'))
    }
    catch (error) {
      if (apiStatus(error) === 401) apply(null)
      else throw error
    }
  }

  /** Roles held in a competition, as /api/me listed them. */
  function rolesIn(competitionId: string): Role[] {
    return memberships.value.find(m => m.competitionId === competitionId)?.roles ?? []
  }

  /** The same rule as the server: site administrators act as organisers everywhere, nothing more. */
  function hasRole(competitionId: string, roles: readonly Role[]): boolean {
    if (!user.value) return false
    const held = effectiveRoles(rolesIn(competitionId), user.value.isAdmin)
    return roles.length === 0 ? held.length > 0 : roles.some(role => held.includes(role))
  }

  async function signIn(input: SignInInput) {
    await $fetch<{ user: PublicUser }>('/api/auth/login', { method: 'POST', body: input })
    await load({ force: true })
  }

  /** Nobody is signed in by sign-up: the answer says where the confirmation link went. */
  async function signUp(input: SignUpInput): Promise<string> {
    const { message } = await $fetch<{ message: string }>('/api/auth/signup', { method: 'POST', body: input })
    return message
  }

  async function signOut() {
    try {
      await $fetch('/api/auth/logout', { method: 'POST' })
    }
    finally {
      // Forget the user (and every page's cached data) even if the server could not be reached.
      apply(null)
      clearNuxtData()
      // Grid pages kept for offline use were rendered for this user; the next one must not see
      // them. Grid checks still waiting to be sent stay on the phone (IndexedDB) and are sent
      // when a scrutineer signs in again.
      if (import.meta.client && 'caches' in window) await caches.delete('gridmark-grid-pages').catch(() => false)
    }
  }

  return { user, memberships, loaded, signedIn, isAdmin, load, rolesIn, hasRole, signIn, signUp, signOut }
})
