// SQL for "registration is open today" over `competitions as c`, in each competition's own
// time zone: joining a competition and the list of open competitions' notices read the same.

/** Today in the competition's (aliased `c`) time zone. */
export const TODAY_SQL = `(now() at time zone c.time_zone)::date`

/** Today lies within the registration window (an unset end is open). */
export const OPEN_SQL = `((c.registration_opens_on IS NULL OR c.registration_opens_on <= ${TODAY_SQL})
  AND (c.registration_closes_on IS NULL OR c.registration_closes_on >= ${TODAY_SQL}))`
