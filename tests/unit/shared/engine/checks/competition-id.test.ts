import { describe, expect, it } from 'vitest'
import { competitionIdUnique } from '#shared/engine/checks/competition-id'
import { ctx, dossier, fieldOf } from '../builders'

describe('competition-id.unique (common practice)', () => {
  it('blocks a competition ID another entry uses, ignoring case and spaces', () => {
    const a = dossier({}, { id: 'a', compId: 'K7' })
    const b = dossier({ units: [] }, { id: 'b', compId: 'k 7' })
    const [f] = competitionIdUnique.run(ctx(a, undefined, fieldOf(a, b)))
    expect(f).toMatchObject({ checkId: 'competition-id.unique', severity: 'blocking' })
    expect(f!.reason).toContain('K7')
  })

  it('passes a competition ID of its own', () => {
    const a = dossier({}, { id: 'a', compId: 'K7' })
    const b = dossier({}, { id: 'b', compId: 'K8' })
    expect(competitionIdUnique.run(ctx(a, undefined, fieldOf(a, b)))).toEqual([])
  })
})
