/**
 * Uploads an IGC file to one entry ($fetch, multipart), for a named recorder or none. Errors
 * are thrown for the panel to show; callers refresh useEntryIgcFiles afterwards.
 */
export function useIgcFileActions(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>) {
  const base = () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries/${encodeURIComponent(toValue(entryId))}/igc-files`
  return {
    upload: (values: { unitId: string | null, file: File }) => {
      const body = new FormData()
      if (values.unitId) body.append('unitId', values.unitId)
      body.append('file', values.file, values.file.name)
      return $fetch(base(), { method: 'POST', body })
    },
  }
}
