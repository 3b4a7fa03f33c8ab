// Times shown in the competition's zone read exactly as the browser's own formatting gives
// them (the board and the desk hydrate over the server's HTML without a change), with the
// formatters kept between calls.
import { describe, expect, it } from 'vitest'
import { atInZone, clockInZone, clockOnPhone, dayInWords, dayShort, timeIn } from '~/utils/competitionTime'

const INSTANTS = ['2027-07-10T06:05:09Z', '2027-07-10T22:59:59Z', '2027-12-31T23:30:00Z']
const ZONES = ['Europe/Berlin', 'America/Denver', 'Australia/Adelaide', 'UTC']

describe('times in the competition’s zone', () => {
  it('read as toLocaleString and toLocaleTimeString give them, in every zone, called again and again', () => {
    for (let round = 0; round < 2; round++) {
      for (const iso of INSTANTS) {
        for (const timeZone of ZONES) {
          const at = new Date(iso)
          expect(atInZone(iso, timeZone)).toBe(at.toLocaleString('en-GB', { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit', timeZone }))
          expect(clockInZone(iso, timeZone)).toBe(at.toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit', hourCycle: 'h23', timeZone }))
          expect(timeIn(at, timeZone, true)).toBe(at.toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit', second: '2-digit', hourCycle: 'h23', timeZone }))
        }
      }
    }
    for (const iso of INSTANTS) expect(clockOnPhone(iso)).toBe(new Date(iso).toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit' }))
    expect(clockInZone('2027-07-10T06:05:09Z', 'Europe/Berlin')).toBe('08:05')
    expect(timeIn('2027-07-10T22:59:59Z', 'Europe/Berlin', true)).toBe('00:59:59')
  })

  it('fall back to the screen’s clock for a zone Intl does not know, and to nothing for a bad instant', () => {
    const at = new Date('2027-07-10T06:05:09Z')
    expect(timeIn(at, 'Moon/Tranquility')).toBe(at.toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }))
    expect(timeIn('not a time', 'Europe/Berlin')).toBe('')
  })

  it('name contest days in words, long and short', () => {
    const noon = new Date('2027-07-10T12:00:00Z')
    expect(dayInWords('2027-07-10')).toBe(noon.toLocaleDateString('en-GB', { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' }))
    expect(dayInWords('2027-07-10T09:00:00Z')).toContain('10 July 2027')
    expect(dayShort('2027-07-10')).toBe('Sat 10 Jul')
    expect(dayShort('nonsense')).toBe('nonsense')
  })
})
