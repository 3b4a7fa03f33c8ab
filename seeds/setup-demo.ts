// The demo competition's set-up and firmware catalogue (invented unit families and versions).
import type { Knex } from 'knex'
import { DEFAULT_RULES } from '../shared/schemas/competition'

export const DEMO_FIRMWARE = [
  { unit_family: 'Collision-warning unit, panel', version: '7.24', expires_on: '2028-03-01' },
  { unit_family: 'Collision-warning unit, panel', version: '7.22', expires_on: '2027-07-15' },
  { unit_family: 'Collision-warning unit, portable', version: '3.10', expires_on: '2028-02-01' },
  { unit_family: 'Collision-warning unit, portable', version: '3.08', expires_on: '2027-09-01' },
]

export async function seedSetupDemo(trx: Knex, competitionId: string, days: { first: string, last: string }): Promise<void> {
  await trx('competitions').where({ id: competitionId }).update({
    registration_opens_on: '2027-02-01',
    registration_closes_on: '2027-06-30',
    late_fee_after: '2027-06-01',
    late_fee_minor: 5000,
    settings: DEFAULT_RULES,
  })
  const contest: string[] = []
  for (let t = Date.parse(`${days.first}T00:00:00Z`); t <= Date.parse(`${days.last}T00:00:00Z`); t += 86_400_000) {
    contest.push(new Date(t).toISOString().slice(0, 10))
  }
  const practice = [1, 2].map(n => new Date(Date.parse(`${days.first}T00:00:00Z`) - n * 86_400_000).toISOString().slice(0, 10))
  await trx('competition_days').insert([
    ...practice.map(day => ({ competition_id: competitionId, day, kind: 'practice' })),
    ...contest.map(day => ({ competition_id: competitionId, day, kind: 'contest' })),
  ])
  await trx('firmware_releases').insert(DEMO_FIRMWARE.map(r => ({ ...r, competition_id: competitionId })))
}
