// Reading the header of an IGC file. The valid fixture is invented and hand-written after the
// IGC GNSS FR specification Appendix A (A record first; H records HFDTE, HFPLT, HFCM2, HFGTY,
// HFGID, HFCID, HFCCL, HFFTY, HFRFW; B fixes; G security record, A2.5.7).
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { parseIgc } from '#domain/files/igc-header'

const fixture = (name: string) => readFileSync(new URL(`../../../../fixtures/igc/${name}`, import.meta.url), 'latin1')

describe('parseIgc', () => {
  it('reads the declaration of a valid file (IGC FR specification Appendix A, H records)', () => {
    const result = parseIgc(fixture('valid-declaration.igc'))
    expect(result).toEqual({
      ok: true,
      errors: [],
      header: {
        flightDate: '2026-11-20',
        pilot: 'Marit Dovecote',
        copilot: 'Rowan Ashdown',
        gliderType: 'Kestrel Trainer 15',
        gliderId: 'D-KMOR',
        competitionId: 'KM1',
        competitionClass: 'Standard',
        recorderType: 'Test Recorder Works,TR-1',
        firmwareVersion: '2.4.1',
        hasGRecord: true,
      },
    })
  })

  it('says a file without an A record is not IGC, at line 1', () => {
    const result = parseIgc(fixture('garbage.txt'))
    expect(result).toMatchObject({ ok: false, error: { line: 1, message: 'Missing A record' } })
  })

  it('points a missing date at the first record that needed it', () => {
    const result = parseIgc('AXGMK7Q\r\n\r\nB1201005130000N00745000EA0050000600\r\n')
    expect(result).toMatchObject({ ok: false, error: { line: 3, message: 'Missing HFDTE record before first B record' } })
  })

  it('collects broken lines with their numbers and still reads the rest (lenient mode)', () => {
    const text = fixture('valid-declaration.igc').replace('B1201205130040N00745060EA0051000610', 'Bxx')
    const result = parseIgc(text)
    expect(result.ok).toBe(true)
    expect(result.errors).toEqual([{ line: 15, message: 'Invalid B record' }])
  })

  it('notes a missing G record', () => {
    const text = fixture('valid-declaration.igc').split('\n').filter(l => !l.startsWith('G')).join('\n')
    const result = parseIgc(text)
    expect(result.ok && result.header.hasGRecord).toBe(false)
  })

  it('refuses binary data even when it starts like an A record', () => {
    expect(parseIgc('AXGMK7Q\u0000\u0001\u0002').ok).toBe(false)
  })
})
