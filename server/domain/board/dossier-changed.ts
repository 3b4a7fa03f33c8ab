// Keeping the open day's board in step with the dossiers. Every domain function that changes
// what the checks read — an entry, its units, documents, IGC files or payments, a class, the
// rules, the firmware catalogue — ends its transaction with one call, `dossierChanged`: the
// tiles concerned are brought up to date in that same transaction (under the board's lock)
// and pushed to the screens once it commits. So a change made by a route, a background job, a
// script or a payment notification reaches the board the same way, exactly when it is
// committed. Grid checks, the director's actions and opening a day change the board
// themselves (refreshTiles) and do not call this.
import type { Knex } from 'knex'
import { FIELD_CHECK_IDS, fieldNeighbours, type IsoDate } from '#shared/engine'
import { useDb } from '#server/utils/db'
import { toField, type FindingsFieldEntry, type FindingsFieldRadioId } from '#domain/read-model/dossiers'
import { boardChangesOf, boardTransaction, lockBoard, openDate } from './transaction'
import { refreshTiles, type RefreshOptions } from './tiles'

/**
 * An entry's own dossier changed by its entrant or the office (its fields, units, documents or
 * IGC files): an accepted entry is marked "changed since acceptance" for the office and the desk.
 * Call it before `dossierChanged`, in the same transaction.
 */
export async function noteChangeAfterAcceptance(trx: Knex.Transaction, entryIds: readonly string[]): Promise<void> {
  await trx('entries').whereIn('id', entryIds).where('status', 'accepted').update({ changed_after_acceptance_at: trx.fn.now() })
}

/** Some entries of the competition, or all of them (a class, the rules or the catalogue changed). */
export type ChangedEntries = readonly string[] | 'all'

/**
 * The board's part of a dossier change, inside the transaction that made it (call it last, as
 * it takes the board's lock until commit). With an open day, the tiles of the changed entries
 * are brought up to date, and with them those of the entries whose field checks (a shared
 * competition ID or radio ID) read the changed ones, before or after the change.
 */
export async function dossierChanged(trx: Knex.Transaction, competitionId: string, entries: ChangedEntries, actorId: string | null): Promise<void> {
  await lockBoard(trx, competitionId)
  if (entries === 'all') {
    const day = await openDate(trx, competitionId)
    if (day) await refreshTiles(trx, competitionId, day, boardChangesOf(trx), { cause: 'dossier', actorId })
    return
  }
  if (!entries.length) return
  // The open day, the field as it stands now, and the tiles whose field checks found something
  // (entries that shared a key with a changed one before the change), in one round trip.
  const { rows: [row] } = await trx.raw(`select b.day,
      (select coalesce(json_agg(json_build_array(e.id, e.comp_id, e.status)), '[]')
        from entries e where e.competition_id = :competitionId) as field_entries,
      (select coalesce(json_agg(json_build_array(u.entry_id, u.radio_id)), '[]')
        from units u where u.competition_id = :competitionId and u.kind = 'collision-warning' and u.radio_id is not null) as field_radio_ids,
      (select coalesce(json_agg(t.entry_id), '[]') from board_tiles t
        where t.competition_id = :competitionId and t.day = b.day
          and exists (select 1 from json_array_elements(t.findings) f where f->>'checkId' = any(:fieldChecks))) as contested
    from board_days b where b.competition_id = :competitionId and b.closed_at is null`, {
    competitionId,
    fieldChecks: [...FIELD_CHECK_IDS],
  }) as { rows: { day: IsoDate, field_entries: FindingsFieldEntry[], field_radio_ids: FindingsFieldRadioId[], contested: string[] }[] }
  if (!row) return
  const field = toField(row.field_entries, row.field_radio_ids)
  const entryIds = [...new Set([...entries, ...fieldNeighbours(field, entries), ...row.contested])]
  await refreshTiles(trx, competitionId, row.day, boardChangesOf(trx), { cause: 'dossier', actorId, entryIds })
}

/** Brings the open day's tiles up to date (no open day: nothing to do). Takes the board's lock. */
export async function refreshOpenDay(competitionId: string, opts: RefreshOptions): Promise<void> {
  await boardTransaction(async (trx, changes) => {
    await lockBoard(trx, competitionId)
    const day = await openDate(trx, competitionId)
    if (day) await refreshTiles(trx, competitionId, day, changes, opts)
  })
}

/** Every open day of every competition, rebuilt from the dossiers (at start: tiles are derived data). */
export async function refreshAllOpenDays(): Promise<number> {
  const open = await useDb()('board_days').whereNull('closed_at').select('competition_id')
  for (const { competition_id } of open) await refreshOpenDay(competition_id, { cause: 'dossier', actorId: null })
  return open.length
}
