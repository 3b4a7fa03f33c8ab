// Row types of the setup area's tables, written by hand to match migrations/.

export interface CompetitionDayRow {
  competition_id: string
  /** read as YYYY-MM-DD text (the type parser in knexfile.ts) */
  day: string
  kind: 'practice' | 'contest'
}
