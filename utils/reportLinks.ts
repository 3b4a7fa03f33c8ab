// Addresses of the office's paperwork, downloaded by plain links: the tracking list (CSV or
// JSON, optionally one day's board) and the glider reports (one entry, or a class), as PDF.
const base = (competitionId: string) => `/api/competitions/${encodeURIComponent(competitionId)}`

export function trackingListUrl(competitionId: string, format: 'csv' | 'json', board?: string): string {
  return `${base(competitionId)}/tracking.${format}${board ? `?board=${encodeURIComponent(board)}` : ''}`
}

export function entryReportUrl(competitionId: string, entryId: string): string {
  return `${base(competitionId)}/entries/${encodeURIComponent(entryId)}/report.pdf`
}

export function classReportUrl(competitionId: string, classId: string): string {
  return `${base(competitionId)}/classes/${encodeURIComponent(classId)}/report.pdf`
}
