import type {
  AccountDeleteInput, AccountNameInput, AccountPasswordInput,
  EmailChangeInput, PasswordResetConfirmInput, PasswordResetRequestInput,
} from '#shared/schemas/account'
import type { PublicUser } from '#shared/types/api'
import type { AccountDeleteResponse, AccountNameResponse, AccountPasswordResponse } from '#shared/types/api-account'

/**
 * Actions on one's own account ($fetch): the account page's (name, password, deletion, export)
 * and the one-time links' (a password reset, confirming an address, a new confirmation link,
 * moving to another address). Errors are thrown for the form to show; the session store is
 * brought up to date.
 */
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

    requestReset: (body: PasswordResetRequestInput) =>
      $fetch<{ message: string }>('/api/auth/password-reset', { method: 'POST', body }),
    confirmReset: (body: PasswordResetConfirmInput) =>
      $fetch<{ message: string, email: string }>('/api/auth/password-reset/confirm', { method: 'POST', body }),
    confirmEmail: (token: string) =>
      $fetch<{ message: string, user: PublicUser }>('/api/auth/verification/confirm', { method: 'POST', body: { token } }),
    resendConfirmation: () =>
      $fetch<{ message: string }>('/api/auth/verification/resend', { method: 'POST' }),
    changeEmail: (body: EmailChangeInput) =>
      $fetch<{ message: string }>('/api/me/email', { method: 'POST', body }),
  }
}
