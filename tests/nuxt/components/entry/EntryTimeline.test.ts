import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import type { TimelineItem } from '#shared/types/api-board'
import EntryTimeline from '~/components/entry/EntryTimeline.vue'

const dana = { id: 'u-d', name: 'Dana Director' }
const sam = { id: 'u-s', name: 'Sam Scrutineer' }
// Newest first, as the server sends them; 09:41 UTC is 10:41 in Berlin in December.
const items: TimelineItem[] = [
  { id: '6', kind: 'waiver', at: '2026-12-02T10:05:00.000Z', day: '2026-12-02', actor: dana, summary: 'Waived entry.paid for 2026-12-02: Paid at the desk', details: {} },
  { id: '5', kind: 'release', at: '2026-12-02T10:00:00.000Z', day: '2026-12-02', actor: dana, summary: 'Released by the director: Crack inspected', details: {} },
  { id: '4', kind: 'hold', at: '2026-12-02T09:50:00.000Z', day: '2026-12-02', actor: dana, summary: 'Held by the director: Canopy crack', details: {} },
  { id: '3', kind: 'findings', at: '2026-12-02T09:42:00.000Z', day: '2026-12-02', actor: null, summary: 'Findings changed: new: entry.paid (blocking)', details: {} },
  { id: '2', kind: 'grid-check', at: '2026-12-02T09:41:00.000Z', day: '2026-12-02', actor: sam, summary: 'Grid check: passed; ready', details: {} },
]

describe('EntryTimeline', () => {
  it('lists every event newest first with its word, shape, summary, who and when in the competition’s zone', async () => {
    const t = await mountSuspended(EntryTimeline, { props: { items, timeZone: 'Europe/Berlin' } })
    const rows = t.findAll('[data-testid="timeline-item"]')
    expect(rows.map(r => r.attributes('data-kind'))).toEqual(['waiver', 'release', 'hold', 'findings', 'grid-check'])
    expect(rows.map(r => r.get('[data-testid="timeline-kind"]').text())).toEqual(['Waiver', 'Released', 'Held', 'Findings changed', 'Grid check'])
    // Each kind has a shape of its own, not only a colour.
    const shapes = rows.map(r => r.get('svg').attributes('data-shape'))
    expect(new Set(shapes).size).toBe(5)
    expect(rows[2]!.get('[data-testid="timeline-summary"]').text()).toBe('Held by the director: Canopy crack')
    expect(rows[2]!.get('[data-testid="timeline-actor"]').text()).toBe('by Dana Director')
    expect(rows[3]!.get('[data-testid="timeline-actor"]').text()).toBe('by Gridmark')
    expect(rows[4]!.get('time').text()).toBe('2 Dec, 10:41')
    expect(rows[4]!.get('time').attributes('datetime')).toBe('2026-12-02T09:41:00.000Z')
    expect(t.text()).toContain('times in Europe/Berlin')
  })

  it('tells the pilot a document’s file was deleted on the retention schedule, by Gridmark, with a shape of its own', async () => {
    const deleted: TimelineItem = {
      id: '9', kind: 'document', at: '2027-08-17T22:00:00.000Z', day: null, actor: null,
      summary: 'Medical file deleted, kept 30 days after the competition; its kind, validity and review outcome stay on record', details: {},
    }
    const t = await mountSuspended(EntryTimeline, { props: { items: [deleted, ...items], timeZone: 'Europe/Berlin' } })
    const row = t.get('[data-testid="timeline-item"]')
    expect(row.attributes('data-kind')).toBe('document')
    expect(row.get('[data-testid="timeline-kind"]').text()).toBe('Document file deleted')
    expect(row.get('[data-testid="timeline-summary"]').text()).toBe(deleted.summary)
    expect(row.get('[data-testid="timeline-actor"]').text()).toBe('by Gridmark')
    const shapes = t.findAll('[data-testid="timeline-item"]').map(r => r.get('svg').attributes('data-shape'))
    expect(new Set(shapes).size).toBe(6)
  })

  it('shows the same instant in another competition’s zone', async () => {
    const t = await mountSuspended(EntryTimeline, { props: { items: [items[4]!], timeZone: 'America/New_York' } })
    expect(t.get('time').text()).toBe('2 Dec, 04:41')
  })

  it('says plainly when there is nothing yet, and shows a load failure instead of an empty list', async () => {
    const empty = await mountSuspended(EntryTimeline, { props: { items: [], timeZone: 'Europe/Berlin' } })
    expect(empty.get('[data-testid="entry-timeline-empty"]').text()).toContain('Nothing yet')
    const failed = await mountSuspended(EntryTimeline, { props: { items: [], timeZone: 'Europe/Berlin', error: 'The timeline could not be loaded.' } })
    expect(failed.get('[role="alert"]').text()).toBe('The timeline could not be loaded.')
    expect(failed.find('[data-testid="entry-timeline-empty"]').exists()).toBe(false)
  })

  it('folds a long timeline to the newest events until asked for all', async () => {
    const many: TimelineItem[] = Array.from({ length: 15 }, (_, i) => ({ ...items[4]!, id: String(100 - i) }))
    const t = await mountSuspended(EntryTimeline, { props: { items: many, timeZone: 'Europe/Berlin', fold: 12 } })
    expect(t.findAll('[data-testid="timeline-item"]')).toHaveLength(12)
    await t.get('button').trigger('click')
    expect(t.findAll('[data-testid="timeline-item"]')).toHaveLength(15)
  })
})
