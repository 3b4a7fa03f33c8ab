// The security record of an IGC file. Its signature can only be validated with the
// manufacturer's program, which Gridmark does not run; a missing G record is still telling.
import type { Check, Finding } from '../types'
import { latestIgcFiles } from './declaration'

export const igcSecurityRecord: Check = {
  id: 'igc.security-record',
  severity: 'advisory',
  source: 'IGC GNSS FR specification A2.5.7 (required records: the G record)',
  rule: 'The latest IGC file from each recorder has a G record (its signature cannot be validated here).',
  run(ctx) {
    const out: Finding[] = []
    for (const { unitId, label, file } of latestIgcFiles(ctx)) {
      if (file.hasGRecord) continue
      out.push({
        checkId: this.id,
        severity: 'advisory',
        unitId,
        subject: file.id ? `igc:${file.id}` : undefined,
        reason: `The IGC file from ${label} has no security record (G record); it may have been edited or exported by another program.`,
        fixHint: 'Upload the file exactly as the recorder wrote it, downloaded with the recorder’s own download method.',
      })
    }
    return out
  },
}
