// The query of the competition's log of openings of medical and licence files.
import { z } from 'zod'

export const DOCUMENT_VIEWS_PAGE_SIZE = 50
/** The newest openings of one entry shown to its pilot. */
export const ENTRY_DOCUMENT_VIEWS_LIMIT = 100

/** GET …/document-views?page=&pageSize= — pages of the log, newest first. */
export const documentViewsQuerySchema = z.object({
  page: z.coerce.number({ error: 'Ask for a page number.' }).int({ error: 'Ask for a whole page number.' })
    .min(1, { error: 'Pages start at 1.' }).max(10_000, { error: 'Ask for a page number up to 10000.' }).default(1),
  pageSize: z.coerce.number({ error: 'Ask for a number of rows.' }).int({ error: 'Ask for a whole number of rows.' })
    .min(1, { error: 'Ask for at least 1 row.' }).max(200, { error: 'Ask for at most 200 rows at a time.' }).default(DOCUMENT_VIEWS_PAGE_SIZE),
})
export type DocumentViewsQuery = z.infer<typeof documentViewsQuerySchema>
