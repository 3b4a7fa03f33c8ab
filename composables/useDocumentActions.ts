import type { DocumentUpload, ReviewBody } from '#shared/schemas/files'

/**
 * Uploads to one entry's documents ($fetch, multipart). Errors are thrown for the form to
 * show; callers refresh useEntryDocuments afterwards.
 */
export function useDocumentActions(competitionId: MaybeRefOrGetter<string>, entryId: MaybeRefOrGetter<string>) {
  const base = () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/entries/${encodeURIComponent(toValue(entryId))}/documents`
  return {
    upload: (values: DocumentUpload & { file: File }) => {
      const form = new FormData()
      form.append('kind', values.kind)
      form.append('expiresOn', values.expiresOn)
      form.append('file', values.file, values.file.name)
      return $fetch(base(), { method: 'POST', body: form })
    },
  }
}

/** The scrutineers' review of a queued document ($fetch); callers refresh useDocumentQueue afterwards. */
export function useDocumentReviewActions(competitionId: MaybeRefOrGetter<string>) {
  const base = () => `/api/competitions/${encodeURIComponent(toValue(competitionId))}/documents`
  return {
    review: (documentId: string, body: ReviewBody) => $fetch(`${base()}/${encodeURIComponent(documentId)}/review`, { method: 'POST', body }),
  }
}
