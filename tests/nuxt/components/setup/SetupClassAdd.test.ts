import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import SetupClassAdd from '~/components/setup/SetupClassAdd.vue'
import EntryTableStatusTag from '~/components/entry-table/EntryTableStatusTag.vue'

describe('SetupClassAdd', () => {
  // Defaults: FAI Sporting Code Section 3 Annex A, from memory (shared/constants/classes.ts).
  it('shows an FAI class’s default limits before it is added, and greys out classes already there', async () => {
    const add = await mountSuspended(SetupClassAdd, {
      props: { competitionId: 'c1', existing: [{ id: 'k1', name: 'Club', code: 'club', maxSpanM: null, maxMtomKg: null, waterBallast: false, entryFeeMinor: 0, sortOrder: 0, entryCount: 0 }] },
    })
    await add.get('select').setValue('18m')
    expect(add.get('[data-testid="class-add-defaults"]').text()).toBe('18 Metre: span ≤ 18 m · MTOM ≤ 600 kg · water ballast allowed.')
    const club = add.findAll('option').find(o => o.text().startsWith('Club'))!
    expect(club.attributes('disabled')).toBeDefined()
  })

  it('asks for a name only for a custom class', async () => {
    const add = await mountSuspended(SetupClassAdd, { props: { competitionId: 'c1', existing: [] } })
    expect(add.find('#class-add-name').exists()).toBe(false)
    await add.get('select').setValue('custom')
    expect(add.find('#class-add-name').exists()).toBe(true)
  })
})

describe('EntryTableStatusTag', () => {
  it('says the state in words, with a shape, never by colour alone', async () => {
    const tag = await mountSuspended(EntryTableStatusTag, { props: { kind: 'payment', value: 'refunded' } })
    expect(tag.text()).toBe('Refunded')
    expect(tag.find('svg').exists()).toBe(true)
  })
})
