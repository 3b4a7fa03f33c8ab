import { describe, expect, it } from 'vitest'
import { DOCUMENT_KINDS } from '#shared/constants/entries'
import {
  PERSONAL_DOCUMENT_KINDS,
  canOpenDocumentFile,
  decideDocumentFile,
  decideEntryDocumentViews,
  isPersonalDocument,
} from '#shared/utils/document-access'

// Need to know for pilots' medical certificates and licences (GDPR Art. 9: health data is a
// special category; access on need to know is the Gridmark rule of issue 19).
const refused = { allowed: false, status: 403, message: 'Only the pilot, the competition’s scrutineers and its organisers open medical and licence files. You can see the document’s kind, validity and review outcome on the entry.' }

describe('decideDocumentFile', () => {
  it('counts only medical and licence as personal', () => {
    expect(PERSONAL_DOCUMENT_KINDS).toEqual(['licence', 'medical'])
    expect(DOCUMENT_KINDS.filter(isPersonalDocument)).toEqual(['licence', 'medical'])
  })

  it('serves the glider’s papers to everyone the entry lets in, unlogged', () => {
    for (const kind of ['airworthiness', 'insurance', 'other'] as const) {
      expect(decideDocumentFile(kind, { isEntrant: false, rolesHeld: ['director'] })).toEqual({ allowed: true, logged: false })
      // A site administrator without a role here (organiser rights are not a role held).
      expect(decideDocumentFile(kind, { isEntrant: false, rolesHeld: [] })).toEqual({ allowed: true, logged: false })
      expect(decideDocumentFile(kind, { isEntrant: true, rolesHeld: ['entrant'] })).toEqual({ allowed: true, logged: false })
    }
  })

  it('serves a medical or licence file to its pilot, a scrutineer or an organiser, logged under that role', () => {
    for (const kind of PERSONAL_DOCUMENT_KINDS) {
      expect(decideDocumentFile(kind, { isEntrant: true, rolesHeld: ['entrant'] })).toEqual({ allowed: true, logged: true, as: 'entrant' })
      expect(decideDocumentFile(kind, { isEntrant: false, rolesHeld: ['scrutineer'] })).toEqual({ allowed: true, logged: true, as: 'scrutineer' })
      expect(decideDocumentFile(kind, { isEntrant: false, rolesHeld: ['organiser'] })).toEqual({ allowed: true, logged: true, as: 'organiser' })
    }
  })

  it('logs the pilot as the pilot even where they hold a staff role too, and a scrutineer-organiser as scrutineer', () => {
    expect(decideDocumentFile('medical', { isEntrant: true, rolesHeld: ['organiser', 'entrant'] })).toMatchObject({ as: 'entrant' })
    expect(decideDocumentFile('medical', { isEntrant: false, rolesHeld: ['organiser', 'scrutineer'] })).toMatchObject({ as: 'scrutineer' })
  })

  it('refuses the director and a site administrator without a role with 403 and the rule in words', () => {
    for (const kind of PERSONAL_DOCUMENT_KINDS) {
      expect(decideDocumentFile(kind, { isEntrant: false, rolesHeld: ['director'] })).toEqual(refused)
      expect(decideDocumentFile(kind, { isEntrant: false, rolesHeld: [] })).toEqual(refused)
      // An administrator who is only a director or another pilot here is refused as well.
      expect(decideDocumentFile(kind, { isEntrant: false, rolesHeld: ['director', 'entrant'] })).toEqual(refused)
    }
  })

  it('offers the link exactly where the route serves the file', () => {
    const readers = [
      { isEntrant: true, rolesHeld: ['entrant'] as const },
      { isEntrant: false, rolesHeld: ['scrutineer'] as const },
      { isEntrant: false, rolesHeld: ['director'] as const },
      { isEntrant: false, rolesHeld: [] as const },
    ]
    for (const kind of DOCUMENT_KINDS) {
      for (const reader of readers) {
        expect(canOpenDocumentFile(kind, reader)).toBe(decideDocumentFile(kind, reader).allowed)
      }
    }
    expect(canOpenDocumentFile('medical', { isEntrant: false, rolesHeld: ['director'] })).toBe(false)
  })
})

describe('decideEntryDocumentViews', () => {
  it('shows the log to the pilot and to organisers (site administrators count as organisers)', () => {
    expect(decideEntryDocumentViews({ isOwner: true, roles: ['entrant'] })).toEqual({ allowed: true })
    expect(decideEntryDocumentViews({ isOwner: false, roles: ['organiser'] })).toEqual({ allowed: true })
  })

  it('refuses the director and scrutineers with 403', () => {
    for (const roles of [['director'], ['scrutineer'], ['director', 'scrutineer']] as const) {
      expect(decideEntryDocumentViews({ isOwner: false, roles })).toEqual({
        allowed: false,
        status: 403,
        message: 'Only the pilot and the competition’s organisers see who opened the entry’s medical and licence files.',
      })
    }
  })
})
