// Writing the live board: every writer of one competition's board (a grid check, a director's
// action, a dossier change, a day opened or closed) runs in one transaction that takes the
// board's lock first (`lockBoard`), then reads the dossiers — two writers can never compute a
// tile from data the other is about to change. Every change takes the next number of the
// competition's sequence (`board_sequences`) and is pushed to the screens once its transaction
// has committed, so a screen that missed one sees the gap in the numbers and fetches the board.
import type { Knex } from 'knex'
import type { IsoDate } from '#shared/engine'
import type { BoardSeq } from '#shared/types/api-board'
import { useDb } from '#server/utils/db'
import { markTiming } from '#server/utils/server-timing'
import { BoardChanges } from '#domain/realtime/changes'
import { publishBoardChanges } from '#domain/realtime/realtime'

// ---------------------------------------------------------------------------------------
// Changes pushed after commit

const collected = new WeakMap<Knex.Transaction, BoardChanges>()

/** The outermost transaction of a savepoint (it is the one that commits). */
function outermost(trx: Knex.Transaction): Knex.Transaction {
  let t = trx as Knex.Transaction & { parentTransaction?: Knex.Transaction }
  while (t.parentTransaction) t = t.parentTransaction as typeof t
  return t
}

/**
 * The board changes of a transaction, pushed to the screens once (and only if) it commits: a
 * screen never shows what the database does not hold. Every writer of the board adds to these.
 */
export function boardChangesOf(trx: Knex.Transaction): BoardChanges {
  const root = outermost(trx)
  let changes = collected.get(root)
  if (!changes) {
    const mine = new BoardChanges()
    changes = mine
    collected.set(root, mine)
    root.executionPromise.then(() => {
      markTiming('commit')
      if (!mine.empty) publishBoardChanges(mine)
    }, () => { /* rolled back: nothing happened */ })
  }
  return changes
}

/** Runs `work` in one transaction with the board changes it collects (pushed after commit). */
export async function boardTransaction<T>(work: (trx: Knex.Transaction, changes: BoardChanges) => Promise<T>, db: Knex = useDb()): Promise<T> {
  return db.transaction(async (trx) => {
    const result = await work(trx, boardChangesOf(trx))
    markTiming('write')
    return result
  })
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
export function takeSeqSql(db: Knex, competitionId: string, count: number) {
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

/** The board's last sequence number and its open day, which screens compare with their own. */
export async function boardSeq(competitionId: string, db: Knex = useDb()): Promise<BoardSeq> {
  const [seq, openDay] = await Promise.all([currentSeq(competitionId, db), openDate(db, competitionId)])
  return { seq, openDay }
}

/** The date of the competition's open day, or null (one light query, for writers). */
export async function openDate(db: Knex, competitionId: string): Promise<IsoDate | null> {
  const row = await db('board_days').where({ competition_id: competitionId }).whereNull('closed_at').first('day')
  return row?.day ?? null
}
