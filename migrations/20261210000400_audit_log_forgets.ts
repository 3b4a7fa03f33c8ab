import type { Knex } from 'knex'

// The audit log forgets personal values, and nothing else changes in it.
// - The append-only trigger lets one kind of UPDATE through: while the transaction-local
//   setting `gridmark.audit_forgetting` is on (as `audit_log_forget` sets it), and then only the
//   details may change. DELETE, and an UPDATE of any other column or without the setting, are
//   refused as before. (TRUNCATE stays possible for a demo re-seed.)
// - `audit_log_forget(ids, details)` rewrites the details of the given rows: erasing an account
//   (server/domain/audit/forget.ts) and this migration use it.
// - The rows already written lose their personal values, by the rule of
//   server/domain/audit/personal-fields.ts as it stands today (frozen here): a change of a
//   personal field keeps only that it changed; addresses go; the pilot's own reason for
//   withdrawing goes; names quoted in finding reasons become "…".
// Going down restores the strict trigger; what was forgotten stays forgotten.

const PERSONAL_FIELDS = ['pilotName', 'copilotName', 'crewNames', 'pilotNationality', 'pilotLicenceNumber', 'pilotPhone', 'emergencyContact']
const PERSONAL_KEYS = ['email', 'invitedEmail', 'acceptedEmail', 'organiserEmail', 'address', 'dateOfBirth', ...PERSONAL_FIELDS]
const NAME_FIELDS = ['pilotName', 'copilotName']

function scrubbed(value: unknown, names: readonly string[]): unknown {
  const needles = [...new Set(names.map(n => n.trim()).filter(n => n.length >= 3))].sort((a, b) => b.length - a.length)
  if (!needles.length) return value
  const pattern = new RegExp(needles.map(n => n.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')).join('|'), 'gi')
  const walk = (v: unknown): unknown => {
    if (typeof v === 'string') return v.replace(pattern, '…')
    if (Array.isArray(v)) return v.map(walk)
    if (v && typeof v === 'object') return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, walk(x)]))
    return v
  }
  return walk(value)
}

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE OR REPLACE FUNCTION audit_log_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'UPDATE' AND current_setting('gridmark.audit_forgetting', true) = 'on'
         AND NEW.id = OLD.id AND NEW.at = OLD.at AND NEW.action = OLD.action AND NEW.subject_type = OLD.subject_type
         AND NEW.actor_user_id IS NOT DISTINCT FROM OLD.actor_user_id
         AND NEW.competition_id IS NOT DISTINCT FROM OLD.competition_id
         AND NEW.subject_id IS NOT DISTINCT FROM OLD.subject_id THEN
        RETURN NEW;
      END IF;
      RAISE EXCEPTION 'audit_log is append-only' USING ERRCODE = 'insufficient_privilege';
    END $$;
  `)
  await knex.raw(`
    CREATE FUNCTION audit_log_forget(row_ids bigint[], new_details jsonb[]) RETURNS integer LANGUAGE plpgsql AS $$
    DECLARE changed integer;
    BEGIN
      IF coalesce(array_length(row_ids, 1), 0) <> coalesce(array_length(new_details, 1), 0) THEN
        RAISE EXCEPTION 'audit_log_forget: as many details as rows';
      END IF;
      PERFORM set_config('gridmark.audit_forgetting', 'on', true);
      UPDATE audit_log a SET details = d.details FROM unnest(row_ids, new_details) AS d(id, details) WHERE a.id = d.id;
      GET DIAGNOSTICS changed = ROW_COUNT;
      PERFORM set_config('gridmark.audit_forgetting', 'off', true);
      RETURN changed;
    END $$;
  `)

  // Names quoted in finding reasons, first, while the changes of names still say what they were.
  const history: { entry_id: string, from: string | null, to: string | null }[] = await knex('audit_log')
    .where({ action: 'entry.updated' }).whereRaw(`details->>'field' = ANY(?)`, [NAME_FIELDS])
    .select('subject_id as entry_id', knex.raw(`details->>'from' as "from"`), knex.raw(`details->>'to' as "to"`))
  const current: { entry_id: string, name: string | null }[] = await knex.raw(`
    SELECT e.id::text AS entry_id, n AS name FROM entries e CROSS JOIN LATERAL unnest(ARRAY[e.pilot_name, e.copilot_name]) n
    UNION SELECT f.entry_id::text, n FROM igc_files f CROSS JOIN LATERAL unnest(ARRAY[f.pilot, f.copilot]) n
  `).then((r: { rows: { entry_id: string, name: string | null }[] }) => r.rows)
  const namesOf = new Map<string, string[]>()
  const add = (entryId: string, name: string | null) => {
    if (name) namesOf.set(entryId, [...(namesOf.get(entryId) ?? []), name])
  }
  for (const h of history) { add(h.entry_id, h.from); add(h.entry_id, h.to) }
  for (const c of current) add(c.entry_id, c.name)

  const quoting: { id: string, entry_id: string | null, details: Record<string, unknown> }[] = await knex('audit_log')
    .whereIn('action', ['findings.changed', 'director.waiver'])
    .select('id', 'details', knex.raw(`coalesce(details->>'entryId', subject_id) as entry_id`))
  const ids: string[] = []
  const details: string[] = []
  for (const row of quoting) {
    const after = scrubbed(row.details, namesOf.get(row.entry_id ?? '') ?? [])
    if (JSON.stringify(after) === JSON.stringify(row.details)) continue
    ids.push(row.id)
    details.push(JSON.stringify(after))
  }
  if (ids.length) await knex.raw('SELECT audit_log_forget(?::bigint[], ?::jsonb[])', [ids, details])

  await knex.raw(`SELECT set_config('gridmark.audit_forgetting', 'on', true)`)
  await knex.raw(`
    UPDATE audit_log SET details = (details - 'from' - 'to') || '{"changed": true}'
    WHERE details->>'field' = ANY(?) AND (details->'from' IS NOT NULL OR details->'to' IS NOT NULL)
  `, [PERSONAL_FIELDS])
  await knex.raw(`UPDATE audit_log SET details = details - ?::text[] WHERE jsonb_exists_any(details, ?::text[])`, [PERSONAL_KEYS, PERSONAL_KEYS])
  await knex.raw(`
    UPDATE audit_log SET details = (details - 'reason') || '{"reasonGiven": true}'
    WHERE action = 'entry.withdrawn' AND details->>'by' = 'entrant' AND details->'reason' IS NOT NULL
  `)
  await knex.raw(`SELECT set_config('gridmark.audit_forgetting', 'off', true)`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP FUNCTION IF EXISTS audit_log_forget(bigint[], jsonb[])')
  await knex.raw(`
    CREATE OR REPLACE FUNCTION audit_log_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'audit_log is append-only' USING ERRCODE = 'insufficient_privilege';
    END $$;
  `)
}
