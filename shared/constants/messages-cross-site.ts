// API messages of cross-site protection; merged into MESSAGES by messages.ts.
export const CROSS_SITE_MESSAGES = {
  crossSiteRefused: 'This change was sent from another website, so it was refused. Open Gridmark itself and try again there.',
  bodyTypeRefused: 'This change must be sent by the Gridmark app itself (as JSON, or a file upload), not by a plain web form, so it was refused.',
  bodyTypeUnsupported: 'This kind of request body is not accepted. Send JSON, or a file as a form upload.',
  socketOriginRefused: 'The live board only connects from Gridmark’s own pages.',
} as const
