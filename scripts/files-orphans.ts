// `npm run files:orphans [-- --remove]`: lists the stored files no row points at (left by a
// crash between placing a file and committing its row) and the uploads' temporary files; with
// --remove it removes those older than an hour, so an upload under way is never touched. Same
// database and storage settings as the server.
import { findOrphans, incomingFolder } from '../server/domain/files/orphans'
import { runMain, ScriptError, step } from './lib/common'
import { withFileMaintenance } from './lib/file-maintenance'

const files = (n: number) => `${n} file${n === 1 ? '' : 's'}`

runMain(async () => {
  const args = process.argv.slice(2)
  const unknown = args.filter(a => a !== '--remove')
  if (unknown.length) throw new ScriptError(`Unknown argument ${unknown.join(' ')}. Usage: npm run files:orphans [-- --remove]`)
  const remove = args.includes('--remove')
  await withFileMaintenance(async ({ db, store }) => {
    const report = await findOrphans(db, store, { remove })
    const removed = new Set(report.removed)
    const age = (at: Date | null) => (at ? `written ${at.toISOString()}` : 'age unknown: never removed here')
    for (const o of report.orphans) console.log(`  ${removed.has(o.key) ? 'removed' : 'found  '} ${o.key} (${age(o.modifiedAt)})`)
    for (const f of report.incoming) console.log(`  ${removed.has(f.path) ? 'removed' : 'found  '} ${f.path} (${age(f.modifiedAt)})`)
    const removedOrphans = report.orphans.filter(o => removed.has(o.key)).length
    const removedIncoming = report.incoming.filter(f => removed.has(f.path)).length
    step(`${files(report.orphans.length)} without a row found, ${removedOrphans} removed`)
    step(`${files(report.incoming.length)} left in ${incomingFolder()} found, ${removedIncoming} removed`)
    if (!remove && report.orphans.length + report.incoming.length > 0) step('Run with --remove to remove those older than an hour.')
  }, { keys: false })
})
