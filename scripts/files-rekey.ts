// `npm run files:rekey`: seals every stored file that is not under NUXT_FILES_KEY again under
// it, one at a time, and says how many are left. Run it after a new key went to NUXT_FILES_KEY
// and the old one to NUXT_FILES_OLD_KEYS (same database and storage settings as the server);
// stopped at any point, every file stays readable and a new run goes on where it stopped.
// Exits non-zero while files are left (e.g. a row whose file is missing).
import { filesLeftUnderOlderKeys, rekeyFiles } from '../server/domain/files/rekey'
import { runMain, ScriptError, step } from './lib/common'
import { withFileMaintenance } from './lib/file-maintenance'

const leftLine = (n: number) => `${n} file${n === 1 ? '' : 's'} left under older keys`

runMain(() => withFileMaintenance(async ({ db, store, keyring: ring }) => {
  const keyring = ring!
  const current = keyring.current!.id
  const before = await filesLeftUnderOlderKeys(db, current)
  step(before === 0 ? 'Every file is under the current key' : `${before} file${before === 1 ? '' : 's'} to move to key ${current}`)
  const result = await rekeyFiles(db, store, keyring, (p) => {
    const what = p.from === undefined ? 'missing from storage, skipped' : `${p.from ?? 'plain'} → ${current}`
    console.log(`  [${p.done}/${p.total}] ${p.table} ${p.id}: ${what}`)
  })
  if (before > 0) step(`Moved ${result.moved} file${result.moved === 1 ? '' : 's'}`)
  console.log(leftLine(result.left))
  if (result.missing.length > 0) {
    throw new ScriptError(`${result.missing.length} row${result.missing.length === 1 ? ' points' : 's point'} at a file that is not in storage: `
      + `${result.missing.join(', ')}. Restore ${result.missing.length === 1 ? 'it' : 'them'} from a backup and run this again.`)
  }
  if (result.left > 0) throw new ScriptError(`${leftLine(result.left)}: files were added under an older key meanwhile? Run this again.`)
}))
