// Seeds the invented demo scenario. Idempotent: when the demo competition exists it does
// nothing; `reset` wipes every table first (`npm run seed:reset`).
import type { Knex } from 'knex'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { faiClass } from '../shared/constants/classes'
import { DEMO_COMPETITION, DEMO_PASSWORD, DEMO_PEOPLE } from './demo-data'
import { seedSetupDemo } from './setup-demo'

export { DEMO_SIGN_INS, DEMO_PASSWORD } from './demo-data'

// The same driver and defaults nuxt-auth-utils' hashPassword uses, so verifyPassword accepts it.
const hasher = new Hash(new Scrypt({}))

// Every table of the schema; TRUNCATE … CASCADE also reaches tables added later that refer to these.
const WIPE_ORDER = ['audit_log', 'mail_outbox', 'rate_limits', 'memberships', 'classes', 'competitions', 'user_sessions', 'users']

export async function seedDemo(knex: Knex, opts: { reset?: boolean } = {}): Promise<{ seeded: boolean }> {
  return knex.transaction(async (trx) => {
    if (opts.reset) {
      await trx.raw(`TRUNCATE ${WIPE_ORDER.join(', ')} RESTART IDENTITY CASCADE`)
    }
    else {
      const existing = await trx('competitions').where({ slug: DEMO_COMPETITION.slug }).first('id')
      if (existing) return { seeded: false }
    }

    const passwordHash = await hasher.make(DEMO_PASSWORD)
    const users = await trx('users')
      .insert(DEMO_PEOPLE.map(p => ({
        email: p.email,
        name: p.name,
        password_hash: passwordHash,
        is_admin: p.isAdmin ?? false,
      })))
      // A re-run without reset keeps accounts someone signed up with a demo address.
      .onConflict(trx.raw('(lower(email))'))
      .merge(['name', 'is_admin'])
      .returning(['id', 'email'])
    const idByEmail = new Map(users.map(u => [u.email, u.id as string]))
    const admin = idByEmail.get(DEMO_PEOPLE.find(p => p.isAdmin)!.email)

    const [competition] = await trx('competitions')
      .insert({
        slug: DEMO_COMPETITION.slug,
        name: DEMO_COMPETITION.name,
        airfield_name: DEMO_COMPETITION.airfieldName,
        airfield_icao: DEMO_COMPETITION.airfieldIcao,
        time_zone: DEMO_COMPETITION.timeZone,
        first_contest_day: DEMO_COMPETITION.firstContestDay,
        last_contest_day: DEMO_COMPETITION.lastContestDay,
        currency: DEMO_COMPETITION.currency,
        created_by: admin,
      })
      .returning('id')

    await trx('classes').insert(DEMO_COMPETITION.classes.map((c, i) => {
      const fai = faiClass(c.code)!
      return {
        competition_id: competition.id,
        name: c.name,
        code: c.code,
        max_span_m: fai.maxSpanM,
        max_mtom_kg: fai.maxMtomKg,
        water_ballast: fai.waterBallast,
        entry_fee_minor: c.entryFeeMinor,
        sort_order: i,
      }
    }))

    const memberships = DEMO_PEOPLE.flatMap(p => p.roles.map(role => ({
      user_id: idByEmail.get(p.email),
      competition_id: competition.id,
      role,
      granted_by: admin,
    })))
    await trx('memberships').insert(memberships).onConflict(['user_id', 'competition_id', 'role']).ignore()
    await seedSetupDemo(trx, competition.id, { first: DEMO_COMPETITION.firstContestDay, last: DEMO_COMPETITION.lastContestDay })

    await trx('audit_log').insert({
      actor_user_id: null,
      competition_id: competition.id,
      action: 'demo.seeded',
      subject_type: 'competition',
      subject_id: competition.id,
      details: { people: DEMO_PEOPLE.length },
    })
    return { seeded: true }
  })
}
