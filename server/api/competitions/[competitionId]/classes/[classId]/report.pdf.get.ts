// GET /api/competitions/:competitionId/classes/:classId/report.pdf — the competition's staff. The
// glider report of every accepted entry of the class, each from a new page, as an A4 PDF.
import { classReportParamsSchema } from '#shared/schemas/reports'
import { classReport, reportFilename } from '#domain/reports/entry-report'
import { renderGliderReport } from '#domain/reports/entry-report-pdf'

export default defineApiHandler(async (event) => {
  const { competitionId, classId } = await validParams(event, classReportParamsSchema)
  const access = await requireRole(event, competitionId, 'any')
  const { report, className } = await classReport(access, classId)
  const pdf = await renderGliderReport(report)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `attachment; filename="${reportFilename(access.competition.slug, className)}"`,
    'cache-control': 'no-store',
  })
  return pdf
})
