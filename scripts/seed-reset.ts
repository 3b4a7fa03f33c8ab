// `npm run seed:reset`: wipes the demo database (or DATABASE_URL) and seeds the demo data
// again. Useful after trying things out; the app can keep running meanwhile.
import { runMain, step } from './lib/common'
import { migrate, seed } from './lib/db'
import { prepareDemoDatabase } from './lib/demo-db'
import { printSignIns } from './lib/sign-ins'
import { filesKey, sessionPassword } from './lib/secrets'

runMain(async () => {
  const url = await prepareDemoDatabase()
  const applied = await migrate(url)
  if (applied.length > 0) step(`Applied ${applied.length} migration(s): ${applied.join(', ')}`)
  await seed(url, true, sessionPassword(), filesKey())
  step('Wiped the database and seeded the demo data again')
  printSignIns()
})
