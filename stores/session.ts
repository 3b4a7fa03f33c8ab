import type { MeResponse, MembershipSummary, PublicUser } from '#shared/types/api'
import type { Role } from '#shared/constants/roles'
import type { SignInInput, SignUpInput } from '#shared/schemas/auth'
import { effectiveRoles } from '#shared/utils/access'
import { forgetGridPages } from '~/utils/gridPageCache'
import { offlinePageOf } from '~/utils/pageAccess'

/** localStorage: the id of the user whose session utils/keptSession.ts keeps on this phone. */
const KEPT_FOR = 'gridmark-session-kept-for'

// Who is signed in and which competitions they belong to. Loaded once per page load from
// /api/me (by middleware/auth.global.ts) and after each sign-in; the server stays the authority.
// The phone keeps the last confirmed answer (utils/keptSession.ts) for opening the launch-grid
// pages with no signal; `offline` says the answer shown is that kept one.
export const useSessionStore = defineStore('session', () => {
  // On the server, a plain $fetch would not carry the browser's cookie to /api/me.
  const requestFetch = useRequestFetch()

  const user = ref<PublicUser | null>(null)
  const memberships = ref<MembershipSummary[]>([])
  const loaded = ref(false)
  const offline = ref(false)
  // What this app run last kept on the phone (so each page change does not write it again).
  let keptAs: string | undefined

  const signedIn = computed(() => user.value !== null)
  const isAdmin = computed(() => user.value?.isAdmin === true)

  function apply(me: MeResponse | null) {
    user.value = me?.user ?? null
    memberships.value = me?.memberships ?? []
    loaded.value = true
    offline.value = false
  }

  /**
   * Keeps the server's answer on the phone while on a launch-grid page or tag link (where it
   * is used offline), and forgets a kept one as soon as the answer is nobody or someone else;
   * never from an offline copy. Elsewhere the storage code is not even fetched: a note in
   * localStorage says whose session is kept.
   */
  function remember(path?: string) {
    if (!import.meta.client || offline.value || !navigator.onLine) return
    const keptFor = localStorage.getItem(KEPT_FOR)
    const me: MeResponse | null = user.value ? { user: user.value, memberships: memberships.value } : null
    if (me && path && offlinePageOf(path)) {
      const key = JSON.stringify(me)
      if (key === keptAs) return
      keptAs = key
      localStorage.setItem(KEPT_FOR, me.user.id)
      // Loaded apart (IndexedDB), after the page: no page waits for it.
      void import('~/utils/keptSession').then(kept => kept.keepSession(JSON.parse(key) as MeResponse)).catch(() => {})
    }
    else if (keptFor !== null && keptFor !== me?.user.id) {
      forgetKept()
    }
  }

  function forgetKept(): Promise<void> {
    keptAs = undefined
    localStorage.removeItem(KEPT_FOR)
    return import('~/utils/keptSession').then(kept => kept.forgetSession()).catch(() => {})
  }

  /**
   * Loads /api/me; a 401 means signed out. Other failures are thrown for the caller to show.
   * While the kept copy is in use, each call asks the server again.
   */
  async function load(options: { force?: boolean, path?: string } = {}) {
    if (!loaded.value || offline.value || options.force) {
      try {
        apply(await requestFetch<MeResponse>('/api/me'))
      }
      catch (error) {
        if (apiStatus(error) === 401) apply(null)
        else throw error
      }
    }
    remember(options.path)
  }

  /** Goes on with the session kept on this phone (the page guard decided the server is out of reach). */
  function useKept(me: MeResponse) {
    apply(me)
    offline.value = true
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
      // Grid pages kept for offline use were rendered for this user, and the kept session is
      // theirs; the next one must see neither. Grid checks still waiting to be sent stay on the
      // phone (IndexedDB) and are sent when a scrutineer signs in again.
      if (import.meta.client) {
        await Promise.all([forgetGridPages(), forgetKept()])
      }
    }
  }

  return { user, memberships, loaded, offline, signedIn, isAdmin, load, useKept, rolesIn, hasRole, signIn, signUp, signOut }
})
