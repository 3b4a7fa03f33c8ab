// Need to know: who may open a document's file, and who may read the log of who opened the
// medical and licence files. Pure, so the file route and the pages that offer an "open" link
// decide alike, and the rule is unit-tested on its own.
import type { DocumentKind } from '../constants/entries'
import type { Role } from '../constants/roles'
import { MESSAGES } from '../constants/messages'

/** Health and identity data: opened on need to know, every opening logged. */
export const PERSONAL_DOCUMENT_KINDS = ['licence', 'medical'] as const satisfies readonly DocumentKind[]
export type PersonalDocumentKind = (typeof PERSONAL_DOCUMENT_KINDS)[number]

export function isPersonalDocument(kind: DocumentKind): kind is PersonalDocumentKind {
  return (PERSONAL_DOCUMENT_KINDS as readonly DocumentKind[]).includes(kind)
}

/** The one who asks for a file, as the entry route already let them in. */
export interface DocumentReader {
  /** They are the entry's own entrant (the pilot). */
  isEntrant: boolean
  /**
   * The roles they hold in the competition themselves: a site administrator's organiser rights
   * everywhere do not count here.
   */
  rolesHeld: readonly Role[]
}

/** Under which role an opening of a medical or licence file is logged. */
export const DOCUMENT_VIEWER_ROLES = ['entrant', 'scrutineer', 'organiser'] as const
export type DocumentViewerRole = (typeof DOCUMENT_VIEWER_ROLES)[number]
export const DOCUMENT_VIEWER_ROLE_LABELS: Record<DocumentViewerRole, string> = {
  entrant: 'Pilot',
  scrutineer: 'Scrutineer',
  organiser: 'Organiser',
}

export type DocumentFileDecision =
  | { allowed: true, logged: false }
  | { allowed: true, logged: true, as: DocumentViewerRole }
  | { allowed: false, status: 403, message: string }

/**
 * Whether the file of a document of `kind` may be sent to `reader`, who has already passed the
 * entry's access (its entrant, or staff of the competition, site administrators included;
 * anyone else was told 404 before this is asked).
 * - Airworthiness, insurance and other documents: yes, as before, and not logged: they are the
 *   glider's papers, not the pilot's health or identity.
 * - Medical and licence: only the pilot, and those holding the scrutineer or organiser role in
 *   this very competition; every opening logged under the role that let them in (the pilot
 *   first, then scrutineer, then organiser). The director and a site administrator without
 *   such a role get 403: they see the kind, validity and review outcome in the lists.
 */
export function decideDocumentFile(kind: DocumentKind, reader: DocumentReader): DocumentFileDecision {
  if (!isPersonalDocument(kind)) return { allowed: true, logged: false }
  if (reader.isEntrant) return { allowed: true, logged: true, as: 'entrant' }
  if (reader.rolesHeld.includes('scrutineer')) return { allowed: true, logged: true, as: 'scrutineer' }
  if (reader.rolesHeld.includes('organiser')) return { allowed: true, logged: true, as: 'organiser' }
  return { allowed: false, status: 403, message: MESSAGES.personalDocumentNeedToKnow }
}

/** For pages: offer to open the file only where the route will serve it. */
export function canOpenDocumentFile(kind: DocumentKind, reader: DocumentReader): boolean {
  return decideDocumentFile(kind, reader).allowed
}

/** The line shown in place of the link where the file is not for this reader. */
export const NEED_TO_KNOW_NOTE = 'Only the pilot, scrutineers and organisers open medical and licence files.'

/**
 * Who reads an entry's log of openings: its pilot, and the competition's organisers (site
 * administrators count as organisers here: the log holds who looked, not the files, and is
 * how misuse is found). The director and scrutineers get 403. As with every entry route,
 * `roles` are the caller's effective roles after the entry's access let them in.
 */
export function decideEntryDocumentViews(caller: { isOwner: boolean, roles: readonly Role[] }):
  { allowed: true } | { allowed: false, status: 403, message: string } {
  if (caller.isOwner || caller.roles.includes('organiser')) return { allowed: true }
  return { allowed: false, status: 403, message: MESSAGES.documentViewsPilotOrOrganiser }
}
