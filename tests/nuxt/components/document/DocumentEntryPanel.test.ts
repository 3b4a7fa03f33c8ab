import { describe, expect, it, vi } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { setResponseStatus } from 'h3'
import DocumentEntryPanel from '~/components/document/DocumentEntryPanel.vue'

const C = 'c-doc'
const base = (entry: string) => `/api/competitions/${C}/entries/${entry}/documents`
const doc = (over: Record<string, unknown>) => ({
  id: 'd1', entryId: 'e1', kind: 'insurance', originalFilename: 'ins.pdf', mediaType: 'application/pdf', sizeBytes: 2048,
  sha256: 'x', expiresOn: '2027-12-31', status: 'pending', reviewReason: null, reviewedAt: null, reviewedByName: null,
  uploadedAt: '2026-11-01T10:00:00.000Z', uploadedByName: 'P', superseded: false, replacedBy: null, fileDeleted: null, ...over,
})

describe('DocumentEntryPanel', () => {
  it('lists each kind with its status as a word and a shape, expiry, reason and history', async () => {
    registerEndpoint(base('e1'), () => ({
      current: [
        doc({ id: 'd1', kind: 'airworthiness', status: 'accepted', expiresOn: '2027-09-30' }),
        doc({ id: 'd2', kind: 'insurance', status: 'rejected', reviewReason: 'Ends too early.' }),
      ],
      history: [doc({ id: 'd0', kind: 'insurance', status: 'rejected', superseded: true, replacedBy: 'd2' })],
    }))
    const panel = await mountSuspended(DocumentEntryPanel, { props: { competitionId: C, entryId: 'e1', canUpload: false } })
    const arc = panel.get('[data-kind="airworthiness"]')
    expect(arc.text()).toContain('Accepted')
    expect(arc.find('[data-shape="accepted"]').exists()).toBe(true)
    expect(arc.text()).toContain('2027-09-30')
    expect(arc.get('a').attributes('href')).toBe(`${base('e1')}/d1/file`)
    const ins = panel.get('[data-kind="insurance"]')
    expect(ins.text()).toContain('Rejected')
    expect(ins.text()).toContain('Ends too early.')
    expect(panel.get('[data-kind="medical"]').text()).toContain('Not uploaded')
    expect(panel.text()).toContain('Earlier uploads (1)')
    expect(panel.find('form').exists()).toBe(false)
  })

  it('says when and why a deleted file went instead of offering to open it; kind, validity and outcome stay', async () => {
    const medicalGone = { on: '2027-08-18', reason: 'retention-medical', keptDays: 30, note: 'Deleted on 2027-08-18 (kept 30 days after the competition)' }
    const copyGone = { on: '2027-08-01', reason: 'retention-superseded', keptDays: 30, note: 'Deleted on 2027-08-01 (kept 30 days after a newer copy was accepted)' }
    registerEndpoint(base('e3'), () => ({
      current: [
        doc({ id: 'm1', kind: 'medical', status: 'accepted', expiresOn: '2028-01-31', originalFilename: '', fileDeleted: medicalGone }),
        doc({ id: 'a2', kind: 'airworthiness', status: 'accepted' }),
      ],
      history: [doc({ id: 'a1', kind: 'airworthiness', status: 'accepted', superseded: true, replacedBy: 'a2', originalFilename: '', fileDeleted: copyGone })],
    }))
    const panel = await mountSuspended(DocumentEntryPanel, { props: { competitionId: C, entryId: 'e3', canUpload: false } })
    const medical = panel.get('[data-kind="medical"]')
    expect(medical.text()).toContain('Accepted')
    expect(medical.text()).toContain('2028-01-31')
    expect(medical.get('[data-testid="document-file-deleted"]').text()).toBe(medicalGone.note)
    expect(medical.find('a').exists()).toBe(false)
    expect(panel.get('[data-kind="airworthiness"]').get('a').attributes('href')).toBe(`${base('e3')}/a2/file`)
    const history = panel.get('details')
    expect(history.get('[data-testid="document-file-deleted"]').text()).toContain(copyGone.note)
    expect(history.find('a').exists()).toBe(false)
  })

  it('offers a medical or licence file only where the route serves it, and says why elsewhere', async () => {
    const list = (fileAccess: unknown) => () => ({
      current: [
        doc({ id: 'a1', kind: 'airworthiness' }),
        doc({ id: 'm1', kind: 'medical', status: 'accepted', expiresOn: '2027-08-31' }),
      ],
      history: [doc({ id: 'l0', kind: 'licence', superseded: true, replacedBy: 'l1' })],
      fileAccess,
    })
    registerEndpoint(base('e5'), list({ isEntrant: false, rolesHeld: ['director'] }))
    const director = await mountSuspended(DocumentEntryPanel, { props: { competitionId: C, entryId: 'e5', canUpload: false } })
    const medical = director.get('[data-kind="medical"]')
    expect(medical.text()).toContain('Accepted')
    expect(medical.text()).toContain('2027-08-31')
    expect(medical.find('a').exists()).toBe(false)
    expect(medical.get('[data-testid="need-to-know"]').text()).toBe('Only the pilot, scrutineers and organisers open medical and licence files.')
    expect(director.get('[data-kind="airworthiness"]').get('a').attributes('href')).toBe(`${base('e5')}/a1/file`)
    expect(director.get('details').find('a').exists()).toBe(false)

    registerEndpoint(base('e6'), list({ isEntrant: true, rolesHeld: ['entrant'] }))
    const pilot = await mountSuspended(DocumentEntryPanel, { props: { competitionId: C, entryId: 'e6', canUpload: false } })
    expect(pilot.get('[data-kind="medical"]').get('a').attributes('href')).toBe(`${base('e6')}/m1/file`)
    expect(pilot.get('details').get('a').attributes('href')).toBe(`${base('e6')}/l0/file`)
    expect(pilot.find('[data-testid="need-to-know"]').exists()).toBe(false)
  })

  it('shows per-field errors before sending, and the server’s 415 sentence on the file field', async () => {
    registerEndpoint(base('e2'), {
      method: 'GET',
      handler: () => ({ current: [], history: [] }),
    })
    registerEndpoint(base('e2'), {
      method: 'POST',
      handler: (event) => {
        setResponseStatus(event, 415)
        return { statusCode: 415, message: 'That file is not a PDF, JPEG or PNG.' }
      },
    })
    const panel = await mountSuspended(DocumentEntryPanel, { props: { competitionId: C, entryId: 'e2', canUpload: true } })
    await panel.get('form').trigger('submit')
    // The form's schema is fetched on the first submit (zod stays out of the page's first scripts).
    await vi.waitFor(() => expect(panel.text()).toContain('Choose what kind of document this is.'))
    expect(panel.text()).toContain('Enter a date as YYYY-MM-DD.')
    expect(panel.text()).toContain('Choose a file to upload.')

    await panel.get('select').setValue('medical')
    await panel.get('input[type="date"]').setValue('2027-10-01')
    const input = panel.get('input[type="file"]')
    const file = new File(['not a pdf'], 'medical.pdf', { type: 'application/pdf' })
    Object.defineProperty(input.element, 'files', { value: [file], configurable: true })
    await input.trigger('change')
    await panel.get('form').trigger('submit')
    // The server's sentence, not the earlier "choose a file": the file went out and was refused.
    await vi.waitFor(() => expect(panel.get('[id$="-file-error"]').text()).toContain('That file is not a PDF, JPEG or PNG.'))
    expect(input.attributes('aria-invalid')).toBe('true')
  })
})
