// Every finding on the dossier links to its rule on the competition's rulebook page; the
// caution shows where the finding carries one.
import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import FindingList from '~/components/finding/FindingList.vue'
import { HARDWARE_CAUTION, type Finding } from '#shared/engine'

const findings: Finding[] = [
  { checkId: 'firmware.valid-through-contest', severity: 'blocking', reason: 'The firmware expires 2027-07-18, the last contest day.', fixHint: 'Update the firmware.', caution: HARDWARE_CAUTION, unitId: 'u1' },
  { checkId: 'igc.security-record', severity: 'advisory', reason: 'The IGC file has no security record.', fixHint: 'Upload the file as the recorder wrote it.' },
]

describe('FindingList', () => {
  it('links each finding to its check on the rulebook page', async () => {
    const list = await mountSuspended(FindingList, { props: { findings, competitionId: 'comp-7' } })
    const links = list.findAll('[data-testid="finding"] [data-testid="finding-rule-link"]')
    expect(links.map(l => l.attributes('href'))).toEqual([
      '/competitions/comp-7/checks#firmware.valid-through-contest',
      '/competitions/comp-7/checks#igc.security-record',
    ])
    expect(links[0]!.text()).toBe('Rule: firmware.valid-through-contest')
    // Broken over two lines only after its dot: each part on one line, its hyphens kept.
    expect(links[0]!.findAll('[data-testid="finding-rule-id"] span').map(p => [p.text(), p.classes('whitespace-nowrap')]))
      .toEqual([['firmware', true], ['valid-through-contest', true]])
    expect(links[0]!.find('[data-testid="finding-rule-id"] wbr').exists()).toBe(true)
    expect(list.findAll('[data-testid="finding-caution"]')).toHaveLength(1)
    list.unmount()
  })
})
