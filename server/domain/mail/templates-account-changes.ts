// The e-mails a person gets about their own account from the account page: the password was
// changed, the account was deleted. Pure functions over renderMail, like templates.ts.
import { renderMail, type RenderedMail } from './templates'

const ACCOUNT_FOOTER = 'Gridmark. This message was sent automatically because your account changed; replies are not read.'

/** To the account's address after its password was changed: every other device was signed out. */
export function passwordChangedMail(input: { name: string, accountUrl: string, signInUrl: string }): RenderedMail & { subject: string } {
  return {
    subject: 'Your Gridmark password was changed',
    ...renderMail({
      greeting: `Hello ${input.name},`,
      paragraphs: [
        'the password of your Gridmark account was changed just now. Every other device where you were signed in has been signed out; the one you used stays signed in.',
        'If you did not change it, someone else knows your password: reset it at once from the sign-in page and tell the competition office.',
      ],
      action: { label: 'Open your account', url: input.accountUrl },
      footer: `${ACCOUNT_FOOTER} Sign in: ${input.signInUrl}`,
    }),
  }
}

/** To the former address after the account was deleted: what went and what the office keeps. */
export function accountDeletedMail(input: { name: string, withdrawn: string[], keptPast: number, signUpUrl: string }): RenderedMail & { subject: string } {
  const paragraphs = ['your Gridmark account has been deleted, as you asked. You are signed out everywhere and this address no longer signs in.']
  if (input.withdrawn.length) paragraphs.push('These entries of competitions not yet over were withdrawn (the office was told):')
  const closing: string[] = []
  if (input.keptPast) {
    closing.push(`${input.keptPast === 1 ? 'Your entry in a past competition stays' : `Your ${input.keptPast} entries in past competitions stay`} in its results and records under the name “Deleted account”, without your contact details, licence or medical documents.`)
  }
  closing.push('You can sign up again with this address at any time; nothing of the old account comes back.')
  return {
    subject: 'Your Gridmark account was deleted',
    ...renderMail({
      greeting: `Hello ${input.name},`,
      paragraphs,
      list: input.withdrawn.length ? input.withdrawn : undefined,
      closing,
      action: { label: 'Sign up again', url: input.signUpUrl },
      footer: ACCOUNT_FOOTER,
    }),
  }
}
