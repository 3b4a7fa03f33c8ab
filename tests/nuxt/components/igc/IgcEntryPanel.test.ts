import { describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { setResponseStatus } from 'h3'
import IgcEntryPanel from '~/components/igc/IgcEntryPanel.vue'

const C = 'c-igc'
const base = (entry: string) => `/api/competitions/${C}/entries/${entry}/igc-files`
const recorders = [{ id: 'u1', model: 'Test Recorder TR-1', serial: 'A-0001' }, { id: 'u2', model: 'Test Recorder TR-2', serial: 'B-0002' }]
const igcFile = {
  id: 'f1', entryId: 'e1', unitId: 'u1', originalFilename: 'flight.igc', sizeBytes: 900, sha256: 'x',
  flightDate: '2026-11-20', pilot: 'Marit Dovecote', copilot: null, gliderType: 'Kestrel Trainer 15', gliderId: 'D-KMOR',
  competitionId: 'KM1', competitionClass: 'Standard', recorderType: 'TR-1', firmwareVersion: '2.4.1', recorderId: 'XTRKM1', extensions: ['FXA'], hasGRecord: true,
  parseErrors: [], uploadedAt: '2026-11-21T08:00:00.000Z', uploadedByName: 'P', superseded: false, replacedBy: null,
}

describe('IgcEntryPanel', () => {
  it('shows one slot per recorder with the parsed declaration and the G record as yes/no', async () => {
    registerEndpoint(base('e1'), () => ({ current: [igcFile], history: [] }))
    const panel = await mountSuspended(IgcEntryPanel, { props: { competitionId: C, entryId: 'e1', canUpload: false, recorders } })
    const first = panel.get('[data-slot="u1"]')
    expect(first.text()).toContain('Test Recorder TR-1 · serial A-0001')
    expect(first.text()).toContain('Marit Dovecote')
    expect(first.text()).toContain('D-KMOR')
    expect(first.text()).toContain('KM1')
    expect(first.get('[data-g-record]').text()).toContain('Yes')
    expect(first.get('a').attributes('href')).toBe(`${base('e1')}/f1/file`)
    expect(panel.get('[data-slot="u2"]').text()).toContain('No IGC file yet.')
    expect(panel.find('form').exists()).toBe(false)
  })

  it('asks for a file before sending, and shows the server’s “not an IGC file” sentence', async () => {
    registerEndpoint(base('e2'), { method: 'GET', handler: () => ({ current: [], history: [] }) })
    registerEndpoint(base('e2'), {
      method: 'POST',
      handler: (event) => {
        setResponseStatus(event, 400)
        return { statusCode: 400, message: 'This is not an IGC file: Missing A record (line 1).' }
      },
    })
    const panel = await mountSuspended(IgcEntryPanel, { props: { competitionId: C, entryId: 'e2', canUpload: true, recorders: [recorders[0]!] } })
    const form = panel.get('[data-slot="u1"] form')
    await form.trigger('submit')
    await flushPromises()
    expect(panel.get('[data-slot="u1"]').text()).toContain('Choose a file to upload.')

    const input = form.get('input[type="file"]')
    Object.defineProperty(input.element, 'files', { value: [new File(['shopping list'], 'list.igc')], configurable: true })
    await form.trigger('submit')
    await vi.waitFor(() => expect(panel.get('[data-slot="u1"] .field-error').text()).toContain('This is not an IGC file: Missing A record (line 1).'))
    expect(input.attributes('aria-invalid')).toBe('true')
  })
})
