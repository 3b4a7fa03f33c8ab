// Local stand-ins for outside services that `npm start` runs next to the app, on loopback
// only — e.g. an SMTP capture instead of a mail relay, a fake payment API instead of the
// real one. The list is empty for now; a feature that needs such a fake adds an entry here.
//
// Each service is started before the app, in list order; the variables it returns are merged
// into the app's environment (e.g. SMTP_URL pointing at the capture). They are stopped in
// reverse order when the app stops. A service that fails to start stops the ones before it.
import { reportError, step } from './common'
import { mailCapture } from './mail-capture'

export interface RunningService {
  /** Variables for the app's environment, e.g. { SMTP_URL: 'smtp://127.0.0.1:2525' }. */
  env: Record<string, string>
  /** Optional lines for the start banner, e.g. where to read captured mail. */
  notes?: string[]
  stop(): Promise<void>
}

export interface ServiceOptions {
  /** `npm test`: any free port instead of the fixed ones of `npm start`, and fast timings. */
  forTests?: boolean
}

export interface LocalService {
  name: string
  /** Resolves once the service accepts connections. */
  start(options?: ServiceOptions): Promise<RunningService>
}

export const services: LocalService[] = [
  mailCapture,
]

export interface StartedServices {
  env: Record<string, string>
  notes: string[]
  stopAll(): Promise<void>
}

export async function startServices(list: LocalService[] = services, options: ServiceOptions = {}): Promise<StartedServices> {
  const running: { name: string, service: RunningService }[] = []

  const stopAll = async (): Promise<void> => {
    for (const { name, service } of running.splice(0).reverse()) {
      try {
        await service.stop()
      }
      catch (error) {
        // Keep stopping the others; the failure is still shown.
        console.error(`Could not stop ${name}:`)
        reportError(error)
      }
    }
  }

  for (const entry of list) {
    step(`Starting ${entry.name}`)
    try {
      running.push({ name: entry.name, service: await entry.start(options) })
    }
    catch (error) {
      await stopAll()
      throw error
    }
  }

  return {
    env: Object.assign({}, ...running.map(r => r.service.env)) as Record<string, string>,
    notes: running.flatMap(r => r.service.notes ?? []),
    stopAll,
  }
}
