// An upload refused for its size (413), type (415) or content (400 without fields) belongs to
// the file field: re-shape it as a 400 with that field's message so the form shows it there.
export function fileFieldError(error: unknown): unknown {
  const status = apiStatus(error)
  const body = apiErrorBody(error)
  const hasFields = Boolean(body.data?.fieldErrors && Object.keys(body.data.fieldErrors).length)
  if ((status === 413 || status === 415 || (status === 400 && !hasFields)) && typeof body.message === 'string') {
    return { status: 400, data: { statusCode: 400, message: body.message, data: { fieldErrors: { file: [body.message] }, formErrors: [] } } }
  }
  return error
}
