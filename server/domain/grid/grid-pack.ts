// The day's grid pack: everything a scrutineer's phone needs to check the accepted gliders
// without signal — their engine dossiers (with weigh-ins and the day's latest check), the
// field for the uniqueness checks, the competition as the engine reads it, the checklist,
// each entry's current tag (short code and token hash, read from the tags table) and the
// day's last check, and the director's actions of the day (so the phone's readiness counts
// holds and waivers as the board does). One read of the competition's dossiers, a few queries in all.
import type { Knex } from 'knex'
import type { DirectorAction, IsoDate } from '#shared/engine'
import type { GridPack, GridPackEntry } from '#shared/types/api-grid'
import { toTileAction } from '#domain/board/tiles'
import { actionsQuery, type BoardActionRow } from '#domain/read-model/day-inputs'
import { loadCompetitionDossiers } from '#domain/read-model/dossiers'
import { useDb } from '#server/utils/db'
import { todayIn } from '#shared/utils/grid-days'
import { rulesOf } from '#shared/utils/rules'
import { latestGridChecks, toGridCheckSummary } from './grid-checks'

/** Current (not revoked) tags of a competition's entries, by entry id. */
async function currentTags(competitionId: string, db: Knex): Promise<Map<string, { shortCode: string, tokenHash: string }>> {
  const rows = await db('tags').where({ competition_id: competitionId }).whereNull('revoked_at')
    .select('entry_id', 'short_code', 'token_hash') as { entry_id: string, short_code: string, token_hash: string }[]
  return new Map(rows.map(r => [r.entry_id, { shortCode: r.short_code, tokenHash: r.token_hash }]))
}

/** Undefined when there is no such competition. The day defaults to today in its time zone. */
export async function gridPack(competitionId: string, day: IsoDate | undefined, now: Date = new Date(), db: Knex = useDb()): Promise<GridPack | undefined> {
  const zone = await db('competitions').where({ id: competitionId }).first('time_zone')
  if (!zone) return undefined
  const theDay = day ?? todayIn(zone.time_zone, now)
  const [loaded, tags, latest, actions] = await Promise.all([
    loadCompetitionDossiers(competitionId, { acceptedOnly: true, day: theDay }, db),
    currentTags(competitionId, db),
    latestGridChecks(competitionId, theDay, db),
    actionsQuery(db, competitionId, theDay) as Promise<BoardActionRow[]>,
  ])
  if (!loaded) return undefined
  const actionsBy = new Map<string, DirectorAction[]>()
  for (const a of actions) {
    const { by: _by, at: _at, ...action } = toTileAction(a)
    actionsBy.set(a.entry_id, [...(actionsBy.get(a.entry_id) ?? []), action])
  }
  const entries: GridPackEntry[] = loaded.dossiers.map((dossier, i) => {
    const id = dossier.entry.id
    const last = latest.get(id)
    return {
      dossier,
      classId: loaded.rows[i]!.class_id,
      tag: tags.get(id) ?? null,
      lastCheck: last ? toGridCheckSummary(last) : null,
      directorActions: actionsBy.get(id) ?? [],
    }
  })
  return {
    competitionId,
    competitionName: loaded.competitionRow.name,
    timeZone: loaded.competitionRow.time_zone,
    day: theDay,
    generatedAt: now.toISOString(),
    competition: loaded.competition,
    field: loaded.field,
    checklist: rulesOf(loaded.competitionRow.settings).gridChecklist,
    entries,
  }
}
