// `npm run migrate`: applies pending migrations to the demo database (or DATABASE_URL).
import { runMain, step } from './lib/common'
import { migrate } from './lib/db'
import { prepareDemoDatabase } from './lib/demo-db'

runMain(async () => {
  const url = await prepareDemoDatabase()
  const applied = await migrate(url)
  step(applied.length > 0 ? `Applied ${applied.length} migration(s): ${applied.join(', ')}` : 'The schema is up to date')
})
