// Roles are held per competition; one person may hold several. Site administrators are a
// flag on the user, not a role of any competition.
export const ROLES = ['organiser', 'scrutineer', 'director', 'entrant'] as const
export type Role = (typeof ROLES)[number]

export const ROLE_LABELS: Record<Role, string> = {
  organiser: 'Organiser',
  scrutineer: 'Scrutineer',
  director: 'Contest director',
  entrant: 'Entrant',
}

/** Roles that see every entry of their competition. */
export const STAFF_ROLES: readonly Role[] = ['organiser', 'scrutineer', 'director']
