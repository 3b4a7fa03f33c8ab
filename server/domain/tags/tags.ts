// Glider tags: issue, reissue and revoke the QR stickers of accepted entries, list them for
// the organiser, build the sheet to print, and resolve a scanned token or a typed short code
// to the entry. The token is never stored; it is rebuilt from the stored nonce for printing.
import type { Knex } from 'knex'
import type { H3Event } from 'h3'
import type { User } from '#auth-utils'
import QRCode from 'qrcode'
import { STAFF_ROLES } from '#shared/constants/roles'
import { MESSAGES } from '#shared/constants/messages'
import type { TagSelection } from '#shared/schemas/tags'
import type { PrintableTag, ResolvedTag, TagListEntry } from '#shared/types/api-tags'
import { effectiveRoles } from '#shared/utils/access'
import { audit } from '#domain/audit/audit'
import { rolesInCompetition } from '#domain/people/memberships'
import { signingSecret } from '#domain/people/secrets'
import { requireRole, requireUser } from '#server/utils/authz'
import { useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'
import { createTagToken, hashTagToken, tagTokenFromNonce, verifyTagToken } from './tag-token'
import { randomShortCode, ShortCodeExhaustedError, withFreshShortCode, type ShortCodeGenerator } from './short-code'

/** The key that signs tags: NUXT_TAG_SECRET (only the demo falls back to the session password). */
export function tagSecret(): string {
  return signingSecret('tag')
}

/** Where the QR code points: the configured public address, else the request's origin. */
export function tagUrl(baseUrl: string, token: string): string {
  return `${baseUrl.replace(/\/+$/, '')}/t/${token}`
}

interface TagListRow {
  entry_id: string
  comp_id: string
  registration: string
  glider_type: string
  pilot_name: string
  class_id: string
  class_name: string
  status: string
  tag_id: string | null
  short_code: string | null
  nonce: string | null
  issued_at: Date | null
}

/** Entries of the competition with their current tag, class by class, then by competition ID. */
function entriesWithTags(db: Knex, competitionId: string) {
  return db('entries as e')
    .join('classes as c', 'c.id', 'e.class_id')
    .leftJoin('tags as t', function () {
      this.on('t.entry_id', 'e.id').andOnNull('t.revoked_at')
    })
    .where('e.competition_id', competitionId)
    .orderBy([{ column: 'c.sort_order' }, { column: 'c.name' }, { column: 'e.comp_id' }])
    .select(
      'e.id as entry_id', 'e.comp_id', 'e.registration', 'e.glider_type', 'e.pilot_name', 'e.status',
      'c.id as class_id', 'c.name as class_name',
      't.id as tag_id', 't.short_code', 't.nonce', 't.issued_at',
    )
}

function toListEntry(r: TagListRow): TagListEntry {
  return {
    entryId: r.entry_id,
    compId: r.comp_id,
    registration: r.registration,
    gliderType: r.glider_type,
    pilotName: r.pilot_name,
    classId: r.class_id,
    className: r.class_name,
    tag: r.tag_id ? { id: r.tag_id, shortCode: r.short_code!, issuedAt: r.issued_at!.toISOString() } : null,
  }
}

/** Accepted entries of the competition with their current tag (null: none yet). */
export async function listTags(competitionId: string, selection: TagSelection = {}, db: Knex = useDb()): Promise<TagListEntry[]> {
  const q = entriesWithTags(db, competitionId).where('e.status', 'accepted')
  if (selection.classId) q.where('e.class_id', selection.classId)
  if (selection.entryIds) q.whereIn('e.id', selection.entryIds)
  const rows: TagListRow[] = await q
  return rows.map(toListEntry)
}

async function insertTag(trx: Knex, input: { competitionId: string, entryId: string, userId: string }, generate: ShortCodeGenerator) {
  const { token, nonce } = createTagToken(tagSecret(), input.competitionId)
  try {
    // Each attempt in its own savepoint: a clash of short codes must not abort the transaction.
    return await withFreshShortCode(code => trx.transaction(async (sp) => {
      const [row] = await sp('tags').insert({
        competition_id: input.competitionId,
        entry_id: input.entryId,
        token_hash: hashTagToken(token),
        nonce,
        short_code: code,
        issued_by: input.userId,
      }).returning(['id', 'short_code'])
      return row as { id: string, short_code: string }
    }), generate)
  }
  catch (error) {
    if (error instanceof ShortCodeExhaustedError) throw httpError(503, MESSAGES.shortCodesExhausted)
    throw error
  }
}

/**
 * The entries a selection names, locked for the transaction. Chosen entries must all be
 * accepted (409 otherwise); a class or "all" simply skips the others.
 */
async function selectedEntries(trx: Knex, competitionId: string, selection: TagSelection): Promise<string[]> {
  if (selection.classId) {
    const cls = await trx('classes').where({ id: selection.classId, competition_id: competitionId }).first('id')
    if (!cls) throw httpError(404, MESSAGES.classNotFound)
  }
  const q = trx('entries').where({ competition_id: competitionId }).orderBy('id').forUpdate().select('id', 'status')
  if (selection.classId) q.where({ class_id: selection.classId })
  if (selection.entryIds) q.whereIn('id', selection.entryIds)
  const rows: { id: string, status: string }[] = await q
  if (selection.entryIds) {
    if (rows.length !== new Set(selection.entryIds).size) throw httpError(404, MESSAGES.entryNotFound)
    if (rows.some(r => r.status !== 'accepted')) throw httpError(409, MESSAGES.tagEntryNotAccepted)
  }
  return rows.filter(r => r.status === 'accepted').map(r => r.id)
}

/** Issues a tag to each selected accepted entry that has none; returns the selected entries. */
export async function issueTags(
  competitionId: string,
  selection: TagSelection,
  user: Pick<User, 'id'>,
  generate: ShortCodeGenerator = randomShortCode,
): Promise<TagListEntry[]> {
  const entryIds = await useDb().transaction(async (trx) => {
    const ids = await selectedEntries(trx, competitionId, selection)
    if (!ids.length) return ids
    const tagged = new Set((await trx('tags').whereIn('entry_id', ids).whereNull('revoked_at').select('entry_id')).map(r => r.entry_id as string))
    for (const entryId of ids.filter(id => !tagged.has(id))) {
      const tag = await insertTag(trx, { competitionId, entryId, userId: user.id }, generate)
      await audit(trx, {
        actorUserId: user.id, competitionId, action: 'tag.issued', subjectType: 'entry', subjectId: entryId,
        details: { tagId: tag.id, shortCode: tag.short_code },
      })
    }
    return ids
  })
  return entryIds.length ? listTags(competitionId, { entryIds }) : []
}

/** An accepted entry of the competition, locked; 404 when unknown, 409 when not accepted. */
async function lockAcceptedEntry(trx: Knex, competitionId: string, entryId: string): Promise<void> {
  const entry = await trx('entries').where({ id: entryId, competition_id: competitionId }).forUpdate().first('status')
  if (!entry) throw httpError(404, MESSAGES.entryNotFound)
  if (entry.status !== 'accepted') throw httpError(409, MESSAGES.tagEntryNotAccepted)
}

async function revokeCurrent(trx: Knex, entryId: string, userId: string): Promise<{ id: string, short_code: string } | undefined> {
  const [row] = await trx('tags').where({ entry_id: entryId }).whereNull('revoked_at')
    .update({ revoked_at: trx.fn.now(), revoked_by: userId }).returning(['id', 'short_code'])
  return row
}

/** Revokes the entry's current tag (if any) and issues a new one, in one transaction. */
export async function reissueTag(
  competitionId: string,
  entryId: string,
  user: Pick<User, 'id'>,
  generate: ShortCodeGenerator = randomShortCode,
): Promise<TagListEntry> {
  await useDb().transaction(async (trx) => {
    await lockAcceptedEntry(trx, competitionId, entryId)
    const old = await revokeCurrent(trx, entryId, user.id)
    const tag = await insertTag(trx, { competitionId, entryId, userId: user.id }, generate)
    await audit(trx, {
      actorUserId: user.id, competitionId, action: 'tag.reissued', subjectType: 'entry', subjectId: entryId,
      details: { tagId: tag.id, shortCode: tag.short_code, revokedTagId: old?.id ?? null, revokedShortCode: old?.short_code ?? null },
    })
  })
  return (await listTags(competitionId, { entryIds: [entryId] }))[0]!
}

/** Revokes the entry's current tag without a new one (the sticker stops working). */
export async function revokeTag(competitionId: string, entryId: string, user: Pick<User, 'id'>): Promise<TagListEntry> {
  await useDb().transaction(async (trx) => {
    const entry = await trx('entries').where({ id: entryId, competition_id: competitionId }).forUpdate().first('id')
    if (!entry) throw httpError(404, MESSAGES.entryNotFound)
    const old = await revokeCurrent(trx, entryId, user.id)
    if (!old) throw httpError(409, MESSAGES.tagNoneToRevoke)
    await audit(trx, {
      actorUserId: user.id, competitionId, action: 'tag.revoked', subjectType: 'entry', subjectId: entryId,
      details: { tagId: old.id, shortCode: old.short_code },
    })
  })
  const rows: TagListRow[] = await entriesWithTags(useDb(), competitionId).where('e.id', entryId)
  return toListEntry(rows[0]!)
}

/** The current tags of the selection, each with the URL its QR code carries and the QR as SVG. */
export async function sheetTags(competitionId: string, selection: TagSelection, baseUrl: string): Promise<PrintableTag[]> {
  const q = entriesWithTags(useDb(), competitionId).where('e.status', 'accepted').whereNotNull('t.id')
  if (selection.classId) q.where('e.class_id', selection.classId)
  if (selection.entryIds) q.whereIn('e.id', selection.entryIds)
  const rows: TagListRow[] = await q
  const secret = tagSecret()
  return Promise.all(rows.map(async (r) => {
    const url = tagUrl(baseUrl, tagTokenFromNonce(secret, competitionId, r.nonce!))
    const qrSvg = await QRCode.toString(url, { type: 'svg', errorCorrectionLevel: 'M', margin: 0 })
    return { ...toListEntry(r), tag: toListEntry(r).tag!, url, qrSvg }
  }))
}

interface ResolveRow {
  competition_id: string
  entry_id: string
  comp_id: string
  entrant_user_id: string
  revoked_at: Date | null
}

function resolveQuery(db: Knex) {
  return db('tags as t').join('entries as e', 'e.id', 't.entry_id')
    .select('t.competition_id', 't.entry_id', 'e.comp_id', 'e.entrant_user_id', 't.revoked_at')
}

/**
 * Staff of the tag's competition see the grid check, the entry's own entrant their entry;
 * anyone else is told what an unknown tag is told. Revoked tags say so only to those.
 */
async function decideResolve(row: ResolveRow | undefined, user: User, notFound: string): Promise<ResolvedTag> {
  if (!row) throw httpError(404, notFound)
  const roles = effectiveRoles(await rolesInCompetition(user.id, row.competition_id), user.isAdmin)
  const view = roles.some(r => STAFF_ROLES.includes(r)) ? 'grid' : row.entrant_user_id === user.id ? 'own' : null
  if (!view) throw httpError(404, notFound)
  if (row.revoked_at) throw httpError(404, MESSAGES.tagRevoked)
  return { competitionId: row.competition_id, entryId: row.entry_id, compId: row.comp_id, view }
}

/** A scanned token: looked up by its hash, then its signature checked for the tag's competition. */
export async function resolveTagToken(event: H3Event, token: string): Promise<ResolvedTag> {
  const user = await requireUser(event)
  const row: ResolveRow | undefined = await resolveQuery(useDb()).where('t.token_hash', hashTagToken(token)).first()
  // A row whose token no longer verifies was signed with an earlier secret: it counts as unknown.
  const valid = row && verifyTagToken(token, tagSecret(), row.competition_id) ? row : undefined
  return decideResolve(valid, user, MESSAGES.tagNotFound)
}

/** A typed short code within the competition of the address (already normalised). */
export async function resolveShortCode(event: H3Event, competitionId: string, code: string): Promise<ResolvedTag> {
  const { user } = await requireRole(event, competitionId, 'any')
  const row: ResolveRow | undefined = await resolveQuery(useDb()).where({ 't.competition_id': competitionId, 't.short_code': code }).first()
  return decideResolve(row, user, MESSAGES.shortCodeNotFound)
}
