// The live board's state: one tile per accepted entry for each opened day, kept in
// `board_tiles` and changed only inside the transaction of what changed it — a grid check, a
// director's action, a dossier edit, a day being opened. Every change of a competition's
// board takes the next number of its sequence (`board_sequences`) and is pushed to the
// screens once its transaction has committed (see `boardTransaction`), so a screen that
// missed one sees the gap in the numbers and fetches the board again.
//
// Writers of one competition's board take its lock first (`lockBoard`), then read the
// dossiers: two writers can never compute a tile from data the other is about to change.
import type { Knex } from 'knex'
import { blockingFirst, evaluate, type Finding, type IsoDate } from '#shared/engine'
import type { BoardCause, BoardDay, BoardSnapshot, BoardTile, BoardTileEvent, BoardDayEvent, EntryDayReadiness, EntryReadinessEvent } from '#shared/types/api-board'
import type { BoardDayRow, BoardTileRow } from '#shared/types/rows-board'
import { buildTile, diffFindings, sameTile, sortedJson, type TileAction, type TileBody, type TileCheck } from '#shared/utils/board-tile'
import type { GridCheckAnswerJson } from '#shared/types/rows-grid'
import { READINESS_LABELS } from '#shared/constants/readiness'
import { compareCompIds } from '#shared/utils/comp-id-order'
import type { CompetitionDossiers } from './findings'
import type { AuditEntry } from './audit'

// ---------------------------------------------------------------------------------------
// Changes to push once the transaction commits

interface EntrantNotice {
  userId: string
  event: EntryReadinessEvent
}

/** What one transaction changed on the boards; pushed by `boardTransaction` after commit. */
export class BoardChanges {
  readonly tiles: BoardTileEvent[] = []
  readonly days: BoardDayEvent[] = []
  readonly entrants: EntrantNotice[] = []
  get empty() {
    return !this.tiles.length && !this.days.length && !this.entrants.length
  }
}

/**
 * Runs `work` in one transaction and pushes the board changes it collected once (and only
 * if) it committed: a screen never shows what the database does not hold.
 */
export async function boardTransaction<T>(work: (trx: Knex.Transaction, changes: BoardChanges) => Promise<T>, db: Knex = useDb()): Promise<T> {
  const changes = new BoardChanges()
  const result = await db.transaction(trx => work(trx, changes))
  if (!changes.empty) publishBoardChanges(changes)
  return result
}

// ---------------------------------------------------------------------------------------
// Locks and sequence numbers

/** The advisory lock that serialises the writers of one competition's board. */
export function boardLockKey(competitionId: string): string {
  return `gridmark:board:${competitionId}`
}

/** Serialises the writers of one competition's board until the transaction ends. */
export async function lockBoard(trx: Knex.Transaction, competitionId: string): Promise<void> {
  await trx.raw('select pg_advisory_xact_lock(hashtext(?))', [boardLockKey(competitionId)])
}

/** The statement that takes `count` numbers of the competition's sequence, returning the last (`seq`). */
function takeSeqSql(db: Knex, competitionId: string, count: number) {
  return db.raw(
    `insert into board_sequences (competition_id, seq) values (?, ?)
     on conflict (competition_id) do update set seq = board_sequences.seq + excluded.seq
     returning seq`,
    [competitionId, count],
  )
}

/** Takes `count` numbers of the competition's sequence; returns the first. */
export async function takeSeq(trx: Knex.Transaction, competitionId: string, count = 1): Promise<number> {
  const { rows } = await takeSeqSql(trx, competitionId, count)
  return Number(rows[0].seq) - count + 1
}

export async function currentSeq(competitionId: string, db: Knex = useDb()): Promise<number> {
  const row = await db('board_sequences').where({ competition_id: competitionId }).first('seq')
  return row ? Number(row.seq) : 0
}

// ---------------------------------------------------------------------------------------
// Days

const dayColumns = (db: Knex) => [
  'd.competition_id', 'd.kind', 'd.opened_at', 'd.closed_at', 'd.opened_by', 'd.closed_by',
  db.raw(`to_char(d.day, 'YYYY-MM-DD') as day`),
  'o.name as opened_by_name', 'c.name as closed_by_name',
]

export type BoardDayJoinedRow = BoardDayRow & { opened_by_name: string, closed_by_name: string | null }

export function dayQuery(db: Knex, competitionId: string) {
  return db('board_days as d')
    .join('users as o', 'o.id', 'd.opened_by')
    .leftJoin('users as c', 'c.id', 'd.closed_by')
    .where('d.competition_id', competitionId)
    .select(dayColumns(db))
}

/** A timestamp as the driver reads a column (Date), or as JSON text when read inside a JSON value. */
type Instant = Date | string

export function toBoardDay(r: Omit<BoardDayJoinedRow, 'opened_at' | 'closed_at'> & { opened_at: Instant, closed_at: Instant | null }): BoardDay {
  return {
    day: r.day,
    kind: r.kind,
    status: r.closed_at ? 'closed' : 'open',
    openedAt: new Date(r.opened_at).toISOString(),
    openedBy: r.opened_by_name,
    closedAt: r.closed_at ? new Date(r.closed_at).toISOString() : null,
    closedBy: r.closed_by_name,
  }
}

/** The date of the competition's open day, or null (one light query, for writers). */
export async function openDate(db: Knex, competitionId: string): Promise<IsoDate | null> {
  const row = await db('board_days').where({ competition_id: competitionId }).whereNull('closed_at').first(db.raw(`to_char(day, 'YYYY-MM-DD') as day`))
  return row?.day ?? null
}

/** The day the board shows: the one asked for, else the open day, else the latest opened. */
export async function boardDayOf(competitionId: string, day: IsoDate | undefined, db: Knex = useDb()): Promise<BoardDay | null> {
  const q = dayQuery(db, competitionId)
  if (day) q.where('d.day', day)
  else q.orderByRaw('d.closed_at is null desc, d.day desc')
  const row = await q.first() as BoardDayJoinedRow | undefined
  return row ? toBoardDay(row) : null
}

// ---------------------------------------------------------------------------------------
// Tiles

export interface CheckRow {
  entry_id: string
  day: string
  checked_at: Instant
  outcome: 'pass' | 'fail'
  answers: GridCheckAnswerJson[]
  scrutineer_name: string
}

export interface BoardActionRow {
  id: string
  entry_id: string
  kind: 'hold' | 'release' | 'waiver'
  day: string | null
  check_id: string | null
  unit_id: string | null
  subject: string | null
  reason: string
  actor_name: string
  /** A Date as the driver reads the column; its text when read inside a JSON value. */
  created_at: Instant
}

interface EntrantRow {
  id: string
  comp_id: string
  entrant_user_id: string
  entrant_email: string
  entrant_name: string
}

export function toTileCheck(r: CheckRow): TileCheck {
  return {
    day: r.day,
    at: new Date(r.checked_at).toISOString(),
    initials: initialsOf(r.scrutineer_name),
    name: r.scrutineer_name,
    outcome: r.outcome,
    failedItems: r.answers.filter(a => a.result === 'fail').map(a => a.label),
  }
}

export function toTileAction(r: BoardActionRow): TileAction {
  const common = { by: r.actor_name, at: new Date(r.created_at).toISOString(), reason: r.reason }
  if (r.kind === 'waiver') {
    return {
      kind: 'waiver',
      day: r.day,
      checkId: r.check_id!,
      ...(r.unit_id !== null ? { unitId: r.unit_id } : {}),
      ...(r.subject !== null ? { subject: r.subject } : {}),
      ...common,
    }
  }
  return { kind: r.kind, day: r.day!, ...common }
}

/** The director's actions that count on `day` (that day's, and waivers for the whole competition), in the order taken. */
export function actionsQuery(db: Knex, competitionId: string, day: IsoDate, entryIds?: readonly string[]) {
  const q = db('director_actions as a').join('users as u', 'u.id', 'a.actor_id')
    .where('a.competition_id', competitionId)
    .where(w => w.where('a.day', day).orWhereNull('a.day'))
    .orderBy([{ column: 'a.created_at' }, { column: 'a.id' }])
    .select('a.id', 'a.entry_id', 'a.kind', 'a.check_id', 'a.unit_id', 'a.subject', 'a.reason', 'a.created_at', 'u.name as actor_name',
      db.raw(`to_char(a.day, 'YYYY-MM-DD') as day`))
  if (entryIds) q.whereIn('a.entry_id', [...entryIds])
  return q
}

type ExistingTileRow = Pick<BoardTileRow, 'entry_id' | 'readiness' | 'tile' | 'findings' | 'class_order'> & { seq: string | number, updated_at: Instant }

/** What refreshTiles reads besides the dossiers and the director's actions (see `tileInputsStatement`). */
export interface TileInputs {
  checks: CheckRow[]
  existing: ExistingTileRow[]
  entrants: EntrantRow[]
  class_orders: Record<string, number>
  /** The competition's last sequence number (0 before the first). */
  seq: string | number
}

/**
 * What refreshTiles reads besides the dossiers and the director's actions, as one statement
 * whose one row is `TileInputs`, with its named bindings: each entry's latest grid check of the
 * day (with its scrutineer's name), its tile as it stands, and its entrant — of every entry,
 * or of `entryIds` — the order of the classes and the competition's last sequence number.
 */
export function tileInputsStatement(db: Knex, competitionId: string, day: IsoDate, entryIds?: readonly string[]): { sql: string, bindings: Record<string, unknown> } {
  const only = (column: string) => (entryIds ? `and ${column} = any(:ids::uuid[])` : '')
  const sql = `select
      (select coalesce(json_agg(json_build_object('entry_id', g.entry_id, 'checked_at', g.checked_at, 'outcome', g.outcome,
          'answers', g.answers, 'scrutineer_name', u.name, 'day', to_char(g.day, 'YYYY-MM-DD'))), '[]')
        from grid_checks g join users u on u.id = g.scrutineer_id
        where g.id in (:latestChecks) ${only('g.entry_id')}) as checks,
      (select coalesce(json_agg(json_build_object('entry_id', t.entry_id, 'seq', t.seq, 'readiness', t.readiness,
          'tile', t.tile, 'findings', t.findings, 'updated_at', t.updated_at, 'class_order', t.class_order)), '[]')
        from board_tiles t where t.competition_id = :competitionId and t.day = :day ${only('t.entry_id')}) as existing,
      (select coalesce(json_agg(json_build_object('id', e.id, 'comp_id', e.comp_id, 'entrant_user_id', e.entrant_user_id,
          'entrant_email', u.email, 'entrant_name', u.name)), '[]')
        from entries e join users u on u.id = e.entrant_user_id
        where e.competition_id = :competitionId ${only('e.id')}) as entrants,
      (select coalesce(json_object_agg(k.id, k.sort_order), '{}') from classes k where k.competition_id = :competitionId) as class_orders,
      coalesce((select seq from board_sequences where competition_id = :competitionId), 0) as seq`
  return {
    sql,
    bindings: {
      competitionId,
      day,
      latestChecks: latestGridCheckIds(db, competitionId, day),
      ...(entryIds ? { ids: [...entryIds] } : {}),
    },
  }
}

async function tileInputs(db: Knex, competitionId: string, day: IsoDate, entryIds?: readonly string[]): Promise<TileInputs> {
  const { sql, bindings } = tileInputsStatement(db, competitionId, day, entryIds)
  const { rows: [row] } = await db.raw(sql, bindings) as { rows: TileInputs[] }
  return row!
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

  interface Pending { entryId: string, body: TileBody, findings: Finding[], classOrder: number, previous?: (typeof existing)[number] }
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
    pending.push({ entryId: row.id, body, findings, classOrder, previous })
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
    const [taken] = await upsert.returning(trx.raw('(select seq from taken) as seq')) as { seq: string | number }[]
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
      const diff = diffFindings(p.previous.findings, p.findings)
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
      await enqueueHeldMail(trx, competitionId, entrant, day, tile)
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

/** Brings the open day's tiles up to date (no open day: nothing to do). Takes the board's lock. */
export async function refreshOpenDay(competitionId: string, opts: RefreshOptions): Promise<void> {
  await boardTransaction(async (trx, changes) => {
    await lockBoard(trx, competitionId)
    const day = await openDate(trx, competitionId)
    if (day) await refreshTiles(trx, competitionId, day, changes, opts)
  })
}

// ---------------------------------------------------------------------------------------
// Reading the board

export function toBoardTile(r: Pick<BoardTileRow, 'tile'> & { seq: string | number, updated_at: Instant }): BoardTile {
  return { ...r.tile, seq: Number(r.seq), updatedAt: new Date(r.updated_at).toISOString() }
}

/**
 * The board of one day at one sequence number, as the JSON text of a `BoardSnapshot`: what a
 * wall screen polls, so it is read in one statement and hardly touched on the way out. The
 * statement's parts share one snapshot, so the number and the tiles agree (a pushed change
 * numbered above it is news to the screen). Each tile is the text stored with it as the board
 * sends it (board_tiles.shown: the tile with `seq` and `updatedAt`, as `toBoardTile` makes it),
 * in board order (each tile's class order and competition ID are kept beside it); nothing
 * here parses a tile or serialises it again. The tiles come as rows beside one head row (day,
 * number, classes): a 1,000-tile board as one aggregated value is a single 400 KB message,
 * which the driver reassembles at twice the cost of 1,000 small rows.
 * The day is the one asked for, else the open day, else the latest opened (as `boardDayOf`).
 */
export async function boardSnapshotJson(competition: { id: string, name: string, time_zone: string }, day?: IsoDate, db: Knex = useDb()): Promise<string> {
  const { rows } = await db.raw(`with shown as (
      select d.competition_id, d.kind, d.opened_at, d.closed_at, d.opened_by, d.closed_by, d.day as day_date,
        to_char(d.day, 'YYYY-MM-DD') as day, o.name as opened_by_name, c.name as closed_by_name
      from board_days d join users o on o.id = d.opened_by left join users c on c.id = d.closed_by
      where d.competition_id = :competitionId ${day ? 'and d.day = :day' : ''}
      order by d.closed_at is null desc, d.day desc
      limit 1
    )
    select 0 as part,
      (select json_build_object('competition_id', s.competition_id, 'kind', s.kind, 'opened_at', s.opened_at, 'closed_at', s.closed_at,
          'opened_by', s.opened_by, 'closed_by', s.closed_by, 'day', s.day, 'opened_by_name', s.opened_by_name, 'closed_by_name', s.closed_by_name)
        from shown s) as shown,
      coalesce((select seq from board_sequences where competition_id = :competitionId), 0) as seq,
      (select coalesce(json_agg(json_build_object('id', k.id, 'name', k.name) order by k.sort_order, k.name), '[]')
        from classes k where k.competition_id = :competitionId) as classes,
      null::text as tile, null::int as class_order, null::text as comp_id
    union all
    select 1, null, null, null, t.shown::text, t.class_order, t.comp_id
      from shown s join board_tiles t on t.competition_id = s.competition_id and t.day = s.day_date`, day ? { competitionId: competition.id, day } : { competitionId: competition.id }) as {
    rows: {
      part: number
      // Timestamps inside JSON values arrive as text; toBoardDay reads them as instants.
      shown: (Omit<BoardDayJoinedRow, 'opened_at' | 'closed_at'> & { opened_at: string, closed_at: string | null }) | null
      seq: string | null
      classes: { id: string, name: string }[] | null
      tile: string | null
      class_order: number | null
      comp_id: string | null
    }[]
  }
  const top = rows.find(r => r.part === 0)
  const head: Omit<BoardSnapshot, 'tiles' | 'generatedAt'> = {
    competition: { id: competition.id, name: competition.name, timeZone: competition.time_zone },
    day: top!.shown ? toBoardDay(top!.shown) : null,
    seq: Number(top!.seq),
    classes: top!.classes ?? [],
  }
  // In board order: here rather than in PostgreSQL, whose sort of 1,000 rows carrying their
  // tiles' text costs several times this one over the keys (the same order: comp-id-order.ts).
  const placed = rows.filter(r => r.part === 1)
  placed.sort((a, b) => a.class_order! - b.class_order! || compareCompIds(a.comp_id!, b.comp_id!))
  const tiles = placed.map(r => r.tile!)
  // The keys in BoardSnapshot's order, with the tiles' text as it came.
  return `${JSON.stringify(head).slice(0, -1)},"tiles":[${tiles.join(',')}],"generatedAt":${JSON.stringify(new Date().toISOString())}}`
}

/** The board of one day at one sequence number (see boardSnapshotJson), as an object. */
export async function boardSnapshot(competition: { id: string, name: string, time_zone: string }, day?: IsoDate, db: Knex = useDb()): Promise<BoardSnapshot> {
  return JSON.parse(await boardSnapshotJson(competition, day, db)) as BoardSnapshot
}

/** One entry's tile on a day, if it has one. */
export async function boardTileOf(competitionId: string, day: IsoDate, entryId: string, db: Knex = useDb()): Promise<BoardTile | null> {
  const row = await db('board_tiles').where({ competition_id: competitionId, day, entry_id: entryId }).first('seq', 'tile', 'updated_at')
  return row ? toBoardTile(row) : null
}

/** One entry on the open day's board, as its entrant may see it. */
export async function entryDayReadiness(competitionId: string, entryId: string, db: Knex = useDb()): Promise<EntryDayReadiness> {
  const row = await dayQuery(db, competitionId).whereNull('d.closed_at').first() as BoardDayJoinedRow | undefined
  const day = row ? toBoardDay(row) : null
  const tile = day ? await boardTileOf(competitionId, day.day, entryId, db) : null
  return { day, readiness: tile?.readiness ?? null, headline: tile?.headline ?? null, hold: tile?.hold ?? null, lastCheck: tile?.lastCheck ?? null }
}

// ---------------------------------------------------------------------------------------
// E-mail to the entrant

async function competitionName(trx: Knex, competitionId: string): Promise<string> {
  const c = await trx('competitions').where({ id: competitionId }).first('name')
  return c?.name ?? 'the competition'
}

async function enqueueHeldMail(trx: Knex.Transaction, competitionId: string, entrant: EntrantRow, day: IsoDate, tile: BoardTile): Promise<void> {
  const name = await competitionName(trx, competitionId)
  const mail = renderMail({
    greeting: `Hello ${entrant.entrant_name},`,
    paragraphs: [
      `your glider ${entrant.comp_id} is ${READINESS_LABELS.held.toLowerCase()} on ${day} at ${name}: it may not launch until this is put right.`,
      tile.headline ? `Why: ${tile.headline.text}` : 'Why: a blocking finding on the grid.',
      'Talk to the scrutineers on the grid or the contest director. Where the fix touches hardware (firmware, antennas, ballast), follow the manufacturer’s instructions and the competition’s rules.',
    ],
    action: { label: 'Open your entry', url: `${publicBaseUrl()}/competitions/${competitionId}/entries/${entrant.id}` },
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
