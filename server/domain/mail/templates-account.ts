// The e-mails of the account's one-time links: choosing a new password, confirming an address at
// sign-up or after a change, the notice to an address that is being replaced, and the note to an
// address someone tried to sign up with again. Pure functions over renderMail, like templates.ts.
import { renderMail, type RenderedMail } from './templates'

type Mail = RenderedMail & { subject: string }

export function passwordResetMail(input: { name: string, url: string }): Mail {
  return {
    subject: 'Choose a new Gridmark password',
    ...renderMail({
      greeting: `Hello ${input.name},`,
      paragraphs: [
        'Someone, hopefully you, asked to choose a new password for your Gridmark account.',
        'Open the link to choose it. The link works once, for one hour; every session of the account is signed out when the password changes.',
        'If you did not ask, ignore this message: your password stays as it is.',
      ],
      action: { label: 'Choose a new password', url: input.url },
    }),
  }
}

export function confirmAddressMail(input: { name: string, url: string }): Mail {
  return {
    subject: 'Confirm your e-mail address for Gridmark',
    ...renderMail({
      greeting: `Hello ${input.name},`,
      paragraphs: [
        'Welcome to Gridmark. Open the link to confirm that this address is yours; it also signs you in.',
        'Until the address is confirmed you can sign in and look around, but not enter a glider or accept an invitation. The link works once, for 24 hours.',
        'If you did not create this account, ignore this message.',
      ],
      action: { label: 'Confirm my address', url: input.url },
    }),
  }
}

export function signUpAgainMail(input: { name: string, signInUrl: string, resetUrl: string }): Mail {
  return {
    subject: 'Someone tried to create a Gridmark account with your address',
    ...renderMail({
      greeting: `Hello ${input.name},`,
      paragraphs: [
        'Someone tried to create a new Gridmark account with this e-mail address. It already has an account, so nothing was created and nothing changed.',
        `If that was you, sign in instead: ${input.signInUrl}`,
        'Forgotten the password? Choose a new one with the link below. If it was not you, ignore this message.',
      ],
      action: { label: 'Choose a new password', url: input.resetUrl },
    }),
  }
}

export function confirmNewAddressMail(input: { name: string, url: string }): Mail {
  return {
    subject: 'Confirm your new e-mail address for Gridmark',
    ...renderMail({
      greeting: `Hello ${input.name},`,
      paragraphs: [
        'You asked to use this address for your Gridmark account. Open the link to confirm it: the account changes to this address only then.',
        'The link works once, for 24 hours. If you did not ask for this, ignore this message and nothing changes.',
      ],
      action: { label: 'Confirm the new address', url: input.url },
    }),
  }
}

export function addressReplacedMail(input: { name: string, newEmail: string }): Mail {
  return {
    subject: 'Your Gridmark account now uses another e-mail address',
    ...renderMail({
      greeting: `Hello ${input.name},`,
      paragraphs: [
        `Your Gridmark account’s e-mail address was changed to ${input.newEmail}, confirmed through a link sent there. Sign in with that address from now on.`,
        'If you did not make this change, tell the competition office at once.',
      ],
    }),
  }
}
