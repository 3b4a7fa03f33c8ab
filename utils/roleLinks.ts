import type { Role } from '#shared/constants/roles'

// The header's links for the roles one holds, and role order: apart from the role guide's longer
// texts (roleGuide.ts), because every signed-in page's header needs only these.
export interface RoleLink {
  label: string
  /** Path below /competitions/<id>, or an absolute path when it starts with '~' (e.g. '~/entries'). */
  path: string
}

export const ROLE_ORDER: readonly Role[] = ['organiser', 'director', 'scrutineer', 'entrant']

/**
 * The header's links per role in each competition held: the page a role works from, and its
 * second most used. Entrants have none here: "My entries" serves every competition at once.
 */
export const HEADER_LINKS: Record<Role, RoleLink[]> = {
  organiser: [
    { label: 'Entries', path: '/entries' },
    { label: 'Set-up', path: '/setup' },
  ],
  director: [
    { label: 'Readiness board', path: '/board' },
    { label: 'Contest days', path: '/days' },
  ],
  scrutineer: [
    { label: 'Launch grid', path: '/grid' },
    { label: 'Document review', path: '/documents' },
  ],
  entrant: [],
}

/** The header links of one competition for the roles held there, once each, in role order. */
export function headerLinksOf(competitionId: string, roles: readonly Role[]): { label: string, to: string }[] {
  const seen = new Set<string>()
  return sortRoles(roles)
    .flatMap(role => HEADER_LINKS[role])
    .filter(link => !seen.has(link.path) && seen.add(link.path))
    .map(link => ({ label: link.label, to: roleLinkTo(competitionId, link.path) }))
}

export function sortRoles(roles: readonly Role[]): Role[] {
  return ROLE_ORDER.filter(r => roles.includes(r))
}

/** The address of a role link in one competition. */
export function roleLinkTo(competitionId: string, path: string): string {
  if (path.startsWith('~')) return path.slice(1)
  return `/competitions/${competitionId}${path}`
}
