// Contest days as the director runs them: open a day (every accepted entry gets its tile,
// `unchecked` until its grid check, standing findings carried over), close it at the end. One
// day is open at a time; a closed day keeps its tiles as the record of how it ended, and can
// be opened again if it was closed by mistake.
import type { Knex } from 'knex'
import type { IsoDate } from '#shared/engine'
import type { DayOpenBody } from '#shared/schemas/board'
import type { BoardDay, DayList } from '#shared/types/api-board'
import type { CompetitionRow } from '#shared/types/rows'
import { MESSAGES } from '#shared/constants/messages'
import { audit } from '#domain/audit/audit'
import type { CompetitionAccess } from '#server/utils/authz'
import { useDb } from '#server/utils/db'
import { fieldError, httpError } from '#server/utils/errors'
import { gridDayAllowed, todayIn } from '#shared/utils/grid-days'
import { type BoardDayJoinedRow, dayQuery, toBoardDay } from './snapshot'
import { refreshTiles } from './tiles'
import { boardTransaction, lockBoard, openDate, takeSeq } from './transaction'

async function dayRow(trx: Knex, competitionId: string, day: IsoDate): Promise<BoardDay | null> {
  const row = await dayQuery(trx, competitionId).where('d.day', day).first() as BoardDayJoinedRow | undefined
  return row ? toBoardDay(row) : null
}

/**
 * Opens `body.day` (today in the competition's time zone when not given). Opening the day that
 * is already open answers it again (created false); another open day is a 409.
 */
export async function openDay(access: CompetitionAccess, body: DayOpenBody, now: Date = new Date()): Promise<{ day: BoardDay, created: boolean }> {
  const { competition, user } = access
  const today = todayIn(competition.time_zone, now)
  const day = body.day ?? today
  if (!gridDayAllowed(day, today)) throw fieldError('day', MESSAGES.dayOutOfRange)

  return boardTransaction(async (trx, changes) => {
    await lockBoard(trx, competition.id)
    const open = await openDate(trx, competition.id)
    if (open === day) return { day: (await dayRow(trx, competition.id, day))!, created: false }
    if (open) throw httpError(409, MESSAGES.dayAlreadyOpen(open))

    const scheduled = await trx('competition_days').where({ competition_id: competition.id, day }).first('kind')
    const kind = scheduled?.kind ?? body.kind
    if (!kind) throw fieldError('kind', MESSAGES.dayKindNeeded(day))

    const earlier = await trx('board_days').where({ competition_id: competition.id, day }).first('day')
    if (earlier) {
      await trx('board_days').where({ competition_id: competition.id, day }).update({ closed_at: null, closed_by: null })
    }
    else {
      await trx('board_days').insert({ competition_id: competition.id, day, kind, opened_by: user.id })
    }
    const tiles = await refreshTiles(trx, competition.id, day, changes, { cause: 'day', actorId: user.id, silent: true })
    await audit(trx, {
      actorUserId: user.id,
      competitionId: competition.id,
      action: earlier ? 'day.reopened' : 'day.opened',
      subjectType: 'board_day',
      subjectId: day,
      details: { day, kind, entries: tiles.size },
    })
    const opened = (await dayRow(trx, competition.id, day))!
    changes.days.push({ competitionId: competition.id, seq: await takeSeq(trx, competition.id), day: opened })
    return { day: opened, created: true }
  })
}

/** Closes an open day: its tiles stay as they ended. */
export async function closeDay(access: CompetitionAccess, day: IsoDate): Promise<BoardDay> {
  const { competition, user } = access
  return boardTransaction(async (trx, changes) => {
    await lockBoard(trx, competition.id)
    const row = await trx('board_days').where({ competition_id: competition.id, day }).first('closed_at')
    if (!row) throw httpError(404, MESSAGES.dayNotFound)
    if (row.closed_at) throw httpError(409, MESSAGES.dayAlreadyClosed(day))
    await trx('board_days').where({ competition_id: competition.id, day }).update({ closed_at: trx.fn.now(), closed_by: user.id })
    const counts = await trx('board_tiles').where({ competition_id: competition.id, day }).groupBy('readiness').select('readiness').count<{ readiness: string, count: string }[]>('* as count')
    await audit(trx, {
      actorUserId: user.id,
      competitionId: competition.id,
      action: 'day.closed',
      subjectType: 'board_day',
      subjectId: day,
      details: { day, readiness: Object.fromEntries(counts.map(c => [c.readiness, Number(c.count)])) },
    })
    const closed = (await dayRow(trx, competition.id, day))!
    changes.days.push({ competitionId: competition.id, seq: await takeSeq(trx, competition.id), day: closed })
    return closed
  })
}

/** The competition's scheduled days, the days opened so far (newest first) and today. */
export async function dayList(competition: CompetitionRow, now: Date = new Date(), db: Knex = useDb()): Promise<DayList> {
  const [scheduled, days] = await Promise.all([
    db('competition_days').where({ competition_id: competition.id }).orderBy('day').select('kind', 'day'),
    dayQuery(db, competition.id).orderBy('d.day', 'desc') as Promise<BoardDayJoinedRow[]>,
  ])
  const boardDays = days.map(toBoardDay)
  return {
    today: todayIn(competition.time_zone, now),
    timeZone: competition.time_zone,
    scheduled: scheduled.map((d: { day: string, kind: 'practice' | 'contest' }) => ({ day: d.day, kind: d.kind })),
    days: boardDays,
    openDay: boardDays.find(d => d.status === 'open')?.day ?? null,
  }
}
