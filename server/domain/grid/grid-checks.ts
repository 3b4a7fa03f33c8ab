// Grid checks: a scrutineer's record of one entry on one contest day, with the weigh-in taken
// with it. Recording is idempotent — a phone that lost signal sends its queued check again
// under the same key and gets the stored one back — and runs in one transaction: the check,
// its weigh-in, the engine's findings including that weigh-in, the readiness, the audit row,
// and on an open day the entry's board tile (pushed to the boards once committed).
// Two scrutineers on one entry both get a row; the later check (by checked_at) counts.
// "The unit shows another version" (`unitsShown`) corrects the collision-warning unit in the
// dossier in the same transaction, through the unit form's audited change, before the checks run.
import { createHash, randomUUID } from 'node:crypto'
import type { Knex } from 'knex'
import { blockingFirst, checkOutcome, evaluate, readiness, takeOffMass, withGridCheck, type DirectorAction, type Finding, type IsoDate, type Readiness } from '#shared/engine'
import type { ChecklistItem } from '#shared/constants/grid'
import { MESSAGES } from '#shared/constants/messages'
import type { GridCheckBody, UnitShown } from '#shared/schemas/grid'
import type { ChecklistAnswer, GridCheckList, GridCheckRecord, GridCheckResult, GridCheckSummary } from '#shared/types/api-grid'
import type { GridCheckRow, WeighInRow } from '#shared/types/rows-grid'
import type { CompetitionRow, UnitRow } from '#shared/types/rows'
import type { User } from '#auth-utils'
import { sortedJson } from '#shared/utils/board-tile'
import { auditRow } from '#domain/audit/audit'
import { dossierChanged } from '#domain/board/dossier-changed'
import { refreshTiles, toTileAction } from '#domain/board/tiles'
import { writeUnitChange } from '#domain/board/unit-changes'
import { boardLockKey, boardTransaction } from '#domain/board/transaction'
import { actionsQuery, type BoardActionRow, type CheckRow, latestGridCheckIds, type TileInputs, tileInputsStatement } from '#domain/read-model/day-inputs'
import { type CompetitionDossiers, type DossierPartRow, dossiersOf, dossierStatement } from '#domain/read-model/dossiers'
import { iso, num } from '#domain/read-model/values'
import { prepared, useDb } from '#server/utils/db'
import { fieldError, httpError } from '#server/utils/errors'
import { markTiming } from '#server/utils/server-timing'
import { gridCheckTimeProblem, gridDayAllowed, todayIn } from '#shared/utils/grid-days'
import { initialsOf } from '#shared/utils/initials'
import { rulesOf } from '#shared/utils/rules'
import { checklistFor } from '#shared/utils/checklist'
import { withUnitsShown } from '#shared/utils/units-shown'

// ---------------------------------------------------------------------------------------
// Pure parts

/** Keys sorted at every level, undefined left out: the same value always gives the same text. */
export const canonicalJson = sortedJson

/**
 * The fingerprint a replay is compared by: the parsed body with its optional parts filled in
 * (a missing note and an empty one are the same check), the time of the check as an instant,
 * the competition and the scrutineer who sent it.
 */
export function gridCheckBodySha256(body: GridCheckBody, competitionId: string, scrutineerId: string): string {
  const normal = {
    competitionId,
    scrutineerId,
    idempotencyKey: body.idempotencyKey.toLowerCase(),
    entryId: body.entryId.toLowerCase(),
    day: body.day,
    checkedAt: new Date(body.checkedAt).toISOString(),
    answers: body.answers.map(a => ({ itemId: a.itemId, result: a.result, note: a.note ?? '' })),
    weighIn: body.weighIn ?? null,
    notes: body.notes ?? '',
    foundBy: body.foundBy ?? null,
  }
  return createHash('sha256').update(canonicalJson(normal)).digest('hex')
}

/** The outcome rule lives in the engine, so the phone shows what the server stores. */
export { checkOutcome }

export type AnswerProblem = { kind: 'unknown', itemId: string } | { kind: 'duplicate', itemId: string }

/**
 * The answers as stored: every item of the checklist in its order, with its label of today;
 * an item not answered is 'not-checked'. A problem when an answer names no item of the
 * checklist, or one item twice.
 */
export function storedAnswers(checklist: readonly ChecklistItem[], answers: GridCheckBody['answers']): { answers: ChecklistAnswer[] } | { problem: AnswerProblem } {
  const known = new Set(checklist.map(i => i.id))
  const given = new Map<string, GridCheckBody['answers'][number]>()
  for (const a of answers) {
    if (!known.has(a.itemId)) return { problem: { kind: 'unknown', itemId: a.itemId } }
    if (given.has(a.itemId)) return { problem: { kind: 'duplicate', itemId: a.itemId } }
    given.set(a.itemId, a)
  }
  return {
    answers: checklist.map((item) => {
      const a = given.get(item.id)
      return { itemId: item.id, label: item.label, result: a?.result ?? 'not-checked', note: a?.note ?? '' }
    }),
  }
}

/** A grid check joined with its entry, scrutineer and weigh-in, as `gridCheckQuery` selects it. */
export interface GridCheckJoinedRow extends Omit<GridCheckRow, 'checked_at' | 'received_at'> {
  checked_at: Date | string
  received_at: Date | string
  comp_id: string
  scrutineer_name: string
  weigh_units: WeighInRow['units'] | null
  weigh_readings: WeighInRow['readings'] | null
  weigh_mass_kg: string | number | null
  weigh_cg_arm_m: string | number | null
}

export function toGridCheckRecord(r: GridCheckJoinedRow): GridCheckRecord {
  return {
    id: r.id,
    competitionId: r.competition_id,
    entryId: r.entry_id,
    compId: r.comp_id,
    day: r.day,
    checkedAt: iso(r.checked_at),
    receivedAt: iso(r.received_at),
    scrutineer: { id: r.scrutineer_id, name: r.scrutineer_name, initials: initialsOf(r.scrutineer_name) },
    answers: r.answers,
    weighIn: r.weigh_units && r.weigh_readings
      ? {
          units: r.weigh_units,
          readings: r.weigh_readings,
          massKg: Number(r.weigh_mass_kg),
          cgArmM: num(r.weigh_cg_arm_m),
        }
      : null,
    notes: r.notes,
    outcome: r.outcome,
    readiness: r.readiness,
    findings: r.findings,
    foundBy: r.found_by,
    idempotencyKey: r.idempotency_key,
  }
}

export function toGridCheckSummary(c: GridCheckRecord): GridCheckSummary {
  return {
    id: c.id,
    checkedAt: c.checkedAt,
    scrutineerName: c.scrutineer.name,
    scrutineerInitials: c.scrutineer.initials,
    outcome: c.outcome,
    readiness: c.readiness,
  }
}

// ---------------------------------------------------------------------------------------
// Reading

function gridCheckQuery(db: Knex) {
  return db('grid_checks as g')
    .join('entries as e', 'e.id', 'g.entry_id')
    .join('users as u', 'u.id', 'g.scrutineer_id')
    .leftJoin('weigh_ins as w', 'w.grid_check_id', 'g.id')
    .select(
      'g.id', 'g.competition_id', 'g.entry_id', 'g.idempotency_key', 'g.body_sha256', 'g.scrutineer_id', 'g.checked_at', 'g.received_at',
      'g.answers', 'g.notes', 'g.outcome', 'g.readiness', 'g.findings', 'g.found_by',
      'g.day',
      'e.comp_id', 'u.name as scrutineer_name',
      'w.units as weigh_units', 'w.readings as weigh_readings', 'w.mass_kg as weigh_mass_kg', 'w.cg_arm_m as weigh_cg_arm_m',
    )
}

const newestFirst = [{ column: 'g.checked_at', order: 'desc' }, { column: 'g.received_at', order: 'desc' }, { column: 'g.id', order: 'desc' }] as const

/** An entry's checks, newest day and newest check first. */
export async function entryGridChecks(competitionId: string, entryId: string, db: Knex = useDb()): Promise<GridCheckList> {
  const rows = await gridCheckQuery(db).where({ 'g.competition_id': competitionId, 'g.entry_id': entryId })
    .orderBy([{ column: 'g.day', order: 'desc' }, ...newestFirst]) as GridCheckJoinedRow[]
  return { gridChecks: rows.map(toGridCheckRecord) }
}

/** Every check of some entries on every day, oldest first (the glider report reads them in order). */
export async function gridChecksOf(competitionId: string, entryIds: readonly string[], db: Knex = useDb()): Promise<GridCheckRecord[]> {
  if (!entryIds.length) return []
  const rows = await gridCheckQuery(db).where('g.competition_id', competitionId).whereIn('g.entry_id', [...entryIds])
    .orderBy([{ column: 'g.day' }, { column: 'g.checked_at' }, { column: 'g.received_at' }, { column: 'g.id' }]) as GridCheckJoinedRow[]
  return rows.map(toGridCheckRecord)
}

/** Every check of one day in a competition, newest first. */
export async function dayGridChecks(competitionId: string, day: IsoDate, db: Knex = useDb()): Promise<GridCheckList> {
  const rows = await gridCheckQuery(db).where({ 'g.competition_id': competitionId, 'g.day': day }).orderBy([...newestFirst]) as GridCheckJoinedRow[]
  return { gridChecks: rows.map(toGridCheckRecord) }
}

/**
 * The latest check of each entry on a day (by checked_at, the phone's time of checking, so a
 * check queued offline and received later does not override a newer one): by entry id.
 */
export async function latestGridChecks(competitionId: string, day: IsoDate, db: Knex = useDb()): Promise<Map<string, GridCheckRecord>> {
  const rows = await gridCheckQuery(db).whereIn('g.id', latestGridCheckIds(db, competitionId, day)) as GridCheckJoinedRow[]
  return new Map(rows.map(r => [r.entry_id, toGridCheckRecord(r)]))
}

async function gridCheckById(db: Knex, id: string): Promise<GridCheckRecord> {
  const row = await gridCheckQuery(db).where('g.id', id).first() as GridCheckJoinedRow
  return toGridCheckRecord(row)
}

// ---------------------------------------------------------------------------------------
// Recording

/** What a grid check reads under the board's lock (`gridCheckInputs`). */
interface GridCheckInputs {
  /** A check stored under the same key. */
  earlier: { id: string, body_sha256: string } | null
  /** The entry's dossier, when it is an entry of this competition. */
  loaded: CompetitionDossiers | undefined
  /** The director's actions on the entry that count on the check's day. */
  actionRows: BoardActionRow[]
  /** Whether the check's day is open on the board. */
  open: boolean
  /** The rest of the entry's tile on that day, before this check (refreshTiles). */
  inputs: TileInputs
}

/**
 * Everything a grid check reads, in one statement (each round trip under the board's lock
 * keeps the other phones waiting): the parts are the statements the findings and the board
 * read them with, side by side.
 */
async function gridCheckInputs(trx: Knex.Transaction, competitionId: string, body: GridCheckBody): Promise<GridCheckInputs> {
  const dossier = dossierStatement(trx, competitionId, { entryIds: [body.entryId], day: body.day })
  const tile = tileInputsStatement(trx, competitionId, body.day, [body.entryId])
  // The dossier's rows, and one row of the grid check's own: [earlier, open, actions, inputs].
  const { rows } = await prepared(trx.raw(`${dossier.sql}
    union all select 'grid-check', 0, json_build_array(
      (select json_build_object('id', x.id, 'body_sha256', x.body_sha256) from grid_checks x where x.idempotency_key = :idempotencyKey),
      exists (select 1 from board_days b where b.competition_id = :competitionId and b.day = :day and b.closed_at is null),
      (select coalesce(json_agg(a order by a.created_at, a.id), '[]') from :actions as a),
      (select row_to_json(t) from (${tile.sql}) as t))`, {
    ...dossier.bindings,
    ...tile.bindings,
    idempotencyKey: body.idempotencyKey,
    actions: actionsQuery(trx, competitionId, body.day, [body.entryId]),
  })) as { rows: DossierPartRow[] }
  const own = rows.find(r => r.part === 'grid-check')!.r as [GridCheckInputs['earlier'], boolean, BoardActionRow[], TileInputs]
  return {
    earlier: own[0],
    loaded: dossiersOf(rows),
    actionRows: own[2],
    open: own[1],
    inputs: own[3],
  }
}

/**
 * The tile's inputs once `check` is stored: with it as the entry's latest check of the day
 * when it is (the later time of checking wins, as `latestGridCheckIds` orders them), the
 * inputs as they were when an earlier-stored check is later. Undefined when both were checked
 * at the same instant: then the order falls to the time received and the id, which only the
 * stored rows tell, so the tile reads them.
 */
export function withCheck(inputs: TileInputs, check: CheckRow): TileInputs | undefined {
  const latest = inputs.checks.find(c => c.entry_id === check.entry_id && c.day === check.day)
  if (!latest) return { ...inputs, checks: [...inputs.checks, check] }
  const was = new Date(latest.checked_at).getTime()
  const now = new Date(check.checked_at).getTime()
  if (now === was) return undefined
  return now > was ? { ...inputs, checks: inputs.checks.map(c => (c === latest ? check : c)) } : inputs
}

/**
 * Corrects the entry's collision-warning units to what their displays showed on the grid
 * (the unit form's audited change, naming the grid check); true when anything changed.
 */
async function correctUnitsShown(trx: Knex.Transaction, entry: { id: string, competition_id: string }, shown: readonly UnitShown[], user: User, context: { gridCheckId: string, day: IsoDate }): Promise<boolean> {
  if (!shown.length) return false
  const rows: UnitRow[] = await trx('units').where({ entry_id: entry.id, kind: 'collision-warning' }).whereIn('id', shown.map(s => s.unitId)).forUpdate()
  if (rows.length !== shown.length) throw fieldError('unitsShown', MESSAGES.gridUnitShownUnknown)
  let any = false
  for (const s of shown) {
    const current = rows.find(r => r.id === s.unitId)!
    const changed = await writeUnitChange(trx, {
      competitionId: entry.competition_id,
      entryId: entry.id,
      current,
      next: { firmware_version: s.firmwareVersion, firmware_expires_on: s.firmwareExpiresOn },
      actorUserId: user.id,
      context: { via: 'grid-check', ...context },
    })
    any ||= changed.length > 0
  }
  return any
}

export async function recordGridCheck(
  competition: CompetitionRow,
  user: User,
  body: GridCheckBody,
  now: Date = new Date(),
): Promise<GridCheckResult> {
  const sha = gridCheckBodySha256(body, competition.id, user.id)
  return boardTransaction(async (trx, changes) => {
    // One sender at a time per key — a second copy of the check waits here, then finds the
    // first — and one writer at a time on the competition's board (transaction.ts), as a new check
    // changes it: both locks in one round trip, the key's first (no other writer takes a key's
    // lock, so the order cannot deadlock; a replay holds the board's lock for a moment).
    // Every round trip from here to the commit keeps the other phones waiting: few statements.
    await trx.raw('select pg_advisory_xact_lock(hashtext(?)), pg_advisory_xact_lock(hashtext(?))', [
      `gridmark:grid-check:${body.idempotencyKey.toLowerCase()}`,
      boardLockKey(competition.id),
    ])
    markTiming('lock')
    // Then, in one statement: a check stored earlier under this key; the entry's dossier (as
    // the board reads an entry of this competition); the director's actions that count today;
    // whether the day is open on the board (opening and closing take the lock we hold); and
    // what the entry's tile is made of besides (its latest check, its tile as it stands).
    const read = await gridCheckInputs(trx, competition.id, body)
    if (read.earlier) {
      if (read.earlier.body_sha256 !== sha) throw httpError(409, MESSAGES.gridReplayConflict)
      return { gridCheck: await gridCheckById(trx, read.earlier.id), replayed: true }
    }
    const { loaded, actionRows, open } = read

    // The entry is judged first: only an entry that is not this competition's is looked up
    // on its own, to tell "no such entry" from "another's".
    const entry = loaded?.rows[0]
    if (!entry) {
      const elsewhere = await trx('entries').where({ id: body.entryId }).first('id')
      throw elsewhere ? httpError(403, MESSAGES.gridEntryOtherCompetition) : httpError(404, MESSAGES.gridEntryNotFound)
    }
    if (entry.status !== 'accepted') throw httpError(409, MESSAGES.gridEntryNotAccepted)
    if (!gridDayAllowed(body.day, todayIn(competition.time_zone, now))) throw fieldError('day', MESSAGES.gridDayOutOfRange)
    // The latest time of checking decides the tile: a phone's wrong clock must not pin it.
    const timeProblem = gridCheckTimeProblem(body.checkedAt, body.day, competition.time_zone, now)
    if (timeProblem) throw fieldError('checkedAt', timeProblem === 'future' ? MESSAGES.gridCheckedAtFuture : MESSAGES.gridCheckedAtOutsideDay(body.day))

    const dossier = loaded?.dossiers[0]
    const classBallast = dossier && loaded?.competition ? loaded.competition.classLimits[dossier.entry.classCode]?.waterBallast : undefined
    const stored = storedAnswers(checklistFor(rulesOf(competition.settings).gridChecklist, classBallast), body.answers)
    if ('problem' in stored) {
      const { kind, itemId } = stored.problem
      throw fieldError('answers', kind === 'unknown' ? MESSAGES.gridUnknownItem(itemId) : MESSAGES.gridDuplicateItem(itemId))
    }
    const outcome = checkOutcome(stored.answers)
    // The take-off mass and CG the checks read: the readings, declared ballast and occupants.
    const weighed = body.weighIn && dossier ? takeOffMass(body.weighIn, dossier.entry) : null

    // The units as their displays showed them, corrected in the dossier first.
    const gridCheckId = randomUUID()
    const unitsCorrected = await correctUnitsShown(trx, { id: entry.id, competition_id: competition.id }, body.unitsShown ?? [], user, { gridCheckId, day: body.day })

    // The engine over the dossier as this check leaves it: the check as the day's latest, its
    // weigh-in as the day's last, the units as shown.
    let findings: Finding[] = []
    if (loaded?.competition && dossier) {
      const checked = withGridCheck(withUnitsShown(dossier, body.unitsShown), { day: body.day, answers: stored.answers, weighIn: body.weighIn })
      findings = blockingFirst(evaluate(checked, loaded.competition, loaded.field, body.day))
    }
    const actions: DirectorAction[] = actionRows.map(toTileAction)
    const ready: Readiness = readiness(findings, { day: body.day, outcome }, actions, body.day)

    // The columns as written (answers and findings as JSON text) and as read back.
    const columns = {
      competition_id: competition.id,
      entry_id: entry.id,
      day: body.day,
      idempotency_key: body.idempotencyKey,
      body_sha256: sha,
      scrutineer_id: user.id,
      checked_at: body.checkedAt,
      notes: body.notes ?? '',
      outcome,
      readiness: ready,
      found_by: body.foundBy ?? null,
    }
    const massKg = weighed ? Math.round(weighed.massKg * 100) / 100 : null
    const cgArmM = weighed && weighed.cgArmM !== null ? Math.round(weighed.cgArmM * 10_000) / 10_000 : null
    // The check, its weigh-in and its audit row in one statement; then the entry's tile on an
    // open day (pushed to the boards after commit).
    const writing = trx.with('g', trx('grid_checks')
      .insert({ ...columns, id: gridCheckId, answers: JSON.stringify(stored.answers), findings: JSON.stringify(findings) })
      .returning(['received_at']))
    if (body.weighIn && weighed) {
      writing.with('w', trx('weigh_ins').insert({
        competition_id: competition.id,
        entry_id: entry.id,
        grid_check_id: gridCheckId,
        weighed_on: body.day,
        units: body.weighIn.units,
        readings: JSON.stringify(body.weighIn.readings),
        mass_kg: massKg,
        cg_arm_m: cgArmM,
        declared_ballast_kg: body.weighIn.declaredBallastKg ?? 0,
        weighed_by: user.id,
      }))
    }
    writing.with('a', trx('audit_log').insert(auditRow({
      actorUserId: user.id,
      competitionId: competition.id,
      action: 'grid-check.recorded',
      subjectType: 'grid_check',
      subjectId: gridCheckId,
      details: {
        entryId: entry.id,
        day: body.day,
        outcome,
        readiness: ready,
        blocking: findings.filter(f => f.severity === 'blocking').map(f => f.checkId),
        massKg,
        idempotencyKey: body.idempotencyKey,
        ...(body.unitsShown?.length ? { unitsShown: body.unitsShown } : {}),
      },
    })))
    const [row] = await prepared(writing.select('received_at').from('g')) as { received_at: Date }[]
    if (open) {
      // The tile reuses the reads above — the board's read of an accepted entry, unchanged
      // since — with this check as the entry's latest when it is (see `withCheck`). A check
      // that brought a weigh-in has the tile read the dossier again, with the weigh-in where
      // the stored order puts it.
      // The dossier read carries the day's latest check before this one: with this check as the
      // latest, its answers (the class's ballast item) count. Corrected units: read again too.
      const check: CheckRow = { entry_id: entry.id, day: body.day, checked_at: body.checkedAt, outcome, answers: stored.answers, scrutineer_name: user.name }
      const inputs = withCheck(read.inputs, check)
      const latest = inputs?.checks.includes(check) ?? false
      const dossiers = body.weighIn || unitsCorrected || !inputs
        ? undefined
        : latest ? { ...loaded!, dossiers: loaded!.dossiers.map(d => (d.entry.id === entry.id ? { ...d, gridCheck: { day: body.day, outcome, answers: stored.answers } } : d)) } : loaded!
      await refreshTiles(trx, competition.id, body.day, changes, {
        cause: 'grid-check',
        actorId: user.id,
        entryIds: [entry.id],
        preloaded: { dossiers, actions: actionRows, inputs },
      })
    }
    else if (unitsCorrected) {
      // A check of an earlier day corrected the dossier: the open day's board learns it too.
      await dossierChanged(trx, competition.id, [entry.id], user.id)
    }
    // The check as stored, from what was written (one statement fewer while the lock is held).
    const gridCheck = toGridCheckRecord({
      ...columns,
      id: gridCheckId,
      received_at: row!.received_at,
      answers: stored.answers,
      findings,
      comp_id: entry.comp_id,
      scrutineer_name: user.name,
      weigh_units: body.weighIn?.units ?? null,
      weigh_readings: body.weighIn?.readings ?? null,
      weigh_mass_kg: massKg,
      weigh_cg_arm_m: cgArmM,
    })
    return { gridCheck, replayed: false }
  })
}
