// The secrets of a running server: the session password seals cookies, the tag secret signs
// glider tags, the invitation secret signs invitation links. In production each is its own
// (server/plugins/production-start.ts refuses to start otherwise); only the demo (`npm start`,
// the tests: NUXT_DEMO_MODE=true) and `nuxt dev` let tags and invitations fall back to the
// session password.

/** nuxt-auth-utils refuses shorter session passwords; the other secrets follow the same rule. */
export const SECRET_MIN_LENGTH = 32

export const SECRET_VARIABLES = {
  session: 'NUXT_SESSION_PASSWORD',
  tag: 'NUXT_TAG_SECRET',
  invitation: 'NUXT_INVITATION_SECRET',
} as const

export type SecretName = keyof typeof SECRET_VARIABLES

/** The demo (and tests) run the built server in demo mode; a production start never does. */
export function isDemoMode(): boolean {
  const value = useRuntimeConfig().demoMode as unknown
  return value === true || value === 'true' || value === '1'
}

/** The three secrets as configured, '' for a missing one. */
export function configuredSecrets(): Record<SecretName, string> {
  const config = useRuntimeConfig()
  return {
    session: String((config.session as { password?: string }).password || process.env.NUXT_SESSION_PASSWORD || ''),
    tag: String(config.tagSecret || ''),
    invitation: String(config.invitationSecret || ''),
  }
}

/**
 * The key that signs tags or invitations: its own secret; outside production the session
 * password when it is not set.
 */
export function signingSecret(name: 'tag' | 'invitation'): string {
  const secrets = configuredSecrets()
  if (secrets[name]) return secrets[name]
  if ((import.meta.dev || isDemoMode()) && secrets.session) return secrets.session
  throw new Error(`No secret to sign ${name === 'tag' ? 'glider tags' : 'invitation links'}: set ${SECRET_VARIABLES[name]}.`)
}

/**
 * What is wrong with the secrets for a production start, one sentence each; empty when each is
 * set, long enough, and unlike the others.
 */
export function secretProblems(secrets: Record<SecretName, string>): string[] {
  const problems: string[] = []
  const names = Object.keys(SECRET_VARIABLES) as SecretName[]
  for (const name of names) {
    const value = secrets[name]
    if (!value) problems.push(`${SECRET_VARIABLES[name]} is not set.`)
    else if (value.length < SECRET_MIN_LENGTH) problems.push(`${SECRET_VARIABLES[name]} is ${value.length} characters long; it needs at least ${SECRET_MIN_LENGTH}.`)
  }
  for (const [i, a] of names.entries()) {
    for (const b of names.slice(i + 1)) {
      if (secrets[a] && secrets[a] === secrets[b]) problems.push(`${SECRET_VARIABLES[a]} and ${SECRET_VARIABLES[b]} are the same; each needs its own value.`)
    }
  }
  return problems
}
