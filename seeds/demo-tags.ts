// Demo glider tags: every accepted entry of the demo competition gets one, issued by the
// organiser, so the grid can be scanned from the first start. Short codes are drawn from the
// tag alphabet, seeded by the competition ID (repeatable); nonces are random. The token is
// signed with the server's tag key, so the seeder must be given the same secret the server
// uses (NUXT_TAG_SECRET, else the session password) or the printed tags will not resolve.
import { createHash } from 'node:crypto'
import type { Knex } from 'knex'
import { SHORT_CODE_ALPHABET, SHORT_CODE_LENGTH } from '../shared/constants/grid'
import { createTagToken, hashTagToken } from '../server/domain/tags/tag-token'

/** A short code from the alphabet, the same for the same seed text. */
export function demoShortCode(seed: string): string {
  const bytes = createHash('sha256').update(`demo-tag:${seed}`).digest()
  let code = ''
  for (let i = 0; i < SHORT_CODE_LENGTH; i++) code += SHORT_CODE_ALPHABET[bytes[i]! % SHORT_CODE_ALPHABET.length]
  return code
}

/** Tags the accepted entries of a competition that has no tags yet; returns how many it issued. */
export async function seedDemoTags(trx: Knex, competitionId: string, secret: string): Promise<number> {
  const existing = await trx('tags').where({ competition_id: competitionId }).first('id')
  if (existing) return 0 // the organiser has been at work: leave the tags as they are
  const organiser = await trx('users').whereRaw('lower(email) = ?', ['organiser@gridmark.example']).first('id')
  if (!organiser) return 0
  const entries: { id: string, comp_id: string }[] = await trx('entries')
    .where({ competition_id: competitionId, status: 'accepted' }).orderBy('comp_id').select('id', 'comp_id')
  if (!entries.length) return 0

  const used = new Set<string>()
  const rows = entries.map((e) => {
    let code = demoShortCode(e.comp_id)
    for (let n = 1; used.has(code); n++) code = demoShortCode(`${e.comp_id}:${n}`)
    used.add(code)
    const { token, nonce } = createTagToken(secret, competitionId)
    return {
      competition_id: competitionId,
      entry_id: e.id,
      token_hash: hashTagToken(token),
      nonce,
      short_code: code,
      issued_by: organiser.id,
      issued_at: '2027-04-20T10:00:00Z',
    }
  })
  await trx('tags').insert(rows)
  await trx('audit_log').insert(rows.map(r => ({
    actor_user_id: organiser.id,
    competition_id: competitionId,
    action: 'tag.issued',
    subject_type: 'entry',
    subject_id: r.entry_id,
    details: { shortCode: r.short_code, demo: true },
  })))
  return rows.length
}
