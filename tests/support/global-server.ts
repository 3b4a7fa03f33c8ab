// vitest globalSetup for the e2e and browser layers: one built server for the whole run.
import type { TestProject } from 'vitest/node'
import { startServer } from './server'

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
  }
}

export default async function setup(project: TestProject) {
  const server = await startServer()
  project.provide('baseUrl', server.url)
  return async () => {
    await server.stop()
  }
}
