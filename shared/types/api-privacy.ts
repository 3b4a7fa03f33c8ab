// API answers of the privacy notices: a competition's notice and the site's list of them.

/** What a competition's notice is filled from: its set-up, its organisers and its rules. */
export interface PrivacyNoticeFacts {
  competitionName: string
  airfieldName: string
  /** YYYY-MM-DD, or null while the organiser has not set it. */
  firstContestDay: string | null
  lastContestDay: string | null
  /** The organisers' names, sorted: together they are the controller. */
  organisers: string[]
  /** The competition's privacy contact (set-up); null when it has none. */
  contactEmail: string | null
  /** Licence and medical files are deleted this many days after the last contest day (rules). */
  medicalRetentionDays: number
  /** The day that many days after the last contest day, or null while it is not set. */
  medicalDeletedAfter: string | null
  /** A superseded copy of any document is deleted this many days after its replacement is accepted. */
  supersededRetentionDays: number
}

/** One item of a list in the notice: a short term and what it says. */
export interface PrivacyNoticeItem {
  term: string
  text: string
}

/** One section of a notice: a heading, its paragraphs, then an optional list. */
export interface PrivacyNoticeSection {
  id: string
  title: string
  paragraphs: string[]
  items: PrivacyNoticeItem[]
}

/** GET /api/competitions/:competitionId/privacy-notice — public. */
export interface CompetitionPrivacyNotice {
  competitionId: string
  facts: PrivacyNoticeFacts
  sections: PrivacyNoticeSection[]
  /** A digest of the notice as it reads now; an entry records the one its pilot confirmed. */
  version: string
  /** The date of the notice's wording (changes of the competition's facts change `version` too). */
  revision: string
}

/** One competition open for registration, in the site's notice. */
export interface PrivacyNoticeListItem {
  competitionId: string
  name: string
  airfieldName: string
  firstContestDay: string | null
  lastContestDay: string | null
}

/** GET /api/privacy-notices — public: the site's own notice and the open competitions' notices. */
export interface SitePrivacyNotice {
  sections: PrivacyNoticeSection[]
  revision: string
  competitions: PrivacyNoticeListItem[]
}
