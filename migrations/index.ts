// Every migration, imported statically so the bundled server and vitest can run them
// without scanning a directory. Add a new migration here in name order.
import type { Knex } from 'knex'
import * as m20261201000100 from './20261201000100_users'
import * as m20261201000200 from './20261201000200_competitions'
import * as m20261201000300 from './20261201000300_memberships'
import * as m20261201000400 from './20261201000400_audit_log'
import * as m20261201000500 from './20261201000500_rate_limits'
import * as m20261202000100 from './20261202000100_competition_rules'
import * as m20261202000200 from './20261202000200_entries'
import * as m20261202000300 from './20261202000300_units'
import * as m20261202000400 from './20261202000400_firmware_catalogue'
import * as m20261202000500 from './20261202000500_mail_outbox'
import * as m20261203000050 from './20261203000050_entry_payment_status'
import * as m20261203000100 from './20261203000100_invitations'
import * as m20261203000200 from './20261203000200_mail_reminders'
import * as m20261203000210 from './20261203000210_payments'
import * as m20261203000300 from './20261203000300_documents'
import * as m20261203000310 from './20261203000310_igc_files'
import * as m20261203000500 from './20261203000500_entry_table_indexes'
import * as m20261204000100 from './20261204000100_tags'
import * as m20261204000200 from './20261204000200_grid_checks'
import * as m20261205000100 from './20261205000100_board'
import * as m20261205000200 from './20261205000200_director_actions'
import * as m20261205000300 from './20261205000300_socket_attachments'
import * as m20261205000400 from './20261205000400_board_tile_order'
import * as m20261206000100 from './20261206000100_scrutineering_facts'
import * as m20261206000200 from './20261206000200_changed_after_acceptance'
import * as m20261206000300 from './20261206000300_entry_messages'
import * as m20261207000300 from './20261207000300_waiver_withdrawal'
import * as m20261208000100 from './20261208000100_payments_any_way'
import * as m20261208000200 from './20261208000200_reminder_schedule'
import * as m20261209000100 from './20261209000100_account_tokens'
import * as m20261209000200 from './20261209000200_deleted_accounts'
import * as m20261209000500 from './20261209000500_outbox_secret_bodies'
import * as m20261210000400 from './20261210000400_audit_log_forgets'
import * as m20261210000300 from './20261210000300_document_file_retention'
import * as m20261210000200 from './20261210000200_document_views'
import * as m20261210000100 from './20261210000100_file_key_ids'
import * as m20261210000500 from './20261210000500_entry_privacy_confirmation'

type Migration = Knex.Migration

const migrations: Record<string, Migration> = {
  '20261201000100_users': m20261201000100,
  '20261201000200_competitions': m20261201000200,
  '20261201000300_memberships': m20261201000300,
  '20261201000400_audit_log': m20261201000400,
  '20261201000500_rate_limits': m20261201000500,
  '20261202000100_competition_rules': m20261202000100,
  '20261202000200_entries': m20261202000200,
  '20261202000300_units': m20261202000300,
  '20261202000400_firmware_catalogue': m20261202000400,
  '20261202000500_mail_outbox': m20261202000500,
  '20261203000050_entry_payment_status': m20261203000050,
  '20261203000100_invitations': m20261203000100,
  '20261203000200_mail_reminders': m20261203000200,
  '20261203000210_payments': m20261203000210,
  '20261203000300_documents': m20261203000300,
  '20261203000310_igc_files': m20261203000310,
  '20261203000500_entry_table_indexes': m20261203000500,
  '20261204000100_tags': m20261204000100,
  '20261204000200_grid_checks': m20261204000200,
  '20261205000100_board': m20261205000100,
  '20261205000200_director_actions': m20261205000200,
  '20261205000300_socket_attachments': m20261205000300,
  '20261205000400_board_tile_order': m20261205000400,
  '20261206000100_scrutineering_facts': m20261206000100,
  '20261206000200_changed_after_acceptance': m20261206000200,
  '20261206000300_entry_messages': m20261206000300,
  '20261207000300_waiver_withdrawal': m20261207000300,
  '20261208000100_payments_any_way': m20261208000100,
  '20261208000200_reminder_schedule': m20261208000200,
  '20261209000100_account_tokens': m20261209000100,
  '20261209000200_deleted_accounts': m20261209000200,
  '20261209000500_outbox_secret_bodies': m20261209000500,
  '20261210000400_audit_log_forgets': m20261210000400,
  '20261210000300_document_file_retention': m20261210000300,
  '20261210000200_document_views': m20261210000200,
  '20261210000100_file_key_ids': m20261210000100,
  '20261210000500_entry_privacy_confirmation': m20261210000500,
}

export const migrationSource: Knex.MigrationSource<string> = {
  getMigrations: async () => Object.keys(migrations).sort(),
  getMigrationName: (name) => name,
  getMigration: async (name) => {
    const migration = migrations[name]
    if (!migration) throw new Error(`Unknown migration ${name}`)
    return migration
  },
}
