import { describe, expect, it } from 'vitest'
import { auditCursorOf, auditQuerySchema } from '#shared/schemas/board'

// The audit page's cursor: the last row's UTC time (to the microsecond) and id.
describe('audit cursor', () => {
  it('reads the time and id back exactly as written', () => {
    const parsed = auditQuerySchema.parse({ before: '2027-05-01T08:00:12.345678Z_42' })
    expect(parsed.before).toEqual({ at: '2027-05-01T08:00:12.345678Z', id: 42 })
    expect(auditCursorOf(parsed.before!)).toBe('2027-05-01T08:00:12.345678Z_42')
  })

  it('refuses anything else in words, never reaching the database', () => {
    for (const bad of ['42', '', '2027-05-01_42', '2027-02-30T08:00:00Z_1', '2027-05-01T24:00:00Z_1', '2027-05-01T08:00:00Z_-1', '2027-05-01T08:00:00+02:00_1']) {
      const result = auditQuerySchema.safeParse({ before: bad })
      expect(result.success, bad).toBe(false)
      expect(result.error!.issues[0]!.message).toBe('This page link of the audit log is not valid: start again from the newest rows.')
    }
  })
})
