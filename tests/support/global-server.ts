// vitest globalSetup for the e2e and browser layers: the local service fakes `npm start`
// also runs (scripts/lib/services.ts), then one built server for the whole run, wired to them.
import type { TestProject } from 'vitest/node'
import { startServices } from '../../scripts/lib/services'
import { startServer } from './server'

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
    /** The variables the fakes gave the app (e.g. where captured mail can be read). */
    serviceEnv: Record<string, string>
  }
}

export default async function setup(project: TestProject) {
  const services = await startServices()
  try {
    const server = await startServer(services.env)
    project.provide('baseUrl', server.url)
    project.provide('serviceEnv', services.env)
    return async () => {
      await server.stop()
      await services.stopAll()
    }
  }
  catch (error) {
    await services.stopAll()
    throw error
  }
}
