// The firmware catalogue: releases of collision-warning unit firmware with the day each
// stops working, as the organiser records them (by hand or from a CSV file).
import { z } from 'zod'
import { isoDate } from './competition'

const text = (label: string, max: number) =>
  z.string({ error: `Enter the ${label}.` }).trim().min(1, { error: `Enter the ${label}.` }).max(max, { error: `Keep the ${label} under ${max} characters.` })

export const firmwareReleaseFields = {
  unitFamily: text('unit family', 80),
  version: text('firmware version', 40),
  /** The first day the unit no longer works with this firmware. */
  expiresOn: isoDate,
}

export const firmwareReleaseSchema = z.object(firmwareReleaseFields, { error: 'Send the fields as a JSON object.' }).strict()
export type FirmwareReleaseInput = z.input<typeof firmwareReleaseSchema>

export const firmwareReleasePatchSchema = firmwareReleaseSchema.partial()

export const firmwareParamsSchema = z.object({
  competitionId: z.uuid(),
  releaseId: z.uuid(),
})

/** The columns a catalogue CSV file must have, in any order, named in its first line. */
export const FIRMWARE_CSV_COLUMNS = ['unit_family', 'version', 'expires_on'] as const

/** One data line of a catalogue CSV file, as csv-parse hands it over. */
export const firmwareCsvRowSchema = z.object({
  unit_family: firmwareReleaseFields.unitFamily,
  version: firmwareReleaseFields.version,
  expires_on: isoDate,
})

/** A JSON body carrying the file's text, for clients that do not upload a file. */
export const firmwareImportJsonSchema = z.object({
  csv: z.string({ error: 'Send the CSV text in the field csv.' }).min(1, { error: 'The CSV text is empty.' }),
}, { error: 'Send the CSV text in the field csv.' })

/** Largest catalogue file accepted (1 MB: tens of thousands of lines). */
export const FIRMWARE_CSV_MAX_BYTES = 1_000_000
