// `npm run admin:create -- <email> [--name "Full Name"]`: creates the first site administrator
// of a database with no usable password and prints a one-time link (24 hours) to choose one.
// The database is NUXT_DATABASE_URL or DATABASE_URL (production), else the demo cluster. It
// refuses, exiting non-zero, when the address already has an account: it works once.
import { randomBytes } from 'node:crypto'
import knex from 'knex'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { createKnexConfig } from '../knexfile'
import { signUpSchema } from '../shared/schemas/auth'
import { ACCOUNT_TOKEN_LIFETIME_MS, accountLink, newAccountToken } from '../server/domain/people/account-token-hash'
import { runMain, ScriptError, step } from './lib/common'
import { migrate } from './lib/db'
import { prepareDemoDatabase } from './lib/demo-db'

function parseArgs(argv: string[]): { email: string, name: string } {
  const args = [...argv]
  let name = 'Site administrator'
  const at = args.indexOf('--name')
  if (at >= 0) {
    name = (args[at + 1] ?? '').trim()
    args.splice(at, 2)
    if (!name) throw new ScriptError('Give the administrator\'s name after --name, e.g. --name "Rhona Fairweather".')
  }
  if (args.length !== 1) throw new ScriptError('Usage: npm run admin:create -- <email> [--name "Full Name"]')
  const parsed = signUpSchema.shape.email.safeParse(args[0])
  if (!parsed.success) throw new ScriptError(`${args[0]} is not an e-mail address: ${parsed.error.issues[0]?.message}`)
  return { email: parsed.data, name }
}

runMain(async () => {
  const { email, name } = parseArgs(process.argv.slice(2))
  const url = process.env.NUXT_DATABASE_URL || process.env.DATABASE_URL || await prepareDemoDatabase()
  const applied = await migrate(url)
  if (applied.length > 0) step(`Applied ${applied.length} migration(s): ${applied.join(', ')}`)

  // A password nobody knows: the account can be signed in only after the link sets one.
  const unusable = await new Hash(new Scrypt({})).make(randomBytes(32).toString('base64url'))
  const { token, hash } = newAccountToken()
  const db = knex(createKnexConfig(url, { timeouts: false }))
  try {
    await db.transaction(async (trx) => {
      const existing = await trx('users').whereRaw('lower(email) = lower(?)', [email]).first('id')
      if (existing) throw new ScriptError(`An account with ${email} exists already; admin:create makes a new account only once. Nothing was changed.`)
      const [user] = await trx('users').insert({ email, name, password_hash: unusable, is_admin: true }).returning('id')
      await trx('account_tokens').insert({
        user_id: user.id,
        purpose: 'set-password',
        token_hash: hash,
        email,
        expires_at: new Date(Date.now() + ACCOUNT_TOKEN_LIFETIME_MS['set-password']),
      })
      await trx('audit_log').insert({ actor_user_id: null, action: 'user.admin-created', subject_type: 'user', subject_id: user.id, details: {} })
    })
  }
  finally {
    await db.destroy()
  }

  const base = process.env.NUXT_SITE_URL || `http://127.0.0.1:${process.env.PORT || '3000'}`
  step(`Created the site administrator ${email}. Open this link within 24 hours to choose the password (it works once):`)
  console.log(accountLink(base, 'set-password', token))
})
