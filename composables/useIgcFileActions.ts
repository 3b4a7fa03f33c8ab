/**
 * Uploads an IGC file to one entry ($fetch, multipart), for a named recorder or none, and names
 * the recorder of a file uploaded without one. Errors
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
    /** Says which flight recorder a current file came from. */
    nameRecorder: (igcFileId: string, unitId: string) =>
      $fetch(`${base()}/${encodeURIComponent(igcFileId)}/recorder`, { method: 'PUT', body: { unitId } }),
  }
}
