// The privacy notices: a competition's, filled from its set-up (name, airfield, days, privacy
// contact), its organisers and its rules (retention); the site's own, with the competitions open
// for registration. Both are public: the controller must be known before anyone signs up.
import type { Knex } from 'knex'
import { MESSAGES } from '#shared/constants/messages'
import type { CompetitionPrivacyNotice, PrivacyNoticeFacts, SitePrivacyNotice } from '#shared/types/api-privacy'
import {
  competitionNoticeSections,
  PRIVACY_NOTICE_REVISION,
  privacyNoticeFacts,
  privacyNoticeVersion,
  siteNoticeSections,
} from '#shared/utils/privacy-notice'
import { useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'
import { OPEN_SQL } from './registration-sql'

async function noticeFacts(competitionId: string, db: Knex): Promise<PrivacyNoticeFacts | undefined> {
  const c = await db('competitions').where({ id: competitionId })
    .first('name', 'airfield_name', 'first_contest_day', 'last_contest_day', 'settings')
  if (!c) return undefined
  const organisers: { name: string }[] = await db('memberships as m').join('users as u', 'u.id', 'm.user_id')
    .where({ 'm.competition_id': competitionId, 'm.role': 'organiser' }).whereNull('u.deleted_at')
    .select('u.name')
  return privacyNoticeFacts({
    name: c.name,
    airfieldName: c.airfield_name,
    firstContestDay: c.first_contest_day,
    lastContestDay: c.last_contest_day,
    settings: c.settings,
  }, organisers.map(o => o.name))
}

/** A competition's notice as it reads now; 404 for an unknown competition. */
export async function competitionPrivacyNotice(competitionId: string, db: Knex = useDb()): Promise<CompetitionPrivacyNotice> {
  const facts = await noticeFacts(competitionId, db)
  if (!facts) throw httpError(404, MESSAGES.privacyNoticeNotFound)
  const sections = competitionNoticeSections(facts)
  return { competitionId, facts, sections, version: await privacyNoticeVersion(sections), revision: PRIVACY_NOTICE_REVISION }
}

/** The digest of the competition's notice as it reads now, which a new entry records (in its transaction). */
export async function currentNoticeVersion(competitionId: string, trx: Knex): Promise<string> {
  return (await competitionPrivacyNotice(competitionId, trx)).version
}

/** The site's notice and the competitions open for registration today, soonest first. */
export async function sitePrivacyNotice(db: Knex = useDb()): Promise<SitePrivacyNotice> {
  // As on the list of open competitions: only those with a class can be entered.
  const rows = await db('competitions as c').whereRaw(OPEN_SQL)
    .whereExists(db('classes as k').whereRaw('k.competition_id = c.id').select(db.raw('1')))
    .orderByRaw('c.first_contest_day NULLS LAST, c.name')
    .select('c.id', 'c.name', 'c.airfield_name', 'c.first_contest_day', 'c.last_contest_day')
  return {
    sections: siteNoticeSections(),
    revision: PRIVACY_NOTICE_REVISION,
    competitions: rows.map(r => ({
      competitionId: r.id,
      name: r.name,
      airfieldName: r.airfield_name,
      firstContestDay: r.first_contest_day,
      lastContestDay: r.last_contest_day,
    })),
  }
}
