// The security record of an IGC file. Its signature can only be validated with the
// manufacturer's program, which Gridmark does not run; a missing G record is still telling.
import { HARDWARE_CAUTION } from '../caution'
import type { Check, Finding } from '../types'
import { latestIgcFiles } from './declaration'

export const igcSecurityRecord: Check = {
  id: 'igc.security-record',
  severity: 'advisory',
  source: 'IGC GNSS FR specification Appendix A: A2.5.7 (mandatory records), A3.2 (the G record, security); paragraph numbers of the 2008 edition',
  rule: 'The latest IGC file from each recorder has a G record (its signature cannot be validated here).',
  run(ctx) {
    const out: Finding[] = []
    for (const { unitId, title, file } of latestIgcFiles(ctx)) {
      if (file.hasGRecord) continue
      out.push({
        checkId: this.id,
        severity: 'advisory',
        unitId,
        subject: file.id ? `igc:${file.id}` : undefined,
        caution: HARDWARE_CAUTION,
        reason: `${title} has no security record (G record); it may have been edited or exported by another program.`,
        fixHint: 'Upload the file exactly as the recorder wrote it, downloaded with the recorder’s own download method.',
      })
    }
    return out
  },
}
