import type { AccountDeleteInput, AccountNameInput, AccountPasswordInput } from '#shared/schemas/account'
import type { AccountDeleteResponse, AccountNameResponse, AccountPasswordResponse } from '#shared/types/api-account'

/** The account page's actions on one's own account; the session store is brought up to date. */
export function useAccountActions() {
  const session = useSessionStore()
  return {
    async rename(input: AccountNameInput) {
      const res = await $fetch<AccountNameResponse>('/api/me', { method: 'PATCH', body: input })
      if (session.user) session.user = { ...session.user, name: res.user.name }
      return res
    },
    changePassword: (input: AccountPasswordInput) =>
      $fetch<AccountPasswordResponse>('/api/me/password', { method: 'POST', body: input }),
    async deleteAccount(input: AccountDeleteInput) {
      const res = await $fetch<AccountDeleteResponse>('/api/me', { method: 'DELETE', body: input })
      // The server has ended every session: forget the user and every page's cached data here.
      await session.signOut().catch(() => {})
      return res
    },
    /** The export's address: a plain link downloads it with the session's cookie. */
    exportUrl: '/api/me/export',
  }
}
