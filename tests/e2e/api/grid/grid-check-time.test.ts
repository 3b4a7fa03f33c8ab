// The time of a grid check comes from the phone's clock and decides which check is the
// entry's latest: it must lie on the check's contest day (in the competition's zone, give or
// take two hours) and no later than the server's clock plus five minutes. A check made offline
// in the morning and sent in the afternoon is still taken.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { MESSAGES } from '../../../../shared/constants/messages'
import { closeTestDb } from '../../../support/db'
import { checkBody, gridCheckRows, gridEntry, gridWorld, shiftDay, todayIn, type GridWorld } from '../../../support/grid'

const baseUrl = inject('baseUrl')
afterAll(closeTestDb)

let w: GridWorld
let path: string
beforeAll(async () => {
  w = await gridWorld(baseUrl, 'Grid Clock Cup')
  path = `${w.base}/grid-checks`
})

const minutesFromNow = (m: number) => new Date(Date.now() + m * 60_000).toISOString()

describe('the time of a grid check', () => {
  it('is refused in the future: year 9999, or ten minutes ahead; nothing is stored', async () => {
    const entryId = await gridEntry(w)
    for (const checkedAt of ['9999-01-01T10:00:00Z', minutesFromNow(10)]) {
      const res = await w.scrutineer.client.post(path, checkBody(entryId, { checkedAt }))
      expect(res.status, checkedAt).toBe(400)
      expect(res.body.data.fieldErrors.checkedAt).toEqual([MESSAGES.gridCheckedAtFuture])
    }
    expect(await gridCheckRows({ entry_id: entryId })).toEqual([])
  })

  it('takes a phone a little ahead of the server', async () => {
    const entryId = await gridEntry(w)
    const res = await w.scrutineer.client.post(path, checkBody(entryId, { checkedAt: minutesFromNow(2) }))
    expect(res.status).toBe(201)
  })

  it('is refused outside the contest day’s window', async () => {
    const entryId = await gridEntry(w)
    // The day before yesterday: yesterday's check made now would still lie in its day's two
    // hours of slack in the first two hours after midnight.
    const earlier = shiftDay(todayIn(), -2)
    // A check of two days ago, made now; today's, made three days ago.
    const late = await w.scrutineer.client.post(path, checkBody(entryId, { day: earlier, checkedAt: new Date().toISOString() }))
    expect(late.status).toBe(400)
    expect(late.body.data.fieldErrors.checkedAt).toEqual([MESSAGES.gridCheckedAtOutsideDay(earlier)])
    const early = await w.scrutineer.client.post(path, checkBody(entryId, { checkedAt: minutesFromNow(-3 * 24 * 60) }))
    expect(early.status).toBe(400)
    expect(early.body.data.fieldErrors.checkedAt).toEqual([MESSAGES.gridCheckedAtOutsideDay(todayIn())])
    expect(await gridCheckRows({ entry_id: entryId })).toEqual([])
  })

  it('takes a check made offline five hours ago and sent now, on the day it was made', async () => {
    const entryId = await gridEntry(w)
    const madeAt = new Date(Date.now() - 5 * 60 * 60_000)
    const res = await w.scrutineer.client.post(path, checkBody(entryId, { day: todayIn('Europe/Berlin', madeAt), checkedAt: madeAt.toISOString() }))
    expect(res.status).toBe(201)
    expect(res.body.gridCheck.checkedAt).toBe(madeAt.toISOString())
  })
})
