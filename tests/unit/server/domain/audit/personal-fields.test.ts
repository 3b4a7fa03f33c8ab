// What the audit log keeps of a change: values of the glider, only "changed" for a person's
// fields, no address anywhere, and no name quoted in the engine's finding reasons.
import { describe, expect, it } from 'vitest'
import { evaluate } from '#shared/engine'
import { diffFindings } from '#shared/utils/board-tile'
import { auditRow } from '#domain/audit/audit'
import { fieldChange, isPersonalField, personalValuesOfDossier, withoutPersonalFields, withoutPersonalValues } from '#domain/audit/personal-fields'
import { competition, dossier, fieldOf, igcFile } from '../../../shared/engine/builders'

describe('personal fields', () => {
  it('are the person’s fields and addresses, not the glider’s', () => {
    for (const f of ['pilotName', 'copilotName', 'crewNames', 'pilotPhone', 'emergencyContact', 'pilotLicenceNumber', 'pilotNationality', 'email', 'organiserEmail', 'privacyContactEmail', 'homeAddress']) {
      expect(isPersonalField(f), f).toBe(true)
    }
    for (const f of ['gliderType', 'registration', 'compId', 'classId', 'spanM', 'mtomKg', 'pilotMassKg', 'firmwareVersion', 'serial', 'radioId', 'reason', 'name', 'airfieldName']) {
      expect(isPersonalField(f), f).toBe(false)
    }
  })

  it('a change of one keeps only that it changed; of the glider, both values', () => {
    expect(fieldChange('pilotPhone', '+44 1', '+44 2')).toEqual({ field: 'pilotPhone', changed: true })
    expect(fieldChange('mtomKg', 525, 500)).toEqual({ field: 'mtomKg', from: 525, to: 500 })
  })

  it('never reach a row, whatever the caller passes', () => {
    const row = auditRow({
      actorUserId: 'u', action: 'entry.updated', subjectType: 'entry', subjectId: 'e',
      details: { entryId: 'e', field: 'emergencyContact', from: 'Pat, +44 7700 900456', to: 'Sam, +44 7700 900457', email: 'a@example.org', changes: { organiserEmail: { from: 'a@x', to: 'b@x' }, timeZone: { from: 'A', to: 'B' } } },
    })
    expect(row.details).toEqual({ entryId: 'e', field: 'emergencyContact', changed: true, changes: { organiserEmail: { changed: true }, timeZone: { from: 'A', to: 'B' } } })
    expect(withoutPersonalFields({ role: 'scrutineer', invitedEmail: 'x@y', acceptedEmail: 'x@y' })).toEqual({ role: 'scrutineer' })
  })
})

describe('personal values quoted in text', () => {
  it('are replaced wherever they stand, ignoring case, the longest first', () => {
    expect(withoutPersonalValues({ a: ['Ana Pilot and ana pilot jr'], n: 3 }, ['Ana Pilot', 'Ana Pilot Jr', null, 'x']))
      .toEqual({ a: ['… and …'], n: 3 })
  })

  it('leave no pilot’s or co-pilot’s name in the findings any check writes', () => {
    // Every check, over a dossier whose recorder names other people than the entry does.
    const d = dossier({ igcFiles: [igcFile({ pilot: 'Quillon Varga', copilot: 'Brisa Oyelaran' })] }, { pilotName: 'Linnea Holmquist', copilotName: 'Teodor Anwick' })
    const findings = evaluate(d, competition(), fieldOf(d))
    const named = /Quillon Varga|Brisa Oyelaran|Linnea Holmquist|Teodor Anwick/i
    expect(JSON.stringify(findings)).toMatch(named)
    const { added } = withoutPersonalValues(diffFindings([], findings), personalValuesOfDossier(d))
    expect(added.length).toBe(findings.length)
    expect(JSON.stringify(added)).not.toMatch(named)
    expect(added.find(f => f.reason.includes('names the pilot'))?.reason).toContain('names the pilot “…”, the entry says “…”')
  })
})
