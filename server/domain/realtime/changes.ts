// What one transaction changed on the boards: tiles and days numbered in the competition's
// sequence, and entrants' news. Collected while the transaction runs and pushed by the
// realtime area once (and only if) it committed (server/domain/board/transaction.ts).
import type { BoardDayEvent, BoardTileEvent, EntryReadinessEvent } from '#shared/types/api-board'

export interface EntrantNotice {
  userId: string
  event: EntryReadinessEvent
}

export class BoardChanges {
  readonly tiles: BoardTileEvent[] = []
  readonly days: BoardDayEvent[] = []
  readonly entrants: EntrantNotice[] = []
  get empty() {
    return !this.tiles.length && !this.days.length && !this.entrants.length
  }
}
