// An IGC recorder ID as people read it: the A record's manufacturer code and serial id apart
// ("XKM487" → "XKM-487"); a serial id alone stays as it is.
export function formatRecorderId(id: string | null | undefined): string {
  const v = (id ?? '').toUpperCase().replace(/[^A-Z0-9]/g, '')
  return v.length === 6 ? `${v.slice(0, 3)}-${v.slice(3)}` : v
}
