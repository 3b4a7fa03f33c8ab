// vitest globalSetup for the e2e and browser layers. `npm test` (scripts/test.ts) starts the
// local service fakes and ONE built server before vitest and passes them in
// GRIDMARK_TEST_BASE_URL / GRIDMARK_TEST_SERVICE_ENV, so both layers talk to the same app:
// two servers on one database would each run a mail worker and take each other's mail.
// Each project loads this file on its own; it only hands the shared server on.
import type { TestProject } from 'vitest/node'

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
    /** The variables the fakes gave the app (e.g. where captured mail can be read). */
    serviceEnv: Record<string, string>
  }
}

export default function setup(project: TestProject) {
  const baseUrl = process.env.GRIDMARK_TEST_BASE_URL
  if (!baseUrl) throw new Error('GRIDMARK_TEST_BASE_URL is not set: run the tests through `npm test`, which starts the server.')
  project.provide('baseUrl', baseUrl)
  project.provide('serviceEnv', JSON.parse(process.env.GRIDMARK_TEST_SERVICE_ENV ?? '{}') as Record<string, string>)
}
