import type { PrintableTag } from '#shared/types/api-tags'

/** Which tags a sheet shows: one class, chosen entries, or (neither) every current tag. */
export interface TagSheetSelection {
  classId?: string
  entryIds?: string[]
}

/** The query string of a selection, shared by the sheet, its PDF and the print page. */
export function tagSheetQuery(selection: TagSheetSelection): Record<string, string> {
  if (selection.classId) return { classId: selection.classId }
  if (selection.entryIds?.length) return { entryIds: selection.entryIds.join(',') }
  return {}
}

/** GET /api/competitions/:id/tags/sheet — the current tags of a selection, ready to print (organiser). */
export function useTagSheet(competitionId: MaybeRefOrGetter<string>, selection: MaybeRefOrGetter<TagSheetSelection>) {
  const query = computed(() => tagSheetQuery(toValue(selection)))
  return useFetch<{ tags: PrintableTag[] }>(() => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/tags/sheet`, {
    query,
    key: () => `tag-sheet:${toValue(competitionId)}:${JSON.stringify(query.value)}`,
  })
}
