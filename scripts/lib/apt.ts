// Installing missing system packages with Debian's apt, for machines where we are root
// (fresh containers, CI). Output is captured and shown only when something fails.
import { mustRun, step } from './common'

let updated = false

export async function aptInstall(packages: string[], why: string): Promise<void> {
  step(`${why}: installing ${packages.join(', ')} with apt-get`)
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }
  // One index refresh per run is enough even when several installs happen.
  if (!updated) {
    await mustRun('apt-get update', 'apt-get', ['update'], { env })
    updated = true
  }
  await mustRun(`apt-get install ${packages.join(' ')}`, 'apt-get', ['install', '-y', '--no-install-recommends', ...packages], { env })
}
