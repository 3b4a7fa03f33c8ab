// The staff entries table: sort, filters, search and paging, as query parameters.
import { z } from 'zod'
import { ENTRY_STATUSES, PAYMENT_STATUSES } from '../constants/entries'

export const ENTRY_TABLE_SORTS = ['compId', 'pilot', 'class', 'status', 'payment', 'submitted'] as const
export type EntryTableSort = (typeof ENTRY_TABLE_SORTS)[number]

export const ENTRY_TABLE_MAX_PAGE_SIZE = 100

/** The findings filter: every entry, those with a blocking finding, with an advisory one, with none. */
export const FINDINGS_FILTERS = ['any', 'blocking', 'advisory', 'none'] as const
export type FindingsFilter = (typeof FINDINGS_FILTERS)[number]

/** Query values arrive as text; an empty value means "not set". */
const blankToUndefined = (v: unknown) => (v === '' || v === null ? undefined : v)

export const entryTableFilterSchema = z.object({
  class: z.preprocess(blankToUndefined, z.uuid({ error: 'Choose a class from the list.' }).optional()),
  status: z.preprocess(blankToUndefined, z.enum(ENTRY_STATUSES, { error: 'Choose a status from the list.' }).optional()),
  payment: z.preprocess(blankToUndefined, z.enum(PAYMENT_STATUSES, { error: 'Choose a payment state from the list.' }).optional()),
  findings: z.preprocess(blankToUndefined, z.enum(FINDINGS_FILTERS, { error: 'Filter findings by any, blocking, advisory or none.' }).default('any')),
  q: z.preprocess(blankToUndefined, z.string().trim().max(100, { error: 'Keep the search under 100 characters.' }).optional()),
  sort: z.preprocess(blankToUndefined, z.enum(ENTRY_TABLE_SORTS, { error: 'Sort by one of the table’s columns.' }).default('compId')),
  direction: z.preprocess(blankToUndefined, z.enum(['asc', 'desc'], { error: 'Sort asc or desc.' }).default('asc')),
})

export const entryTableQuerySchema = entryTableFilterSchema.extend({
  page: z.preprocess(blankToUndefined, z.coerce.number({ error: 'The page is a number.' }).int({ error: 'The page is a whole number.' }).min(1, { error: 'Pages start at 1.' }).max(100_000).default(1)),
  pageSize: z.preprocess(blankToUndefined, z.coerce.number({ error: 'The page size is a number.' }).int({ error: 'The page size is a whole number.' }).min(1, { error: 'Show at least one entry a page.' }).max(ENTRY_TABLE_MAX_PAGE_SIZE, { error: `Show at most ${ENTRY_TABLE_MAX_PAGE_SIZE} entries a page.` }).default(25)),
})
export type EntryTableQuery = z.output<typeof entryTableQuerySchema>
export type EntryTableFilter = z.output<typeof entryTableFilterSchema>
