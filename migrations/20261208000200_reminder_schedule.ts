import type { Knex } from 'knex'

// The pre-event reminder goes on a schedule (settings.reminderDays, a list of days before the
// first contest day) instead of once (settings.reminderDaysBefore). A competition that had set
// the single number keeps it as a one-item schedule; one that had not gets the default schedule
// (30, 14 and 3 days) from the reader. Reminders already sent under the old kind 'pre-event'
// take the day count they were sent for, so the same reminder is not sent again.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`UPDATE mail_reminders r SET kind = 'pre-event-' || (
      CASE WHEN c.settings->>'reminderDaysBefore' ~ '^[0-9]{1,3}$' AND (c.settings->>'reminderDaysBefore')::int BETWEEN 1 AND 365
        THEN (c.settings->>'reminderDaysBefore')::int ELSE 14 END)
    FROM entries e JOIN competitions c ON c.id = e.competition_id
    WHERE e.id = r.entry_id AND r.kind = 'pre-event'`)
  await knex.raw(`UPDATE competitions SET settings = (settings - 'reminderDaysBefore') || jsonb_build_object('reminderDays',
      CASE WHEN settings->>'reminderDaysBefore' ~ '^[0-9]{1,3}$' AND (settings->>'reminderDaysBefore')::int BETWEEN 1 AND 365
        THEN jsonb_build_array((settings->>'reminderDaysBefore')::int) ELSE '[30, 14, 3]'::jsonb END)
    WHERE jsonb_exists(settings, 'reminderDaysBefore')`)
}

export async function down(knex: Knex): Promise<void> {
  // Back to one number: the schedule's longest lead time (none: the old default, 14).
  await knex.raw(`UPDATE competitions SET settings = (settings - 'reminderDays') || jsonb_build_object('reminderDaysBefore',
      coalesce((SELECT max(d::int) FROM jsonb_array_elements_text(settings->'reminderDays') AS d), 14))
    WHERE jsonb_exists(settings, 'reminderDays') AND jsonb_typeof(settings->'reminderDays') = 'array'`)
  // One old-style row per entry: its latest reminder of the family.
  await knex.raw(`DELETE FROM mail_reminders r WHERE r.kind LIKE 'pre-event-%' AND EXISTS (
      SELECT 1 FROM mail_reminders o WHERE o.entry_id = r.entry_id AND o.kind LIKE 'pre-event-%' AND o.created_at > r.created_at)`)
  await knex.raw(`UPDATE mail_reminders SET kind = 'pre-event' WHERE kind LIKE 'pre-event-%'`)
  await knex.raw(`DELETE FROM mail_reminders WHERE kind LIKE 'draft-%'`)
}
