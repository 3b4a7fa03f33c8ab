// Seeds the invented demo scenario. Idempotent: when the demo competition exists it does
// nothing; `reset` wipes every table first (`npm run seed:reset`).
import type { Knex } from 'knex'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { faiClass } from '../shared/constants/classes'
import { competitionNoticeSections, privacyNoticeFacts, privacyNoticeVersion } from '../shared/utils/privacy-notice'
import { DEMO_COMPETITION, DEMO_PASSWORD, DEMO_PEOPLE } from './demo-data'
import { DEMO_ENTRIES, DEMO_EXTRA_PILOTS, DEMO_FIRMWARE } from './demo-entries'
import { seedDemoPayments } from './demo-payments'
import { seedDemoDocuments, seedDemoIgcFiles, seedDemoWeighIn } from './demo-files'
import { fileKeyring } from '../server/domain/files/file-crypt'
import { seedDemoTags } from './demo-tags'

export { DEMO_SIGN_INS, DEMO_PASSWORD } from './demo-data'

// The same driver and defaults nuxt-auth-utils' hashPassword uses, so verifyPassword accepts it.
const hasher = new Hash(new Scrypt({}))

// Every table of the schema; TRUNCATE … CASCADE also reaches tables added later that refer to these.
const WIPE_ORDER = ['audit_log', 'mail_outbox', 'rate_limits', 'memberships', 'classes', 'competitions', 'account_tokens', 'user_sessions', 'users']

/**
 * `tagSecret` must be the key the server signs tags with (NUXT_TAG_SECRET, else the session
 * password), so that the demo's tags resolve; `filesKey` the key it opens stored files with
 * (NUXT_FILES_KEY), so that the demo's documents and IGC files open.
 */
export async function seedDemo(knex: Knex, opts: { reset?: boolean, tagSecret?: string, filesKey?: string } = {}): Promise<{ seeded: boolean }> {
  const tagSecret = opts.tagSecret || process.env.NUXT_TAG_SECRET || process.env.NUXT_SESSION_PASSWORD
  if (!tagSecret) throw new Error('The demo seed signs glider tags: give it the tag secret (NUXT_TAG_SECRET or NUXT_SESSION_PASSWORD).')
  const files = fileKeyring({ key: opts.filesKey || process.env.NUXT_FILES_KEY })
  if (!files.current) throw new Error('The demo seed seals its documents and IGC files: give it the files key (NUXT_FILES_KEY).')
  return knex.transaction(async (trx) => {
    if (opts.reset) {
      await trx.raw(`TRUNCATE ${WIPE_ORDER.join(', ')} RESTART IDENTITY CASCADE`)
    }
    else {
      const existing = await trx('competitions').where({ slug: DEMO_COMPETITION.slug }).first('id')
      if (existing) {
        // A demo seeded before tags existed gets them once.
        await seedDemoTags(trx, existing.id, tagSecret)
        return { seeded: false }
      }
    }

    const passwordHash = await hasher.make(DEMO_PASSWORD)
    const users = await trx('users')
      .insert([...DEMO_PEOPLE, ...DEMO_EXTRA_PILOTS].map(p => ({
        email: p.email,
        name: p.name,
        password_hash: passwordHash,
        is_admin: 'isAdmin' in p ? p.isAdmin ?? false : false,
        email_verified_at: trx.fn.now(),
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
        registration_opens_on: DEMO_COMPETITION.registrationOpensOn,
        registration_closes_on: DEMO_COMPETITION.registrationClosesOn,
        late_fee_after: DEMO_COMPETITION.lateFeeAfter,
        late_fee_minor: DEMO_COMPETITION.lateFeeMinor,
        settings: DEMO_SETTINGS,
        created_by: admin,
      })
      .returning('id')

    await trx('competition_days').insert([
      ...DEMO_COMPETITION.practiceDays.map(day => ({ competition_id: competition.id, day, kind: 'practice' })),
      ...contestDays(DEMO_COMPETITION.firstContestDay, DEMO_COMPETITION.lastContestDay).map(day => ({ competition_id: competition.id, day, kind: 'contest' })),
    ])

    const classes = await trx('classes').insert(DEMO_COMPETITION.classes.map((c, i) => {
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
    })).returning(['id', 'code'])
    const classIdByCode = new Map(classes.map(c => [c.code as string, c.id as string]))

    await trx('firmware_releases').insert(DEMO_FIRMWARE.map(f => ({
      competition_id: competition.id, unit_family: f.family, version: f.version, expires_on: f.expiresOn,
    })))

    const memberships = DEMO_PEOPLE.flatMap(p => p.roles.map(role => ({
      user_id: idByEmail.get(p.email),
      competition_id: competition.id,
      role,
      granted_by: admin,
    })))
    await trx('memberships').insert(memberships).onConflict(['user_id', 'competition_id', 'role']).ignore()

    const organiser = idByEmail.get('organiser@gridmark.example')
    const noticeVersion = await demoNoticeVersion()
    for (const [i, e] of DEMO_ENTRIES.entries()) {
      const entrantId = idByEmail.get(e.entrantEmail)!
      // Submitted in the spring, decided a few days later (fixed dates: the seed is repeatable).
      const submittedAt = e.status === 'draft' ? null : `2027-0${3 + (i % 3)}-${String(1 + (i % 27)).padStart(2, '0')}T09:${String(10 + i).padStart(2, '0')}:00Z`
      const decided = e.status === 'accepted' || e.status === 'rejected'
      const [entry] = await trx('entries').insert({
        competition_id: competition.id,
        class_id: classIdByCode.get(e.classCode),
        entrant_user_id: entrantId,
        status: e.status,
        decision_reason: e.decisionReason ?? null,
        pilot_name: e.pilotName,
        pilot_nationality: e.pilotNationality,
        pilot_licence_number: e.pilotLicenceNumber,
        pilot_phone: e.pilotPhone,
        emergency_contact: e.emergencyContact,
        copilot_name: e.copilotName ?? null,
        crew_names: e.crewNames,
        glider_type: e.gliderType,
        registration: e.registration,
        comp_id: e.compId,
        span_m: e.spanM,
        mtom_kg: e.mtomKg,
        empty_mass_kg: e.emptyMassKg,
        motor_glider: e.motorGlider,
        pilot_mass_kg: e.pilotMassKg ?? null,
        copilot_mass_kg: e.copilotMassKg ?? null,
        submitted_at: submittedAt,
        decided_at: decided ? trx.raw(`?::timestamptz + interval '3 days'`, [submittedAt]) : null,
        decided_by: decided ? organiser : null,
        withdrawn_at: e.status === 'withdrawn' ? trx.raw(`?::timestamptz + interval '20 days'`, [submittedAt]) : null,
        payment_status: e.paymentStatus,
        paid_minor: e.paymentStatus === 'paid' ? DEMO_COMPETITION.classes.find(c => c.code === e.classCode)!.entryFeeMinor : 0,
        // Every pilot confirmed the privacy notice on entering, two days before submitting.
        privacy_confirmed_at: submittedAt ? trx.raw(`?::timestamptz - interval '2 days'`, [submittedAt]) : DEMO_DRAFTS_CONFIRMED_AT,
        privacy_notice_version: noticeVersion,
      }).returning('id')
      await trx('units').insert(e.units.map(u => ({
        entry_id: entry.id,
        competition_id: competition.id,
        kind: u.kind,
        model: u.model,
        serial: u.serial,
        firmware_version: u.firmwareVersion,
        radio_id: u.radioId ?? null,
        firmware_expires_on: u.firmwareExpiresOn ?? null,
        firmware_updated_on: u.firmwareUpdatedOn ?? null,
        approval_level: u.approvalLevel ?? null,
        igc_recorder_id: u.igcRecorderId ?? null,
      })))
      await trx('memberships').insert({ user_id: entrantId, competition_id: competition.id, role: 'entrant', granted_by: null })
        .onConflict(['user_id', 'competition_id', 'role']).ignore()
    }

    await seedDemoDocuments(trx, competition.id, files)
    await seedDemoIgcFiles(trx, competition.id, files)
    await seedDemoWeighIn(trx, competition.id, idByEmail.get('scrutineer@gridmark.example')!)
    await seedDemoPayments(trx, competition.id, organiser ?? null)
    await seedDemoTags(trx, competition.id, tagSecret)

    await trx('audit_log').insert({
      actor_user_id: null,
      competition_id: competition.id,
      action: 'demo.seeded',
      subject_type: 'competition',
      subject_id: competition.id,
      details: { people: DEMO_PEOPLE.length + DEMO_EXTRA_PILOTS.length, entries: DEMO_ENTRIES.length },
    })
    return { seeded: true }
  })
}

const DEMO_SETTINGS = { ...DEMO_COMPETITION.rules, privacyContactEmail: DEMO_COMPETITION.privacyContactEmail }
const DEMO_DRAFTS_CONFIRMED_AT = '2027-05-02T18:00:00Z'

/** The digest of the demo competition's privacy notice, as the server computes it for a new entry. */
async function demoNoticeVersion(): Promise<string> {
  const organisers = DEMO_PEOPLE.filter(p => p.roles.includes('organiser')).map(p => p.name)
  const facts = privacyNoticeFacts({
    name: DEMO_COMPETITION.name,
    airfieldName: DEMO_COMPETITION.airfieldName,
    firstContestDay: DEMO_COMPETITION.firstContestDay,
    lastContestDay: DEMO_COMPETITION.lastContestDay,
    settings: DEMO_SETTINGS,
  }, organisers)
  return privacyNoticeVersion(competitionNoticeSections(facts))
}

/** Every day from first to last, inclusive, as YYYY-MM-DD (calendar arithmetic in UTC). */
function contestDays(first: string, last: string): string[] {
  const days: string[] = []
  for (let d = new Date(`${first}T00:00:00Z`); d <= new Date(`${last}T00:00:00Z`); d.setUTCDate(d.getUTCDate() + 1)) {
    days.push(d.toISOString().slice(0, 10))
  }
  return days
}
