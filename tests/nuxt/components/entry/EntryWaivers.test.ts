import { afterEach, describe, expect, it } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import EntryWaivers from '~/components/entry/EntryWaivers.vue'

const C = '22222222-2222-4222-8222-222222222222'
const E = '33333333-3333-4333-8333-333333333333'
const url = `/api/competitions/${C}/entries/${E}/waivers`
const inForce = {
  id: 'w2', scope: 'competition', day: null, checkId: 'declaration.recent', checkTitle: 'The IGC file is recent.',
  finding: { severity: 'advisory', reason: 'The file is 40 days old.' }, reason: 'Flown last month', by: 'Dana Director',
  at: '2026-12-02T10:00:00.000Z', until: '2026-12-10', withdrawal: null,
}
const withdrawn = {
  id: 'w1', scope: 'day', day: '2026-12-02', checkId: 'entry.paid', checkTitle: 'The entry fee is paid before the first contest day.',
  finding: { severity: 'blocking', reason: 'The entry fee is not paid yet.' }, reason: 'Paid in cash', by: 'Dana Director',
  at: '2026-12-02T09:00:00.000Z', until: '2026-12-02', withdrawal: { by: 'Dana Director', at: '2026-12-02T11:00:00.000Z', reason: 'No cash was received' },
}

const cleanups: (() => void)[] = []
afterEach(() => {
  while (cleanups.length) cleanups.pop()!()
})

describe('EntryWaivers', () => {
  it('lists the waivers in force (check, scope, until when, by whom, why) and the withdrawn ones', async () => {
    cleanups.push(registerEndpoint(url, () => [inForce, withdrawn]))
    const box = await mountSuspended(EntryWaivers, { props: { competitionId: C, entryId: E, timeZone: 'UTC' } })
    cleanups.push(() => box.unmount())
    const active = box.get('[data-testid="entry-waiver"][data-state="active"]')
    expect(active.text()).toContain('Waived for the whole competition')
    expect(active.text()).toContain('The IGC file is recent.')
    expect(active.text()).toContain('“Flown last month”')
    expect(active.text()).toContain('By Dana Director')
    expect(active.text()).toMatch(/until the end of Thursday,? 10 December 2026/)
    expect(active.get('a').attributes('href')).toBe(`/competitions/${C}/checks#declaration.recent`)
    const gone = box.get('[data-testid="entry-waiver"][data-state="withdrawn"]')
    expect(gone.text()).toContain('No longer waived: entry.paid')
    expect(gone.text()).toContain('Withdrawn by Dana Director')
    expect(gone.text()).toContain('“No cash was received”')
  })

  it('shows nothing while the entry has no waiver', async () => {
    cleanups.push(registerEndpoint(url, () => []))
    const box = await mountSuspended(EntryWaivers, { props: { competitionId: C, entryId: E, timeZone: 'UTC' } })
    cleanups.push(() => box.unmount())
    expect(box.find('[data-testid="entry-waivers"]').exists()).toBe(false)
  })
})
