import { afterEach, describe, expect, it, vi } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { readBody } from 'h3'
import type { DirectorActionRecord } from '#shared/types/api-board'
import DeskActionList from '~/components/desk/DeskActionList.vue'

const C = '22222222-2222-4222-8222-222222222222'
const E = '33333333-3333-4333-8333-333333333333'
const W = '44444444-4444-4444-8444-444444444444'
const actor = { id: 'u', name: 'Dana Director' }
const waiver = (over: Partial<DirectorActionRecord> = {}): DirectorActionRecord => ({
  id: W, kind: 'waiver', day: '2026-12-02', scope: 'day', checkId: 'entry.paid', unitId: null, subject: 'payment', reason: 'Paid in cash',
  finding: { severity: 'blocking', reason: 'The entry fee is not paid yet.' }, actor, at: '2026-12-02T10:00:00.000Z', withdrawal: null, ...over,
})
const hold: DirectorActionRecord = { id: 'h1', kind: 'hold', day: '2026-12-02', scope: null, checkId: null, unitId: null, subject: null, reason: 'Canopy', finding: null, actor, at: '2026-12-02T09:00:00.000Z', withdrawal: null }

const cleanups: (() => void)[] = []
afterEach(() => {
  while (cleanups.length) cleanups.pop()!()
})

describe('DeskActionList', () => {
  it('offers the director a Withdraw action on a waiver in force only', async () => {
    const list = await mountSuspended(DeskActionList, { props: { actions: [hold, waiver()], timeZone: 'UTC', canWithdraw: true, competitionId: C, entryId: E } })
    cleanups.push(() => list.unmount())
    expect(list.findAll('[data-testid="desk-withdraw"]')).toHaveLength(1)
    const readOnly = await mountSuspended(DeskActionList, { props: { actions: [waiver()], timeZone: 'UTC' } })
    cleanups.push(() => readOnly.unmount())
    expect(readOnly.findAll('[data-testid="desk-withdraw"]')).toHaveLength(0)
  })

  it('withdraws with a reason and reports the result', async () => {
    let sent: unknown
    cleanups.push(registerEndpoint(`/api/competitions/${C}/entries/${E}/waivers/${W}/withdraw`, {
      method: 'POST',
      handler: async (event) => {
        sent = await readBody(event)
        return { action: waiver({ withdrawal: { by: actor, at: '2026-12-02T11:00:00.000Z', reason: 'No cash' } }), tile: null }
      },
    }))
    const list = await mountSuspended(DeskActionList, { props: { actions: [waiver()], timeZone: 'UTC', canWithdraw: true, competitionId: C, entryId: E }, attachTo: document.body })
    cleanups.push(() => list.unmount())
    await list.get('[data-testid="desk-withdraw"]').trigger('click')
    const form = list.get('[data-testid="desk-withdraw-form"]')
    await form.get('textarea').setValue(' No cash ')
    await form.trigger('submit')
    await vi.waitFor(() => expect(list.emitted('withdrawn')).toBeTruthy())
    expect(sent).toEqual({ reason: 'No cash' })
  })

  it('refuses a reason over the limit in words, without cutting it or sending it', async () => {
    let calls = 0
    cleanups.push(registerEndpoint(`/api/competitions/${C}/entries/${E}/waivers/${W}/withdraw`, { method: 'POST', handler: () => { calls++; return { action: waiver(), tile: null } } }))
    const list = await mountSuspended(DeskActionList, { props: { actions: [waiver()], timeZone: 'UTC', canWithdraw: true, competitionId: C, entryId: E }, attachTo: document.body })
    cleanups.push(() => list.unmount())
    await list.get('[data-testid="desk-withdraw"]').trigger('click')
    const long = 'x'.repeat(501)
    await list.get('[data-testid="desk-withdraw-form"] textarea').setValue(long)
    await list.get('[data-testid="desk-withdraw-form"]').trigger('submit')
    await vi.waitFor(() => expect(list.text()).toContain('Keep the reason under 500 characters.'))
    expect((list.get('[data-testid="desk-withdraw-form"] textarea').element as HTMLTextAreaElement).value).toBe(long)
    expect(calls).toBe(0)
  })

  it('marks a withdrawn waiver: by whom, why, and that it lifts nothing', async () => {
    const list = await mountSuspended(DeskActionList, {
      props: { actions: [waiver({ withdrawal: { by: actor, at: '2026-12-02T11:00:00.000Z', reason: 'No cash' } })], timeZone: 'UTC', canWithdraw: true, competitionId: C, entryId: E },
    })
    cleanups.push(() => list.unmount())
    expect(list.text()).toContain('Waiver withdrawn')
    expect(list.get('[data-testid="desk-action-withdrawn"]').text()).toContain('by Dana Director')
    expect(list.get('[data-testid="desk-action-withdrawn"]').text()).toContain('“No cash”')
    expect(list.findAll('[data-testid="desk-withdraw"]')).toHaveLength(0)
  })
})
