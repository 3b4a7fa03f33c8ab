// The tiles of a day on the live board: one per accepted entry, made from its dossier, the
// engine's findings, its latest grid check and the director's actions, and kept in
// `board_tiles` by `refreshTiles` inside the transaction of whatever changed it (which holds
// the board's lock: server/domain/board/transaction.ts).
import type { Knex } from 'knex'
import { applyWaivers, blockingFirst, evaluate, type Finding, type IsoDate } from '#shared/engine'
import type { BoardCause, BoardTile } from '#shared/types/api-board'
import { buildTile, diffFindings, sameTile, sortedJson, type TileBody, type TileCheck } from '#shared/utils/board-tile'
import { entryVerdict } from '#shared/utils/entry-verdict'
import { toTileAction } from '#domain/read-model/day-inputs'
import { initialsOf } from '#shared/utils/initials'
import { READINESS_LABELS } from '#shared/constants/readiness'
import { prepared, together } from '#server/utils/db'
import { siteUrl } from '#server/utils/site-url'
import { audit, type AuditEntry } from '#domain/audit/audit'
import { personalValuesOfDossier, withoutPersonalValues } from '#domain/audit/personal-fields'
import { enqueueMail } from '#domain/mail/outbox'
import { readinessMail } from '#domain/mail/templates'
import type { BoardChanges } from '#domain/realtime/changes'
import { loadCompetitionDossiers, type CompetitionDossiers } from '#domain/read-model/dossiers'
import { actionsQuery, tileInputs, type BoardActionRow, type CheckRow, type EntrantRow, type TileInputs } from '#domain/read-model/day-inputs'
import { iso } from '#domain/read-model/values'
import { takeSeq, takeSeqSql } from './transaction'
import { toBoardTile } from './snapshot'

export function toTileCheck(r: CheckRow): TileCheck {
  return {
    day: r.day,
    at: iso(r.checked_at),
    initials: initialsOf(r.scrutineer_name),
    name: r.scrutineer_name,
    outcome: r.outcome,
    failedItems: r.answers.filter(a => a.result === 'fail').map(a => a.label),
  }
}


/**
 * The findings open on one entry on a day: the engine's (blocking first) less those its
 * waivers lift. `loaded` and `actions` as `refreshTiles` takes them preloaded.
 */
export function openFindingsOf(loaded: CompetitionDossiers | undefined, entryId: string, actions: readonly BoardActionRow[], day: IsoDate): Finding[] {
  const i = loaded?.rows.findIndex(r => r.id === entryId) ?? -1
  if (!loaded?.competition || i < 0) return []
  const findings = blockingFirst(evaluate(loaded.dossiers[i]!, loaded.competition, loaded.field, day))
  return applyWaivers(findings, actions.filter(a => a.entry_id === entryId).map(toTileAction), day)
}

function groupBy<T extends { entry_id: string }>(rows: T[]): Map<string, T[]> {
  const out = new Map<string, T[]>()
  for (const r of rows) {
    const list = out.get(r.entry_id)
    if (list) list.push(r)
    else out.set(r.entry_id, [r])
  }
  return out
}

export interface RefreshOptions {
  cause: BoardCause
  /** Who caused the change (null for the system). */
  actorId: string | null
  /** Only these entries (default: every entry of the competition). */
  entryIds?: readonly string[]
  /** Do not e-mail the entrant about a new hold: the caller sends its own message. */
  quietHold?: boolean
  /** Push no tile changes (a day being opened pushes one day change instead). */
  silent?: boolean
  /**
   * What the caller already read under the board's lock for exactly these entries and this
   * day, so one change does not read the same things twice: `loadCompetitionDossiers(…,
   * { entryIds, acceptedOnly: true, day })`, `actionsQuery(…, day, entryIds)` and
   * `tileInputsStatement(…, day, entryIds)`, each as it stands now (a part left out is read
   * here). (The dossiers' own grid check is not read here: the tile's check comes from the
   * inputs' `checks`.)
   */
  preloaded?: { dossiers?: CompetitionDossiers, actions?: BoardActionRow[], inputs?: TileInputs }
}

/**
 * Brings the tiles of one open day up to date with the dossiers, grid checks and director's
 * actions, in the caller's transaction (which holds the board's lock). Each tile that changed
 * takes a sequence number and goes into `changes`; a tile whose findings changed leaves a
 * `findings.changed` row in the audit log; an entry newly held has its entrant e-mailed.
 * Entries no longer accepted leave the board. Returns the tiles as they now stand.
 */
export async function refreshTiles(
  trx: Knex.Transaction,
  competitionId: string,
  day: IsoDate,
  changes: BoardChanges,
  opts: RefreshOptions,
): Promise<Map<string, BoardTile>> {
  const ids = opts.entryIds
  const preloaded = opts.preloaded ?? {}
  const [loaded, actions, { checks, existing, entrants, class_orders: classOrders, seq: lastSeq }] = await together(trx, [
    () => preloaded.dossiers ? Promise.resolve(preloaded.dossiers) : loadCompetitionDossiers(competitionId, { entryIds: ids, acceptedOnly: true, day }, trx),
    () => (preloaded.actions ? Promise.resolve(preloaded.actions) : actionsQuery(trx, competitionId, day, ids)) as Promise<BoardActionRow[]>,
    () => preloaded.inputs ? Promise.resolve(preloaded.inputs) : tileInputs(trx, competitionId, day, ids),
  ] as const)
  const result = new Map<string, BoardTile>()
  if (!loaded) return result

  const checkBy = new Map(checks.map(c => [c.entry_id, toTileCheck(c)]))
  const actionsBy = groupBy(actions)
  const before = new Map(existing.map(r => [r.entry_id, r]))
  const entrantBy = new Map(entrants.map(e => [e.id, e]))
  const firstOpening = existing.length === 0 && !ids

  interface Pending {
    entryId: string, body: TileBody, findings: Finding[], classOrder: number, previous?: (typeof existing)[number]
    /** Names the findings' reasons may quote, kept out of the audit log. */
    personal: string[]
  }
  const pending: Pending[] = []
  loaded.dossiers.forEach((dossier, i) => {
    const row = loaded.rows[i]!
    const findings = loaded.competition ? blockingFirst(evaluate(dossier, loaded.competition, loaded.field, day)) : []
    const body = buildTile({
      entry: { id: row.id, compId: row.comp_id, classId: row.class_id, className: row.class_name, pilotName: row.pilot_name, registration: row.registration, gliderType: row.glider_type },
      findings,
      check: checkBy.get(row.id) ?? null,
      actions: (actionsBy.get(row.id) ?? []).map(toTileAction),
      day,
    })
    const previous = before.get(row.id)
    const classOrder = classOrders[row.class_id] ?? 0
    // A tile is rewritten when it changed, or moved on the board (its class was reordered).
    if (previous && sameTile(previous.tile, body) && sortedJson(previous.findings) === sortedJson(findings) && previous.class_order === classOrder) {
      result.set(row.id, toBoardTile(previous))
      return
    }
    pending.push({ entryId: row.id, body, findings, classOrder, previous, personal: personalValuesOfDossier(dossier) })
  })
  const leaving = existing.filter(r => !loaded.rows.some(x => x.id === r.entry_id))

  const count = pending.length + leaving.length
  if (!count) return result
  // The numbers these changes take: the next ones, as no other writer of this board runs while
  // we hold its lock. The first batch of tiles takes them in its own statement (one round trip
  // fewer while the other writers wait), and the number it took is checked against these.
  let seq = Number(lastSeq) + 1
  const now = new Date()

  const written = pending.map((p): Pending & { tile: BoardTile } => ({ ...p, tile: { ...p.body, seq: seq++, updatedAt: now.toISOString() } }))
  // The tiles in as few statements as there are hundreds of them (a day being opened writes
  // every tile; a grid check one).
  for (let i = 0; i < written.length; i += 500) {
    const rows = written.slice(i, i + 500).map(p => ({
      competition_id: competitionId, day, entry_id: p.entryId, seq: p.tile.seq, readiness: p.tile.readiness,
      tile: JSON.stringify(p.body), findings: JSON.stringify(p.findings), updated_at: now,
      // As the board sends it (boardSnapshotJson joins these), in its place on the board.
      shown: JSON.stringify(p.tile),
      class_order: p.classOrder,
      comp_id: p.body.compId,
    }))
    const upsert = (i === 0 ? trx.with('taken', takeSeqSql(trx, competitionId, count)) : trx.queryBuilder())
      .insert(rows).into('board_tiles').onConflict(['competition_id', 'day', 'entry_id'])
      .merge(['seq', 'readiness', 'tile', 'findings', 'updated_at', 'shown', 'class_order', 'comp_id'])
    if (i > 0) {
      await upsert
      continue
    }
    // One tile (a grid check, a director's action): the same statement each time, prepared.
    const statement = upsert.returning(trx.raw('(select seq from taken) as seq'))
    const [taken] = await (rows.length === 1 ? prepared(statement) : statement) as { seq: string | number }[]
    if (Number(taken!.seq) !== Number(lastSeq) + count) throw new Error(`The board of ${competitionId} was numbered by another writer while locked.`)
  }
  if (!written.length) seq = await takeSeq(trx, competitionId, count)

  const audits: AuditEntry[] = []
  for (const p of written) {
    const tile = p.tile
    result.set(p.entryId, tile)
    if (!opts.silent) changes.tiles.push({ competitionId, day, seq: tile.seq, cause: opts.cause, entryId: p.entryId, tile })

    const entrant = entrantBy.get(p.entryId)
    if (entrant && !opts.silent) {
      changes.entrants.push({
        userId: entrant.entrant_user_id,
        event: { competitionId, entryId: p.entryId, day, readiness: tile.readiness, headline: tile.headline, hold: tile.hold },
      })
    }
    if (p.previous) {
      const diff = withoutPersonalValues(diffFindings(p.previous.findings, p.findings), p.personal)
      if (diff.added.length || diff.removed.length) {
        audits.push({
          actorUserId: opts.actorId,
          competitionId,
          action: 'findings.changed',
          subjectType: 'entry',
          subjectId: p.entryId,
          details: { entryId: p.entryId, day, cause: opts.cause, added: diff.added, removed: diff.removed, readiness: { from: p.previous.readiness, to: tile.readiness } },
        })
      }
    }
    const newlyHeld = tile.readiness === 'held' && p.previous?.readiness !== 'held'
    if (newlyHeld && !firstOpening && !opts.quietHold && entrant) {
      const actions = (actionsBy.get(p.entryId) ?? []).map(toTileAction)
      // Held only by documents waiting for the office's review: nothing for the pilot to do, so
      // no "held" e-mail (the board and the entry page still say "in review").
      const verdict = entryVerdict({ status: 'accepted', findings: p.findings, actions, day, gridCheck: tile.lastCheck ? { day, outcome: tile.lastCheck.outcome } : null })
      if (verdict.actor !== 'office') await enqueueHeldMail(trx, competitionId, entrant, day, tile, applyWaivers(p.findings, actions, day))
    }
  }
  await audit(trx, audits)
  if (leaving.length) {
    await trx('board_tiles').where({ competition_id: competitionId, day }).whereIn('entry_id', leaving.map(r => r.entry_id)).delete()
    for (const r of leaving) {
      if (!opts.silent) changes.tiles.push({ competitionId, day, seq, cause: opts.cause, entryId: r.entry_id, tile: null })
      seq++
    }
  }
  return result
}

// ---------------------------------------------------------------------------------------
// E-mail to the entrant

async function competitionName(trx: Knex, competitionId: string): Promise<string> {
  const c = await trx('competitions').where({ id: competitionId }).first('name')
  return c?.name ?? 'the competition'
}

async function enqueueHeldMail(trx: Knex.Transaction, competitionId: string, entrant: EntrantRow, day: IsoDate, tile: BoardTile, open: readonly Finding[]): Promise<void> {
  const name = await competitionName(trx, competitionId)
  const base = siteUrl()
  const mail = readinessMail({
    greeting: `Hello ${entrant.entrant_name},`,
    paragraphs: [
      `your glider ${entrant.comp_id} is ${READINESS_LABELS.held.toLowerCase()} on ${day} at ${name}: it may not launch until this is put right.`,
      // A finding as the reason is listed below with its rule; a hold or a failed checklist is said here.
      ...(tile.headline && (tile.headline.kind !== 'finding' || !open.length) ? [`Why: ${tile.headline.text}`] : []),
    ],
    findings: open,
    competitionId,
    base,
    entryUrl: `${base}/competitions/${competitionId}/entries/${entrant.id}`,
  })
  await enqueueMail(trx, {
    to: entrant.entrant_email,
    subject: `${entrant.comp_id} is held on ${day} — ${name}`,
    text: mail.text,
    html: mail.html,
    template: 'board-held',
    competitionId,
    entryId: entrant.id,
  })
}

/** The director's action as a tile reads it (`server/domain/read-model/day-inputs.ts`). */
export { toTileAction }
