import type { TagSelection } from '#shared/schemas/tags'
import type { TagList, TagListEntry } from '#shared/types/api-tags'

/** The organiser's tag actions ($fetch); callers refresh useTags afterwards. */
export function useTagActions(competitionId: MaybeRefOrGetter<string>) {
  const base = () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}`
  const tag = (entryId: string) => `${base()}/entries/${encodeURIComponent(entryId)}/tag`
  return {
    issue: (selection: TagSelection) => $fetch<TagList>(`${base()}/tags`, { method: 'POST', body: selection }),
    reissue: (entryId: string) => $fetch<TagListEntry>(`${tag(entryId)}/reissue`, { method: 'POST' }),
    revoke: (entryId: string) => $fetch<TagListEntry>(`${tag(entryId)}/revoke`, { method: 'POST' }),
  }
}
