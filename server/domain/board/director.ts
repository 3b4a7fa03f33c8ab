// The contest director's desk: hold a glider (with a reason), release it (with a reason), and
// waive one finding for the day or for the whole competition (with a reason). Each action is
// a row of `director_actions` and a row of the audit log, changes the entry's tile in the same
// transaction (pushed to the boards once committed), and is e-mailed to the entrant. A waiver
// can be withdrawn (with a reason): its row is kept, marked withdrawn, and lifts nothing from
// then on. The engine's `readiness` reads these actions: a hold wins over everything, a
// release ends the day's hold, a waiver lifts only its own finding.
import type { Knex } from 'knex'
import { blockingFirst, checkById, evaluate, type Finding, type IsoDate } from '#shared/engine'
import { MESSAGES } from '#shared/constants/messages'
import type { HoldBody, WaiverBody, WaiverWithdrawBody } from '#shared/schemas/board'
import type { BoardEntryDetail, BoardFinding, DirectorActionRecord, DirectorActionResult, EntryWaiver } from '#shared/types/api-board'
import type { DirectorActionRow } from '#shared/types/rows-board'
import { activeHold } from '#shared/utils/board-tile'
import { audit } from '#domain/audit/audit'
import { personalValuesOfDossier, withoutPersonalValues } from '#domain/audit/personal-fields'
import { enqueueMail } from '#domain/mail/outbox'
import { readinessMail, waiverMail } from '#domain/mail/templates'
import { actionsQuery, type BoardActionRow } from '#domain/read-model/day-inputs'
import { loadCompetitionDossiers } from '#domain/read-model/dossiers'
import type { CompetitionAccess } from '#server/utils/authz'
import { together, useDb } from '#server/utils/db'
import { httpError } from '#server/utils/errors'
import { siteUrl } from '#server/utils/site-url'
import { iso } from '#domain/read-model/values'
import { boardDayOf, boardTileOf } from './snapshot'
import { openFindingsOf, refreshTiles, toTileAction } from './tiles'
import { boardTransaction, lockBoard, openDate } from './transaction'

type ActionRowWithActor = DirectorActionRow & { actor_name: string, day: string | null, withdrawn_by_name: string | null }

function actionQuery(db: Knex) {
  return db('director_actions as a').join('users as u', 'u.id', 'a.actor_id')
    .leftJoin('users as wu', 'wu.id', 'a.withdrawn_by')
    .select('a.id', 'a.competition_id', 'a.entry_id', 'a.kind', 'a.check_id', 'a.unit_id', 'a.subject', 'a.reason', 'a.finding', 'a.actor_id', 'a.created_at',
      'u.name as actor_name', 'a.day', 'a.withdrawn_at', 'a.withdrawn_by', 'a.withdrawal_reason', 'wu.name as withdrawn_by_name')
}

export function toDirectorActionRecord(r: ActionRowWithActor): DirectorActionRecord {
  return {
    id: r.id,
    kind: r.kind,
    day: r.day,
    scope: r.kind === 'waiver' ? (r.day === null ? 'competition' : 'day') : null,
    checkId: r.check_id,
    unitId: r.unit_id,
    subject: r.subject,
    reason: r.reason,
    finding: r.finding,
    actor: { id: r.actor_id, name: r.actor_name },
    at: iso(r.created_at),
    withdrawal: r.withdrawn_at
      ? { by: { id: r.withdrawn_by!, name: r.withdrawn_by_name ?? 'Someone' }, at: iso(r.withdrawn_at)!, reason: r.withdrawal_reason ?? '' }
      : null,
  }
}

/** The open day the action is for: the named one must be the open day; none named takes it. */
async function actionDay(trx: Knex, competitionId: string, day: IsoDate | undefined): Promise<IsoDate> {
  const open = await openDate(trx, competitionId)
  if (!open) throw httpError(409, MESSAGES.noOpenDay)
  if (day && day !== open) throw httpError(409, MESSAGES.dayNotOpen(day))
  return open
}

async function boardEntry(trx: Knex, competitionId: string, entryId: string) {
  const entry = await trx('entries as e').join('users as u', 'u.id', 'e.entrant_user_id')
    .where({ 'e.id': entryId, 'e.competition_id': competitionId })
    .first('e.id', 'e.comp_id', 'e.status', 'u.email as entrant_email', 'u.name as entrant_name')
  if (!entry) throw httpError(404, MESSAGES.entryNotFound)
  if (entry.status !== 'accepted') throw httpError(409, MESSAGES.entryNotOnBoard)
  return entry as { id: string, comp_id: string, status: string, entrant_email: string, entrant_name: string }
}

async function dayActions(trx: Knex, competitionId: string, day: IsoDate, entryId: string) {
  return (await actionsQuery(trx, competitionId, day, [entryId])).map(toTileAction)
}

/** Hold or release a glider for the open day. */
export async function holdOrRelease(access: CompetitionAccess, entryId: string, kind: 'hold' | 'release', body: HoldBody): Promise<DirectorActionResult> {
  const { competition, user } = access
  return boardTransaction(async (trx, changes) => {
    await lockBoard(trx, competition.id)
    const day = await actionDay(trx, competition.id, body.day)
    const entry = await boardEntry(trx, competition.id, entryId)
    const held = activeHold(await dayActions(trx, competition.id, day, entryId), day)
    if (kind === 'hold' && held) throw httpError(409, MESSAGES.alreadyHeld)
    if (kind === 'release' && !held) throw httpError(409, MESSAGES.notHeld)

    const [row] = await trx('director_actions').insert({
      competition_id: competition.id, entry_id: entryId, kind, day, reason: body.reason, actor_id: user.id,
    }).returning('id')
    await audit(trx, {
      actorUserId: user.id,
      competitionId: competition.id,
      action: `director.${kind}`,
      subjectType: 'entry',
      subjectId: entryId,
      details: { entryId, day, reason: body.reason, actionId: row.id },
    })
    // Read once, as they stand after this action: the tile is made from them, and the e-mail
    // lists the entry's open findings from them.
    const [dossiers, actions] = await together(trx, [
      () => loadCompetitionDossiers(competition.id, { entryIds: [entryId], acceptedOnly: true, day }, trx),
      () => actionsQuery(trx, competition.id, day, [entryId]) as Promise<BoardActionRow[]>,
    ] as const)
    const tiles = await refreshTiles(trx, competition.id, day, changes, { cause: kind, actorId: user.id, entryIds: [entryId], quietHold: true, preloaded: { dossiers, actions } })
    const tile = tiles.get(entryId) ?? null
    const base = siteUrl()
    const mail = readinessMail({
      greeting: `Hello ${entry.entrant_name},`,
      paragraphs: kind === 'hold'
        ? [
            `the contest director holds your glider ${entry.comp_id} on ${day} at ${competition.name}: it may not launch until released.`,
            `The director’s reason: ${body.reason}`,
          ]
        : [
            `the contest director released your glider ${entry.comp_id} on ${day} at ${competition.name}.`,
            `The director’s reason: ${body.reason}`,
            tile && tile.readiness === 'held'
              ? `It is still held by a finding: ${tile.headline?.text ?? 'see your entry'}.`
              : 'It may launch once it is ready on the grid.',
          ],
      findings: openFindingsOf(dossiers, entryId, actions, day),
      competitionId: competition.id,
      base,
      entryUrl: `${base}/competitions/${competition.id}/entries/${entryId}`,
    })
    await enqueueMail(trx, {
      to: entry.entrant_email,
      subject: `${entry.comp_id} ${kind === 'hold' ? 'is held' : 'is released'} on ${day} — ${competition.name}`,
      text: mail.text,
      html: mail.html,
      template: kind === 'hold' ? 'director-hold' : 'director-release',
      competitionId: competition.id,
      entryId,
    })
    const record = await actionQuery(trx).where('a.id', row.id).first() as ActionRowWithActor
    return { action: toDirectorActionRecord(record), tile }
  })
}

/** Waive one open finding of an entry, for the open day or for the whole competition. */
export async function waiveFinding(access: CompetitionAccess, entryId: string, body: WaiverBody): Promise<DirectorActionResult> {
  const { competition, user } = access
  return boardTransaction(async (trx, changes) => {
    await lockBoard(trx, competition.id)
    const open = await openDate(trx, competition.id)
    const day = body.scope === 'day' ? await actionDay(trx, competition.id, body.day) : null
    const entry = await boardEntry(trx, competition.id, entryId)

    // The finding must stand now (on the open day, if any): a waiver names what it lifts.
    const evalDay: IsoDate | undefined = day ?? open ?? undefined
    const loaded = await loadCompetitionDossiers(competition.id, { entryIds: [entryId], day: evalDay }, trx)
    const dossier = loaded?.dossiers[0]
    const findings = loaded?.competition && dossier ? evaluate(dossier, loaded.competition, loaded.field, evalDay) : []
    // Unit and subject narrow the choice when given; the waiver stores those of the finding found.
    const finding = findings.find(f => f.checkId === body.checkId
      && (body.unitId === undefined || f.unitId === body.unitId)
      && (body.subject === undefined || f.subject === body.subject))
    if (!finding) throw httpError(409, MESSAGES.findingNotFound)

    const [row] = await trx('director_actions').insert({
      competition_id: competition.id,
      entry_id: entryId,
      kind: 'waiver',
      day,
      check_id: finding.checkId,
      unit_id: finding.unitId ?? null,
      subject: finding.subject ?? null,
      reason: body.reason,
      finding: JSON.stringify({ severity: finding.severity, reason: finding.reason }),
      actor_id: user.id,
    }).returning('id')
    await audit(trx, {
      actorUserId: user.id,
      competitionId: competition.id,
      action: 'director.waiver',
      subjectType: 'entry',
      subjectId: entryId,
      // The finding's reason may quote the pilot's name (the declaration check): not in the log.
      details: { entryId, day, scope: body.scope, checkId: finding.checkId, unitId: finding.unitId ?? null, subject: finding.subject ?? null, severity: finding.severity, finding: withoutPersonalValues(finding.reason, personalValuesOfDossier(dossier!)), reason: body.reason, actionId: row.id },
    })
    let tile = null
    if (open) {
      const tiles = await refreshTiles(trx, competition.id, open, changes, { cause: 'waiver', actorId: user.id, entryIds: [entryId] })
      tile = tiles.get(entryId) ?? null
    }
    const record = await actionQuery(trx).where('a.id', row.id).first() as ActionRowWithActor
    await enqueueWaiverMail(trx, access, entry, record, 'granted', false)
    return { action: toDirectorActionRecord(record), tile }
  })
}

/**
 * Withdraws a waiver of an entry, with a reason: the waiver row is marked withdrawn (by whom,
 * when, why) and lifts nothing from then on; audited; the open day's tile is made again (the
 * finding may hold the glider again) and pushed; the entrant is e-mailed.
 */
export async function withdrawWaiver(access: CompetitionAccess, entryId: string, actionId: string, body: WaiverWithdrawBody): Promise<DirectorActionResult> {
  const { competition, user } = access
  return boardTransaction(async (trx, changes) => {
    await lockBoard(trx, competition.id)
    const entry = await boardEntry(trx, competition.id, entryId)
    const waiver = await actionQuery(trx).where({ 'a.id': actionId, 'a.competition_id': competition.id, 'a.entry_id': entryId }).forUpdate('a').first() as ActionRowWithActor | undefined
    if (!waiver) throw httpError(404, MESSAGES.waiverNotFound)
    if (waiver.kind !== 'waiver') throw httpError(409, MESSAGES.notAWaiver)
    if (waiver.withdrawn_at) throw httpError(409, MESSAGES.waiverAlreadyWithdrawn(waiver.withdrawn_by_name ?? 'the director', iso(waiver.withdrawn_at).slice(0, 16).replace('T', ' ') + ' UTC'))

    await trx('director_actions').where({ id: actionId }).update({ withdrawn_at: trx.fn.now(), withdrawn_by: user.id, withdrawal_reason: body.reason })
    await audit(trx, {
      actorUserId: user.id,
      competitionId: competition.id,
      action: 'director.waiver-withdrawn',
      subjectType: 'entry',
      subjectId: entryId,
      details: { entryId, actionId, withdrawn: true, day: waiver.day, scope: waiver.day === null ? 'competition' : 'day', checkId: waiver.check_id, unitId: waiver.unit_id, subject: waiver.subject, reason: body.reason },
    })
    const open = await openDate(trx, competition.id)
    let tile = null
    if (open) {
      const tiles = await refreshTiles(trx, competition.id, open, changes, { cause: 'waiver', actorId: user.id, entryIds: [entryId], quietHold: true })
      tile = tiles.get(entryId) ?? null
    }
    const record = await actionQuery(trx).where('a.id', actionId).first() as ActionRowWithActor
    await enqueueWaiverMail(trx, access, entry, record, 'withdrawn', tile?.readiness === 'held')
    return { action: toDirectorActionRecord(record), tile }
  })
}

async function enqueueWaiverMail(
  trx: Knex.Transaction,
  access: CompetitionAccess,
  entry: { id: string, comp_id: string, entrant_email: string, entrant_name: string },
  waiver: ActionRowWithActor,
  event: 'granted' | 'withdrawn',
  heldAgain: boolean,
): Promise<void> {
  const { competition } = access
  const base = siteUrl()
  const checkId = waiver.check_id!
  const mail = waiverMail({
    event,
    entrantName: entry.entrant_name,
    compId: entry.comp_id,
    competitionName: competition.name,
    competitionId: competition.id,
    checkId,
    checkRule: checkById(checkId)?.rule ?? checkId,
    finding: waiver.finding?.reason ?? null,
    scope: waiver.day === null ? 'competition' : 'day',
    day: waiver.day,
    lastContestDay: competition.last_contest_day,
    grantedBy: waiver.actor_name,
    grantReason: waiver.reason,
    withdrawnBy: waiver.withdrawn_by_name ?? undefined,
    withdrawalReason: waiver.withdrawal_reason ?? undefined,
    heldAgain,
    base,
    entryUrl: `${base}/competitions/${competition.id}/entries/${entry.id}`,
  })
  await enqueueMail(trx, {
    to: entry.entrant_email,
    subject: mail.subject,
    text: mail.text,
    html: mail.html,
    template: event === 'granted' ? 'director-waiver' : 'director-waiver-withdrawn',
    competitionId: competition.id,
    entryId: entry.id,
  })
}

/**
 * The waivers of one entry, as its entrant and the staff read them: in force and withdrawn,
 * newest first, each with its check in words, scope, until when, by whom and why.
 */
export async function entryWaivers(access: CompetitionAccess, entryId: string, db: Knex = useDb()): Promise<EntryWaiver[]> {
  const { competition } = access
  const rows = await actionQuery(db)
    .where({ 'a.competition_id': competition.id, 'a.entry_id': entryId, 'a.kind': 'waiver' })
    .orderBy([{ column: 'a.created_at', order: 'desc' }, { column: 'a.id', order: 'desc' }]) as ActionRowWithActor[]
  return rows.map((r) => {
    const checkId = r.check_id!
    return {
      id: r.id,
      scope: r.day === null ? 'competition' : 'day',
      day: r.day as IsoDate | null,
      checkId,
      checkTitle: checkById(checkId)?.rule ?? checkId,
      finding: r.finding,
      reason: r.reason,
      by: r.actor_name,
      at: iso(r.created_at),
      until: (r.day ?? competition.last_contest_day) as IsoDate | null,
      withdrawal: r.withdrawn_at ? { by: r.withdrawn_by_name ?? 'Someone', at: iso(r.withdrawn_at), reason: r.withdrawal_reason ?? '' } : null,
    }
  })
}

/**
 * Each finding with the waiver that lifts it among `actions` (those that count on the day in
 * question, in the order taken: the latest matching waiver wins). A withdrawn waiver lifts
 * nothing; it stays in the list of actions, marked withdrawn.
 */
export function withWaivers(findings: readonly Finding[], actions: readonly DirectorActionRecord[]): BoardFinding[] {
  const waivers = actions.filter(a => a.kind === 'waiver' && !a.withdrawal)
  return findings.map((f) => {
    const w = waivers.findLast(a => a.checkId === f.checkId
      && (a.unitId === null || a.unitId === (f.unitId ?? null))
      && (a.subject === null || a.subject === (f.subject ?? null)))
    return { ...f, waiver: w ? { id: w.id, scope: w.scope!, reason: w.reason, by: w.actor.name, at: w.at } : null }
  })
}

/**
 * Every action of the director on some entries of a competition, on any day, withdrawn
 * waivers included, oldest first: what the glider report lists.
 */
export async function directorActionsOf(competitionId: string, entryIds: readonly string[], db: Knex = useDb()): Promise<(DirectorActionRecord & { entryId: string })[]> {
  if (!entryIds.length) return []
  const rows = await actionQuery(db).where('a.competition_id', competitionId).whereIn('a.entry_id', [...entryIds])
    .orderBy([{ column: 'a.created_at' }, { column: 'a.id' }]) as ActionRowWithActor[]
  return rows.map(r => ({ ...toDirectorActionRecord(r), entryId: r.entry_id }))
}

/**
 * One entry on the board of a day (the open day, else the latest): its tile, every finding
 * the engine gives now with the waiver that lifts it, and the director's actions of the day
 * and of the whole competition.
 */
export async function boardEntryDetail(access: CompetitionAccess, entryId: string, day?: IsoDate, db: Knex = useDb()): Promise<BoardEntryDetail> {
  const { competition } = access
  const entry = await db('entries').where({ id: entryId, competition_id: competition.id }).first('id')
  if (!entry) throw httpError(404, MESSAGES.entryNotFound)
  const shown = await boardDayOf(competition.id, day, db)
  const evalDay = shown?.day
  const [loaded, tile, actionRows] = await Promise.all([
    loadCompetitionDossiers(competition.id, { entryIds: [entryId], day: evalDay }, db),
    evalDay ? boardTileOf(competition.id, evalDay, entryId, db) : Promise.resolve(null),
    (() => {
      const q = actionQuery(db).where({ 'a.competition_id': competition.id, 'a.entry_id': entryId }).orderBy([{ column: 'a.created_at' }, { column: 'a.id' }])
      if (evalDay) q.where(w => w.where('a.day', evalDay).orWhereNull('a.day'))
      return q
    })() as Promise<ActionRowWithActor[]>,
  ])
  const dossier = loaded?.dossiers[0]
  const findings = loaded?.competition && dossier ? blockingFirst(evaluate(dossier, loaded.competition, loaded.field, evalDay)) : []
  const actions = actionRows.map(toDirectorActionRecord)
  return {
    day: shown,
    tile,
    findings: withWaivers(findings, actions),
    actions,
    canDirect: access.roles.includes('director') && shown?.status === 'open',
    changedAfterAcceptanceAt: loaded?.rows[0]?.changed_after_acceptance_at ?? null,
  }
}
