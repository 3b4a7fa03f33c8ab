// GET /api/competitions/:competitionId/entries/:entryId/report.pdf — the competition's staff, or
// the entry's own entrant. The glider report (dossier, findings, grid checks, weigh-ins, the
// director's actions) as an A4 PDF download; never a document's content.
import { entryParamsSchema } from '#shared/schemas/params'
import { entryReport, reportFilename } from '#domain/reports/entry-report'
import { renderGliderReport } from '#domain/reports/entry-report-pdf'

export default defineApiHandler(async (event) => {
  const { competitionId, entryId } = await validParams(event, entryParamsSchema)
  const { competition, entry } = await requireEntryAccess(event, competitionId, entryId, 'owner-or-staff')
  const pdf = await renderGliderReport(await entryReport(competition, entry))
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `attachment; filename="${reportFilename(competition.slug, entry.comp_id)}"`,
    'cache-control': 'no-store',
  })
  return pdf
})
