// GET /api/privacy-notices — anyone, signed in or not. The site's own privacy notice and the
// competitions open for registration, each with a notice of its own.
import type { SitePrivacyNotice } from '#shared/types/api-privacy'
import { sitePrivacyNotice } from '#domain/competitions/privacy-notice'

export default defineApiHandler(async (): Promise<SitePrivacyNotice> => sitePrivacyNotice())
