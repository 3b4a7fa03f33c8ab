import { describe, expect, it } from 'vitest'
import { obstaclesCurrent } from '#shared/engine/checks/obstacles'
import { collisionWarning, ctx, dossier } from '../builders'

describe('obstacles.current (Gridmark rule)', () => {
  const withDb = (obstacleDbExpiresOn?: string) => dossier({ units: [collisionWarning({ obstacleDbExpiresOn })] })

  it('advises when the obstacle database expires on or before the last contest day', () => {
    const [f] = obstaclesCurrent.run(ctx(withDb('2027-07-18')))
    expect(f).toMatchObject({ severity: 'advisory', unitId: 'cw-1' })
    expect(f!.reason).toContain('expires 2027-07-18, the last contest day is 2027-07-18')
  })

  it('passes a database valid after the contest, and a unit with no database given', () => {
    expect(obstaclesCurrent.run(ctx(withDb('2027-07-19')))).toEqual([])
    expect(obstaclesCurrent.run(ctx(withDb(undefined)))).toEqual([])
  })
})
