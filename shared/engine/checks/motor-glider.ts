// A motor glider's flight recorder records the use of its engine.
import { HARDWARE_CAUTION } from '../caution'
import type { Check } from '../types'
import { latestIgcFiles } from './declaration'

/**
 * The I-record codes that record engine use: ENL (engine noise level) and RPM (IGC GNSS FR
 * specification Appendix A, A7 three-letter codes, 2008 edition), MOP (means of propulsion,
 * the sensor the second edition of 2010 asks for) and CUR (the electric motor's current:
 * `from memory`, not found in the editions read).
 */
export const ENGINE_RECORDING_CODES = ['ENL', 'MOP', 'RPM', 'CUR'] as const

const KIND_WORDS = { 'self-launching': 'self-launching', 'sustainer': 'sustainer', 'electric': 'electric' } as const

export const motorGliderEngineRecording: Check = {
  id: 'motor-glider.engine-recording',
  severity: 'blocking',
  source: 'IGC GNSS FR specification Appendix A: A3.4 (I record), A7 (three-letter codes ENL, RPM; MOP from the 2010 edition); FAI Sporting Code Section 3 (motor gliders record the means of propulsion)',
  rule: 'A motor glider (self-launching, sustainer or electric) has a current IGC file whose I record declares an engine-recording extension (ENL, MOP, RPM or the electric-current extension).',
  run(ctx) {
    const kind = ctx.dossier.entry.motorGlider
    if (!kind || kind === 'none') return []
    const files = latestIgcFiles(ctx)
    const recording = files.some(({ file }) => (file.extensions ?? []).some(c => (ENGINE_RECORDING_CODES as readonly string[]).includes(c.toUpperCase())))
    if (recording) return []
    const what = `The entry is a ${KIND_WORDS[kind]} motor glider`
    return [{
      checkId: this.id,
      severity: 'blocking',
      subject: 'engine-recording',
      caution: HARDWARE_CAUTION,
      reason: files.length
        ? `${what}, but no current IGC file shows that engine use is recorded: its I record lists ${[...new Set(files.flatMap(f => f.file.extensions ?? []))].join(', ') || 'no extensions'}, none of ${ENGINE_RECORDING_CODES.join(', ')}.`
        : `${what}, and no IGC file is uploaded to show that its engine use is recorded.`,
      fixHint: 'Use a flight recorder that records engine use (an engine noise or means-of-propulsion sensor, fitted as the manufacturer says), and upload an IGC file from it.',
    }]
  },
}
