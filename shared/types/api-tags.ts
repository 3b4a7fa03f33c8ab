// What the tag routes answer.

/** The current tag of an entry, as the organiser's tag page lists it. */
export interface TagInfo {
  id: string
  shortCode: string
  issuedAt: string
}

/** One accepted entry on the organiser's tag page, with its current tag (null: none yet). */
export interface TagListEntry {
  entryId: string
  compId: string
  registration: string
  gliderType: string
  pilotName: string
  classId: string
  className: string
  tag: TagInfo | null
}

export interface TagList {
  entries: TagListEntry[]
}

/** One tag ready to print: what the sticker shows, and the URL its QR code carries. */
export interface PrintableTag extends TagListEntry {
  tag: TagInfo
  /** The absolute URL /t/<token> the QR code encodes. */
  url: string
  /** The QR code as an SVG document (qrcode package), for the browser's print preview. */
  qrSvg: string
}

/** Where a scanned or typed tag leads. */
export interface ResolvedTag {
  competitionId: string
  entryId: string
  compId: string
  /** 'grid': the scrutineer's grid check; 'own': an entrant's own entry page. */
  view: 'grid' | 'own'
}
