// The set-up schemas shared by the set-up form and the API.
import { describe, expect, it } from 'vitest'
import { classCreateSchema, competitionSetupSchema, competitionSetupPatchSchema, currencySchema, icaoSchema, isKnownTimeZone, DEFAULT_RULES } from '#shared/schemas/competition'
import { firmwareCsvRowSchema } from '#shared/schemas/firmware'
import { entryTableQuerySchema } from '#shared/schemas/entry-table'
import { FAI_CLASSES, faiClass } from '#shared/constants/classes'
import { csvSafe } from '#shared/utils/csv-safe'

const setup = (over: Record<string, unknown> = {}) => ({
  name: 'Kestrel Test', airfieldName: 'Test Field', airfieldIcao: null, timeZone: 'Europe/Berlin', currency: 'EUR',
  firstContestDay: '2027-05-01', lastContestDay: '2027-05-07', practiceDays: ['2027-04-30'], contestDays: ['2027-05-01', '2027-05-07'],
  registrationOpensOn: '2027-01-01', registrationClosesOn: '2027-04-01', lateFeeAfter: null, lateFeeMinor: 0, reminderDays: [30, 14, 3], rules: DEFAULT_RULES, ...over,
})
const fieldsOf = (r: { success: boolean, error?: { issues: { path: PropertyKey[] }[] } }) => (r.error?.issues ?? []).map(i => String(i.path[0]))

describe('the reminder schedule in the set-up', () => {
  const messagesOf = (r: { error?: { issues: { message: string }[] } }) => (r.error?.issues ?? []).map(i => i.message)

  it('keeps whole days from 1 to 365, largest first; none at all turns reminders off', () => {
    expect(competitionSetupSchema.parse(setup({ reminderDays: [3, 30, 14] })).reminderDays).toEqual([30, 14, 3])
    expect(competitionSetupSchema.parse(setup({ reminderDays: [] })).reminderDays).toEqual([])
    expect(competitionSetupPatchSchema.parse({ reminderDays: [365, 1] }).reminderDays).toEqual([365, 1])
  })

  it('refuses what cannot be a schedule, each with its reason', () => {
    expect(messagesOf(competitionSetupSchema.safeParse(setup({ reminderDays: [0] })))).toEqual(['A reminder goes at least 1 day before the first contest day.'])
    expect(messagesOf(competitionSetupSchema.safeParse(setup({ reminderDays: [400] })))).toEqual(['A reminder goes at most 365 days before the first contest day.'])
    expect(messagesOf(competitionSetupSchema.safeParse(setup({ reminderDays: [2.5] })))).toEqual(['Enter each reminder as a whole number of days, e.g. 30, 14, 3.'])
    expect(messagesOf(competitionSetupSchema.safeParse(setup({ reminderDays: [Number.NaN] })))).toEqual(['Enter each reminder as a whole number of days, e.g. 30, 14, 3.'])
    expect(messagesOf(competitionSetupSchema.safeParse(setup({ reminderDays: [14, 14] })))).toEqual(['A reminder day is listed twice.'])
    expect(messagesOf(competitionSetupSchema.safeParse(setup({ reminderDays: [1, 2, 3, 4, 5, 6, 7] })))).toEqual(['Schedule at most 6 reminders.'])
    expect(fieldsOf(competitionSetupPatchSchema.safeParse({ reminderDays: 14 }))).toEqual(['reminderDays'])
  })
})

describe('competitionSetupSchema', () => {
  it('accepts a consistent set-up', () => {
    expect(competitionSetupSchema.safeParse(setup()).success).toBe(true)
  })
  it('keeps contest days inside the first and last contest day, practice days before', () => {
    expect(fieldsOf(competitionSetupSchema.safeParse(setup({ contestDays: ['2027-05-08'] })))).toEqual(['contestDays'])
    expect(fieldsOf(competitionSetupSchema.safeParse(setup({ practiceDays: ['2027-05-01'] })))).toEqual(['practiceDays'])
    expect(fieldsOf(competitionSetupSchema.safeParse(setup({ contestDays: ['2027-05-02', '2027-05-02'] })))).toEqual(['contestDays'])
  })
  it('needs registration to open no later than it closes', () => {
    expect(fieldsOf(competitionSetupSchema.safeParse(setup({ registrationOpensOn: '2027-04-02' })))).toEqual(['registrationClosesOn'])
    expect(competitionSetupSchema.safeParse(setup({ registrationOpensOn: '2027-04-01' })).success).toBe(true)
  })
  it('starts the late fee inside the registration window', () => {
    expect(fieldsOf(competitionSetupSchema.safeParse(setup({ lateFeeAfter: '2027-04-02' })))).toEqual(['lateFeeAfter'])
    expect(fieldsOf(competitionSetupSchema.safeParse(setup({ lateFeeAfter: '2026-12-31' })))).toEqual(['lateFeeAfter'])
    expect(competitionSetupSchema.safeParse(setup({ lateFeeAfter: '2027-03-01' })).success).toBe(true)
  })
})

describe('time zone, ICAO indicator, currency', () => {
  it('knows IANA zones through Intl', () => {
    expect(isKnownTimeZone('Europe/Berlin')).toBe(true)
    expect(isKnownTimeZone('America/Argentina/Buenos_Aires')).toBe(true)
    expect(isKnownTimeZone('Europe/Atlantis')).toBe(false)
    expect(isKnownTimeZone('')).toBe(false)
  })
  it('takes four letters for an ICAO location indicator (ICAO Doc 7910), upper-cased; empty clears it', () => {
    expect(icaoSchema.parse('edkm')).toBe('EDKM')
    expect(icaoSchema.parse('')).toBeNull()
    expect(icaoSchema.safeParse('ED1M').success).toBe(false)
    expect(icaoSchema.safeParse('EDKMX').success).toBe(false)
  })
  it('takes ISO 4217 currency codes', () => {
    expect(currencySchema.parse('chf')).toBe('CHF')
    expect(currencySchema.safeParse('EURO').success).toBe(false)
    expect(currencySchema.safeParse('XYZ').success).toBe(false)
  })
})

describe('FAI class defaults', () => {
  // Source: FAI Sporting Code Section 3 (Gliding) Annex A — from memory, to be checked against the current edition.
  it('lists the FAI classes with span and MTOM limits', () => {
    expect(faiClass('15m')).toMatchObject({ maxSpanM: 15, maxMtomKg: 525, waterBallast: true })
    expect(faiClass('18m')).toMatchObject({ maxSpanM: 18, maxMtomKg: 600, waterBallast: true })
    expect(faiClass('open')).toMatchObject({ maxSpanM: null, maxMtomKg: 850 })
    expect(faiClass('club')).toMatchObject({ waterBallast: false })
    expect(new Set(FAI_CLASSES.map(c => c.code)).size).toBe(FAI_CLASSES.length)
  })
  it('lets a new class leave every limit to the defaults, or override it', () => {
    expect(classCreateSchema.parse({ code: '18m' })).toEqual({ code: '18m' })
    expect(classCreateSchema.parse({ code: 'club', maxMtomKg: null })).toEqual({ code: 'club', maxMtomKg: null })
    expect(classCreateSchema.safeParse({ code: 'club', colour: 'red' }).success).toBe(false)
  })
})

describe('firmware CSV rows and the entries table query', () => {
  it('checks each CSV line with one message per field', () => {
    const r = firmwareCsvRowSchema.safeParse({ unit_family: 'A', version: '1', expires_on: '2028-02-30' })
    expect(r.success).toBe(false)
    expect(r.error!.issues.map(i => i.message)).toEqual(['That date does not exist.'])
  })
  it('reads query text into sort, paging and filters, blank meaning unset', () => {
    expect(entryTableQuerySchema.parse({ page: '3', pageSize: '50', status: '', q: ' kes ' })).toEqual({ page: 3, pageSize: 50, sort: 'compId', direction: 'asc', findings: 'any', q: 'kes' })
    expect(entryTableQuerySchema.safeParse({ pageSize: '101' }).success).toBe(false)
    expect(entryTableQuerySchema.parse({ findings: 'blocking' }).findings).toBe('blocking')
    expect(entryTableQuerySchema.safeParse({ findings: 'some' }).success).toBe(false)
  })
})

describe('csvSafe', () => {
  // Source: OWASP "CSV Injection".
  it('defuses cells starting with = + - @ tab or carriage return, leaves others', () => {
    expect(['=1+1', '+49', '-2', '@SUM(A1)', '\tx', '\rx'].map(csvSafe)).toEqual(['\'=1+1', '\'+49', '\'-2', '\'@SUM(A1)', '\'\tx', '\'\rx'])
    expect(csvSafe('D-1234')).toBe('D-1234')
    expect(csvSafe('')).toBe('')
  })
})
