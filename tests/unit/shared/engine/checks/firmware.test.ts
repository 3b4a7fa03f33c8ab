import { describe, expect, it } from 'vitest'
import { HARDWARE_CAUTION } from '#shared/engine/caution'
import { firmwareCatalogueMismatch, firmwareExpiresSoon, firmwareValidThroughContest, firmwareYearlyUpdate } from '#shared/engine/checks/firmware'
import { collisionWarning, competition, ctx, dossier } from '../builders'

const withFirmware = (firmwareExpiresOn: string | null, more = {}) => dossier({ units: [collisionWarning({ firmwareExpiresOn, ...more })] })

describe('firmware.valid-through-contest (common practice: expired firmware stops the unit transmitting and receiving)', () => {
  it('blocks firmware that expires on the last contest day: the expiry date is the first day it no longer works', () => {
    const [f] = firmwareValidThroughContest.run(ctx(withFirmware('2027-07-18')))
    expect(f).toMatchObject({ checkId: 'firmware.valid-through-contest', severity: 'blocking', unitId: 'cw-1', caution: HARDWARE_CAUTION })
    expect(f!.reason).toContain('expires 2027-07-18, the last contest day is 2027-07-18')
  })

  it('blocks firmware that expires during the contest, with the actual dates in the reason', () => {
    const [f] = firmwareValidThroughContest.run(ctx(withFirmware('2027-07-15')))
    expect(f!.reason).toContain('expires 2027-07-15, the last contest day is 2027-07-18')
  })

  it('passes firmware expiring the day after the last contest day when the margin is 0', () => {
    expect(firmwareValidThroughContest.run(ctx(withFirmware('2027-07-19')))).toEqual([])
  })

  it('with a margin of 3 days, blocks expiry on last day + 3 and passes last day + 4', () => {
    const comp = competition({ firmwareMarginDays: 3 })
    expect(firmwareValidThroughContest.run(ctx(withFirmware('2027-07-21'), comp))).toHaveLength(1)
    expect(firmwareValidThroughContest.run(ctx(withFirmware('2027-07-22'), comp))).toEqual([])
  })

  it('blocks a unit whose expiry date is not entered', () => {
    expect(firmwareValidThroughContest.run(ctx(withFirmware(null)))[0]!.reason).toContain('not entered')
  })

  it('checks each collision-warning unit on its own', () => {
    const d = dossier({ units: [collisionWarning(), collisionWarning({ id: 'cw-2', radioId: '3D1111', firmwareExpiresOn: '2027-07-01' })] })
    expect(firmwareValidThroughContest.run(ctx(d)).map(f => f.unitId)).toEqual(['cw-2'])
  })
})

describe('firmware.expires-soon (common practice)', () => {
  it('advises when the firmware expires within 30 days after the last contest day', () => {
    const [f] = firmwareExpiresSoon.run(ctx(withFirmware('2027-08-05')))
    expect(f).toMatchObject({ severity: 'advisory', caution: HARDWARE_CAUTION })
    expect(f!.reason).toContain('expires 2027-08-05, 18 days after the last contest day (2027-07-18)')
  })

  it('advises on the day after the last contest day and on the 30th day, not the 31st', () => {
    expect(firmwareExpiresSoon.run(ctx(withFirmware('2027-07-19')))).toHaveLength(1)
    expect(firmwareExpiresSoon.run(ctx(withFirmware('2027-08-17')))).toHaveLength(1)
    expect(firmwareExpiresSoon.run(ctx(withFirmware('2027-08-18')))).toEqual([])
  })

  it('stays silent where the firmware already blocks', () => {
    expect(firmwareExpiresSoon.run(ctx(withFirmware('2027-07-18')))).toEqual([])
  })
})

describe('firmware.yearly-update (common practice: update yearly, at the annual inspection)', () => {
  it('advises when the last update is more than 12 months before the first contest day', () => {
    const [f] = firmwareYearlyUpdate.run(ctx(withFirmware('2028-03-31', { firmwareUpdatedOn: '2026-02-10' })))
    expect(f).toMatchObject({ severity: 'advisory' })
    expect(f!.reason).toContain('last updated 2026-02-10, more than a year before the first contest day (2027-07-12)')
  })

  it('passes an update exactly 12 months before the first contest day', () => {
    expect(firmwareYearlyUpdate.run(ctx(withFirmware('2028-03-31', { firmwareUpdatedOn: '2026-07-12' })))).toEqual([])
    expect(firmwareYearlyUpdate.run(ctx(withFirmware('2028-03-31', { firmwareUpdatedOn: '2026-07-11' })))).toHaveLength(1)
  })
})

describe('firmware.catalogue-mismatch (Gridmark rule)', () => {
  const comp = competition({}, { firmwareCatalogue: [{ family: 'Lapwing CW', version: '7.24', expiresOn: '2028-03-31' }] })

  it('advises when the entered expiry differs from the catalogue for that version', () => {
    const [f] = firmwareCatalogueMismatch.run(ctx(withFirmware('2028-04-30'), comp))
    expect(f!.severity).toBe('advisory')
    expect(f!.reason).toContain('expires 2028-04-30; the organiser’s catalogue says 2028-03-31')
  })

  it('passes when they agree, and when the version is not in the catalogue', () => {
    expect(firmwareCatalogueMismatch.run(ctx(withFirmware('2028-03-31'), comp))).toEqual([])
    expect(firmwareCatalogueMismatch.run(ctx(withFirmware('2028-04-30', { firmwareVersion: '9.9' }), comp))).toEqual([])
  })
})
