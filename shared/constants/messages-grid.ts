// API messages of grid checks; merged into MESSAGES by messages.ts.
export const GRID_MESSAGES = {
  gridEntryOtherCompetition: 'That entry belongs to another competition; scan the glider’s tag again from this competition’s grid page.',
  gridEntryNotFound: 'No such entry. Scan the glider’s tag again.',
  gridEntryNotAccepted: 'Only accepted entries are checked on the grid; this one is not accepted.',
  gridReplayConflict: 'A different grid check was already recorded under this key. Nothing was changed; submit the check again as a new one.',
  gridUnknownItem: (itemId: string) => `“${itemId}” is not on this competition’s checklist; reload the grid page to get the current checklist.`,
  gridDuplicateItem: (itemId: string) => `“${itemId}” is answered twice; answer each checklist item once.`,
  gridDayOutOfRange: 'A grid check is for today or a recent day (within 14 days), not for a day in the future.',
  gridUnitShownUnknown: 'The version shown is for a collision-warning unit this glider no longer has in its dossier. Reload the glider on the grid and record what its unit shows again.',
} as const
