import { afterEach, describe, expect, it } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { setResponseStatus } from 'h3'
import { flushPromises } from '@vue/test-utils'
import EntryForm from '~/components/entry/EntryForm.vue'
import type { EntryView } from '#shared/types/api-entries'

const cleanups: (() => void)[] = []
afterEach(() => {
  while (cleanups.length) cleanups.pop()!()
})

const classes = [
  { id: '11111111-1111-4111-8111-111111111111', name: 'Standard', code: 'standard', maxSpanM: 15, maxMtomKg: 525, waterBallast: true },
  { id: '22222222-2222-4222-8222-222222222222', name: 'Club', code: 'club', maxSpanM: null, maxMtomKg: null, waterBallast: false },
]

const initial: EntryView = {
  id: '33333333-3333-4333-8333-333333333333', competitionId: 'c', classId: classes[0]!.id, entrantUserId: 'u', entrantName: 'Erin',
  status: 'draft', decisionReason: null, pilotName: 'Erin Entrant', pilotNationality: 'GB', pilotLicenceNumber: 'L-1',
  pilotPhone: '+44 1', emergencyContact: 'Pat', copilotName: 'Cleo', crewNames: ['Ray'], gliderType: 'Kestrel 15',
  registration: 'G-KTST', compId: 'KT', spanM: 15, mtomKg: 525, emptyMassKg: 255, cgForwardLimitM: null, cgAftLimitM: null,
  datumDescription: 'Root leading edge', motorGlider: 'none', changedAfterAcceptanceAt: null, pilotMassKg: null, copilotMassKg: null, pilotArmM: null, copilotArmM: null, ballastArmM: null,
  paymentStatus: 'unpaid', submittedAt: null, decidedAt: null, withdrawnAt: null, updatedAt: '',
}

describe('EntryForm', () => {
  it('starts a new entry with the signed-in pilot’s name and marks what saving and submitting need', async () => {
    const session = useSessionStore()
    session.user = { id: 'u1', email: 'rosa@example.org', name: 'Rosa Pilot', isAdmin: false, emailVerified: true }
    const form = await mountSuspended(EntryForm, { props: { mode: 'create', classes, submitLabel: 'Save', busyLabel: '…', action: async () => {} } })
    cleanups.push(() => {
      form.unmount()
      session.user = null
    })
    expect((form.get('#entry-new-pilotName').element as HTMLInputElement).value).toBe('Rosa Pilot')
    expect(form.get('[data-testid="entry-signed-in-as"]').text()).toContain('rosa@example.org')
    const mark = (f: string) => form.find(`label[for="entry-new-${f}"] [data-mark]`).attributes('data-mark')
    expect(['classId', 'pilotName', 'gliderType', 'registration', 'compId'].map(mark)).toEqual(Array(5).fill('required'))
    expect(['pilotNationality', 'pilotLicenceNumber', 'pilotPhone', 'emergencyContact', 'spanM', 'mtomKg', 'emptyMassKg'].map(mark)).toEqual(Array(7).fill('submit'))
    expect(form.find('label[for="entry-new-copilotName"] [data-mark]').exists()).toBe(false)
  })

  it('keeps the stored pilot name when changing an entry', async () => {
    const session = useSessionStore()
    session.user = { id: 'u1', email: 'rosa@example.org', name: 'Rosa Pilot', isAdmin: false, emailVerified: true }
    const form = await mountSuspended(EntryForm, { props: { mode: 'edit', classes, initial, submitLabel: 'Save', busyLabel: '…', action: async () => {} } })
    cleanups.push(() => {
      form.unmount()
      session.user = null
    })
    expect((form.get('#entry-edit-pilotName').element as HTMLInputElement).value).toBe('Erin Entrant')
    expect(form.find('[data-testid="entry-signed-in-as"]').exists()).toBe(false)
  })

  it('shows the chosen class’s limits beside the class select', async () => {
    const form = await mountSuspended(EntryForm, { props: { mode: 'create', classes, submitLabel: 'Save', busyLabel: '…', action: async () => {} } })
    cleanups.push(() => form.unmount())
    await form.get('#entry-new-classId').setValue(classes[0]!.id)
    expect(form.get('[data-testid="class-limits"]').text()).toBe('Span limit: 15 m · MTOM limit: 525 kg · water ballast allowed')
    await form.get('#entry-new-classId').setValue(classes[1]!.id)
    expect(form.get('[data-testid="class-limits"]').text()).toBe('Span limit: none · MTOM limit: none · water ballast not allowed')
  })

  it('puts the API’s competition ID clash (409) on the competition ID field', async () => {
    cleanups.push(registerEndpoint('/api/test/entries', {
      method: 'POST',
      handler: (event) => {
        setResponseStatus(event, 409)
        return { statusCode: 409, message: 'Competition ID KT is already taken by Otto Other (G-OTTO).', data: { field: 'compId' } }
      },
    }))
    const form = await mountSuspended(EntryForm, {
      props: { mode: 'edit', classes, initial, submitLabel: 'Save', busyLabel: '…', action: async (body: unknown) => { await $fetch('/api/test/entries', { method: 'POST', body: body as Record<string, unknown> }) } },
    })
    cleanups.push(() => form.unmount())
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(form.get('#entry-edit-compId').attributes('aria-invalid')).toBe('true')
    expect(form.get('#entry-edit-compId-error').text()).toContain('Competition ID KT is already taken by Otto Other (G-OTTO).')
  })

  it('in edit mode sends emptied optional fields as null, so they are cleared, and parses a decimal comma', async () => {
    let sent: Record<string, unknown> | undefined
    const form = await mountSuspended(EntryForm, {
      props: { mode: 'edit', classes, initial, submitLabel: 'Save', busyLabel: '…', action: async (body: unknown) => { sent = body as Record<string, unknown> } },
    })
    cleanups.push(() => form.unmount())
    await form.get('#entry-edit-copilotName').setValue('')
    await form.get('#entry-edit-datumDescription').setValue('  ')
    await form.get('#entry-edit-emptyMassKg').setValue('262,5')
    await form.get('#entry-edit-crewNames').setValue('Ray\n\n  Rita  ')
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(sent).toMatchObject({ copilotName: null, datumDescription: null, emptyMassKg: 262.5, crewNames: ['Ray', 'Rita'], compId: 'KT', cgForwardLimitM: null })
  })

  it('sends a new entry only with the privacy notice confirmed, and links to the competition’s notice', async () => {
    const session = useSessionStore()
    session.user = { id: 'u1', email: 'rosa@example.org', name: 'Rosa Pilot', isAdmin: false, emailVerified: true }
    let sent: Record<string, unknown> | undefined
    const form = await mountSuspended(EntryForm, {
      props: { mode: 'create', competitionId: 'c-42', classes: [classes[0]!], submitLabel: 'Save', busyLabel: '…', action: async (body: unknown) => { sent = body as Record<string, unknown> } },
    })
    cleanups.push(() => {
      form.unmount()
      session.user = null
    })
    expect(form.get('[data-testid="entry-privacy-link"]').attributes('href')).toBe('/competitions/c-42/privacy')
    await form.get('#entry-new-gliderType').setValue('Kestrel 15')
    await form.get('#entry-new-registration').setValue('G-KTST')
    await form.get('#entry-new-compId').setValue('kt')
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(sent).toBeUndefined()
    expect(form.get('#entry-new-privacyNoticeAccepted-error').text()).toContain('tick the box to confirm it')
    expect(form.get('#entry-new-privacyNoticeAccepted').attributes('aria-invalid')).toBe('true')

    await form.get('#entry-new-privacyNoticeAccepted').setValue(true)
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(sent).toMatchObject({ privacyNoticeAccepted: true, compId: 'KT', pilotName: 'Rosa Pilot' })
  })

  it('has no privacy box when changing an entry, and sends no confirmation', async () => {
    let sent: Record<string, unknown> | undefined
    const form = await mountSuspended(EntryForm, {
      props: { mode: 'edit', classes, initial, submitLabel: 'Save', busyLabel: '…', action: async (body: unknown) => { sent = body as Record<string, unknown> } },
    })
    cleanups.push(() => form.unmount())
    expect(form.find('[data-testid="entry-privacy"]').exists()).toBe(false)
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(sent).toBeDefined()
    expect(sent).not.toHaveProperty('privacyNoticeAccepted')
  })

  it('refuses a required field left empty before sending anything', async () => {
    let called = false
    const form = await mountSuspended(EntryForm, {
      props: { mode: 'create', classes, submitLabel: 'Save', busyLabel: '…', action: async () => { called = true } },
    })
    cleanups.push(() => form.unmount())
    await form.get('form').trigger('submit')
    await flushPromises()
    expect(called).toBe(false)
    expect(form.get('#entry-new-pilotName-error').text()).toContain('Enter the pilot’s name.')
    expect(form.get('#entry-new-classId-error').text()).toContain('Choose a class.')
  })
})
