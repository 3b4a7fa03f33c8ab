// Every migration, imported statically so the bundled server and vitest can run them
// without scanning a directory. Add a new migration here in name order.
import type { Knex } from 'knex'
import * as m20261201000100 from './20261201000100_users'
import * as m20261201000200 from './20261201000200_competitions'
import * as m20261201000300 from './20261201000300_memberships'
import * as m20261201000400 from './20261201000400_audit_log'
import * as m20261201000500 from './20261201000500_rate_limits'

type Migration = Knex.Migration

const migrations: Record<string, Migration> = {
  '20261201000100_users': m20261201000100,
  '20261201000200_competitions': m20261201000200,
  '20261201000300_memberships': m20261201000300,
  '20261201000400_audit_log': m20261201000400,
  '20261201000500_rate_limits': m20261201000500,
}

export const migrationSource: Knex.MigrationSource<string> = {
  getMigrations: async () => Object.keys(migrations).sort(),
  getMigrationName: (name) => name,
  getMigration: async (name) => {
    const migration = migrations[name]
    if (!migration) throw new Error(`Unknown migration ${name}`)
    return migration
  },
}
