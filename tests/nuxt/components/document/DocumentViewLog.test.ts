import { describe, expect, it } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import DocumentViewLog from '~/components/document/DocumentViewLog.vue'

const C = 'c-views'
const url = (entry: string) => `/api/competitions/${C}/entries/${entry}/document-views`

describe('DocumentViewLog', () => {
  it('tells the pilot who opened which file, under which role and when, their own openings as "You"', async () => {
    registerEndpoint(url('e1'), () => ({
      views: [
        { id: '2', documentId: 'd1', documentKind: 'medical', viewerName: 'Sven Scrutineer', viewerRole: 'scrutineer', byEntrant: false, viewedAt: '2027-04-02T12:05:00.000Z' },
        { id: '1', documentId: 'd2', documentKind: 'licence', viewerName: 'Petra Pilot', viewerRole: 'entrant', byEntrant: true, viewedAt: '2027-04-01T08:00:00.000Z' },
      ],
      total: 2,
      limit: 100,
    }))
    const log = await mountSuspended(DocumentViewLog, { props: { competitionId: C, entryId: 'e1', timeZone: 'Europe/Berlin', isOwner: true } })
    const items = log.findAll('[data-testid="document-view-item"]')
    expect(items).toHaveLength(2)
    expect(items[0]!.text()).toContain('Sven Scrutineer')
    expect(items[0]!.text()).toContain('Scrutineer')
    expect(items[0]!.text()).toContain('opened the medical file')
    // 12:05 UTC is 14:05 in Berlin in summer time.
    expect(items[0]!.text()).toContain('2 Apr, 14:05')
    expect(items[1]!.text()).toContain('You')
    expect(items[1]!.text()).toContain('opened the pilot licence file')
    expect(log.text()).not.toContain('The newest')
  })

  it('says so when nobody has opened anything, and when the list is cut short', async () => {
    registerEndpoint(url('e2'), () => ({ views: [], total: 0, limit: 100 }))
    const empty = await mountSuspended(DocumentViewLog, { props: { competitionId: C, entryId: 'e2', timeZone: 'UTC', isOwner: true } })
    expect(empty.get('[data-testid="document-views-empty"]').text()).toBe('Nobody has opened your medical or licence files yet.')

    registerEndpoint(url('e3'), () => ({
      views: [{ id: '9', documentId: null, documentKind: 'medical', viewerName: 'Orla Organiser', viewerRole: 'organiser', byEntrant: false, viewedAt: '2027-04-02T12:05:00.000Z' }],
      total: 140,
      limit: 1,
    }))
    const office = await mountSuspended(DocumentViewLog, { props: { competitionId: C, entryId: 'e3', timeZone: 'UTC', isOwner: false } })
    expect(office.text()).toContain('The newest 1 of 140 openings.')
  })
})
