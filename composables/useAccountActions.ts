import type { EmailChangeInput, PasswordResetConfirmInput, PasswordResetRequestInput } from '#shared/schemas/account'
import type { PublicUser } from '#shared/types/api'

/**
 * The account's one-time links ($fetch): asking for a password reset, choosing the new password,
 * confirming an address, a new confirmation link, moving to another address. Errors are thrown
 * for the form to show; each answer carries the sentence to show on success.
 */
export function useAccountActions() {
  return {
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
