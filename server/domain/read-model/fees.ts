// The fee an entry owes, written once in SQL over `entries e`, `classes k` (its class) and
// `competitions c`: the dossier loader reads it for the `entry.paid` finding, the fees area
// for the paid state. The late fee is owed when today, in the competition's time zone, is after
// the late-fee date and the entry had paid (or been waived) nothing by then; so an entry that
// paid in time never owes it, whatever changes later.

export const LATE_FEE_APPLIES_SQL = `(c.late_fee_minor > 0 and c.late_fee_after is not null
  and (now() at time zone c.time_zone)::date > c.late_fee_after
  and (e.first_paid_on is null or e.first_paid_on > c.late_fee_after))`

/** The class's fee plus any late fee, in minor units. */
export const FEE_DUE_SQL = `(k.entry_fee_minor + case when ${LATE_FEE_APPLIES_SQL} then c.late_fee_minor else 0 end)`

/** What is still owed: the fee due less money received (net of refunds) and waivers. */
export const OWED_SQL = `greatest(${FEE_DUE_SQL} - e.paid_minor - e.waived_minor, 0)`
