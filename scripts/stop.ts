// `npm run stop`: stops the demo database cluster recorded by the last `npm start`.
// (The app itself stops with Ctrl-C in the terminal running `npm start`.)
import { existsSync } from 'node:fs'
import { runMain, step } from './lib/common'
import { readClusterRecord } from './lib/demo-db'
import { isClusterRunning, stopCluster } from './lib/postgres'

runMain(async () => {
  const cluster = readClusterRecord()
  if (!cluster) {
    step('No demo database recorded (.data/cluster.json is missing): nothing to stop')
    return
  }
  if (!existsSync(cluster.dataDir)) {
    step(`The recorded demo database folder ${cluster.dataDir} no longer exists: nothing to stop`)
    return
  }
  if (!(await isClusterRunning(cluster))) {
    step(`The demo database (${cluster.dataDir}) is not running`)
    return
  }
  await stopCluster(cluster)
  step(`Stopped the demo database on port ${cluster.port} (its data stays in ${cluster.dataDir})`)
})
