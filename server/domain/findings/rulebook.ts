// The competition's rulebook: every check of the engine's catalogue, grouped by family, with
// the settings of this competition that change it (its rules, its classes' limits, the size of
// its firmware catalogue). The grouping and wording are shared/utils/rulebook.ts; this reads
// what they need.
import type { Knex } from 'knex'
import { CATALOGUE } from '#shared/engine'
import type { Rulebook } from '#shared/types/api-rulebook'
import type { CompetitionRow } from '#shared/types/rows'
import { buildRulebook } from '#shared/utils/rulebook'
import { rulesOf } from '#shared/utils/rules'
import { useDb } from '#server/utils/db'
import { num } from '#domain/read-model/values'

export async function competitionRulebook(competition: CompetitionRow, db: Knex = useDb()): Promise<Rulebook> {
  const [classes, releases] = await Promise.all([
    db('classes').where({ competition_id: competition.id }).orderBy(['sort_order', 'name'])
      .select('name', 'max_span_m', 'max_mtom_kg', 'water_ballast') as Promise<{ name: string, max_span_m: string | null, max_mtom_kg: string | null, water_ballast: boolean }[]>,
    db('firmware_releases').where({ competition_id: competition.id }).count<{ count: string }[]>({ count: '*' }),
  ])
  const families = buildRulebook(CATALOGUE, {
    rules: rulesOf(competition.settings),
    classes: classes.map(c => ({ name: c.name, maxSpanM: num(c.max_span_m), maxMtomKg: num(c.max_mtom_kg), waterBallast: c.water_ballast })),
    firmwareReleaseCount: Number(releases[0]?.count ?? 0),
  })
  return { competitionId: competition.id, families }
}
