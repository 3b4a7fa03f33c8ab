// Every answer of a handler (a page's HTML, the API's JSON, a CSV) goes gzipped to a client
// that takes gzip, when it is large enough to gain (server/utils/compression.ts): the grid phone
// on a weak signal loads a page's HTML at a third to a quarter of its size and the day's pack
// at a fifth. Files, PDFs and answers encoded already go as they are. A reverse proxy in front
// leaves an encoded answer alone.
import { gzippedAnswer } from '#server/utils/compression'

export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('beforeResponse', async (event, response) => {
    const zipped = await gzippedAnswer(event, response.body)
    if (zipped) response.body = zipped
  })
})
