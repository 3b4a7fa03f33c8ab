// Every message the API answers with, worded for the person who reads it: the common ones
// here, each area's in messages-<area>.ts (one file per area keeps changes apart).
import { MAIL_MESSAGES } from './messages-mail'
import { PAYMENTS_MESSAGES } from './messages-payments'
import { FILES_MESSAGES } from './messages-files'
import { ENTRIES_MESSAGES } from './messages-entries'
import { SETUP_MESSAGES } from './messages-setup'
import { TAGS_MESSAGES } from './messages-tags'
import { GRID_MESSAGES } from './messages-grid'
import { BOARD_MESSAGES } from './messages-board'
import { ACCOUNT_PAGE_MESSAGES } from './messages-account-page'
import { INVITATIONS_MESSAGES } from './messages-invitations'
import { ACCOUNT_MESSAGES } from './messages-account'
import { UPLOAD_STREAM_MESSAGES } from './messages-upload-stream'
import { STORED_FILES_MESSAGES } from './messages-stored-files'
import { CROSS_SITE_MESSAGES } from './messages-cross-site'
import { RETENTION_MESSAGES } from './messages-retention'
import { DOCUMENTS_ACCESS_MESSAGES } from './messages-documents-access'
import { PRIVACY_MESSAGES } from './messages-privacy'
import { ACCESS_MESSAGES } from './messages-access'

export const MESSAGES = {
  invalidInput: 'Some fields need attention.',
  invalidJson: 'The request body is not valid JSON.',
  sessionEnded: 'Your session has ended. Please sign in again.',
  badCredentials: 'That e-mail address and password do not match an account.',
  emailTaken: 'An account with this e-mail address already exists. Sign in instead, or use another address.',
  tooManyAttempts: (minutes: number) =>
    `Too many sign-in attempts. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`,
  adminRequired: 'Only a site administrator can do this.',
  notFound: 'Nothing was found at this address.',
  entryNotFound: 'No such entry in this competition, or it is not yours.',
  entrantOnly: 'Only the entry’s own entrant can do this.',
  conflict: 'That would clash with a record that already exists.',
  referenceMissing: 'It refers to something that does not exist (any more).',
  databaseDown: 'The database is not reachable just now. Nothing was changed; please try again in a moment.',
  unexpected: 'Something went wrong on our side. Nothing was changed; please try again.',

  // ——— Withdrawals and the reminder schedule ———
  withdrawEntrantOrOrganiser: 'Only the entry’s own entrant, or the competition’s organiser for the pilot, can withdraw it.',
  withdrawReasonRequired: 'Say why the office withdraws this entry: the pilot is told the reason.',
  withdrawReasonTooLong: 'Keep the reason under 1000 characters.',
  reminderDayWhole: 'Enter each reminder as a whole number of days, e.g. 30, 14, 3.',
  reminderDayTooSoon: 'A reminder goes at least 1 day before the first contest day.',
  reminderDayTooEarly: (max: number) => `A reminder goes at most ${max} days before the first contest day.`,
  reminderDaysList: 'Send the reminder days as a list of numbers.',
  reminderDaysTooMany: (max: number) => `Schedule at most ${max} reminders.`,
  reminderDayTwice: 'A reminder day is listed twice.',

  // Requests that cannot hurt: limits while a body streams, control characters, a busy
  // database, and "nothing was changed" only when that is certain; sign-up throttling.
  tooManySignUps: (minutes: number) =>
    `Too many accounts were requested from this network. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`,
  tooManyResetRequests: (minutes: number) =>
    `Too many password reset requests from this network. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`,
  controlCharacter: 'Remove the invisible control character from this text (only tabs and line breaks can be kept).',
  controlCharacterIn: (field: string) =>
    `Some fields need attention. “${field}” holds an invisible control character; remove it (only tabs and line breaks can be kept).`,
  bodyTooLarge: 'The request is larger than 1 MB, more than any form of Gridmark sends. Shorten the text and try again.',
  webhookTooLarge: 'The payment notification is larger than 1 MB and was not read.',
  serverBusy: 'The server is busy just now. Nothing was changed; please try again in a few seconds.',
  serverBusyUncertain: 'The server is busy just now and could not finish. Part of it may have been saved: reload the page to see what was kept before you try again.',
  databaseDownUncertain: 'The database stopped answering before this could finish. Part of it may have been saved: reload the page to see what was kept before you try again.',
  unexpectedUncertain: 'Something went wrong on our side before this could finish. Part of it may have been saved: reload the page to see what was kept before you try again.',
  gridCheckedAtFuture: 'The time of the check is later than now. Set the phone’s clock (date, time and time zone) and record the check again.',
  gridCheckedAtOutsideDay: (day: string) =>
    `The time of the check does not fall on the contest day ${day}. Check the phone’s date and time, or choose the day the glider was checked.`,
  ...MAIL_MESSAGES,
  ...PAYMENTS_MESSAGES,
  ...FILES_MESSAGES,
  ...ENTRIES_MESSAGES,
  ...SETUP_MESSAGES,
  ...TAGS_MESSAGES,
  ...GRID_MESSAGES,
  ...BOARD_MESSAGES,
  ...ACCOUNT_PAGE_MESSAGES,
  ...INVITATIONS_MESSAGES,
  ...ACCOUNT_MESSAGES,
  ...UPLOAD_STREAM_MESSAGES,
  ...STORED_FILES_MESSAGES,
  ...CROSS_SITE_MESSAGES,
  ...RETENTION_MESSAGES,
  ...DOCUMENTS_ACCESS_MESSAGES,
  ...PRIVACY_MESSAGES,
  ...ACCESS_MESSAGES,

  // --- The tracking list and the glider report (the office's paperwork) ---
  trackingStaffOnly: 'The tracking list is for the competition’s organisers, scrutineers and contest director: it lists every glider’s radio IDs.',
  trackingNoBoard: (day: string) => `No board was opened for ${day}. Leave out the board filter for every accepted entry, or open the day first.`,
  reportClassStaffOnly: 'A class’s glider reports are for the competition’s organisers, scrutineers and contest director; an entrant prints their own entry’s report from the entry page.',
} as const
