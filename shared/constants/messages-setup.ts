// API messages of the setup area; merged into MESSAGES by messages.ts.
export const SETUP_MESSAGES = {
  organiserUnknown: 'No account uses that e-mail address. Ask the organiser to sign up first, then try again.',
  competitionCreated: 'The competition was created.',
  classNotFound: 'No such class in this competition.',
  classCodeUnknown: 'Choose one of the FAI classes, or a custom class.',
  classNameNeeded: 'Give the custom class a name.',
  classNameTaken: 'This competition already has a class of that name.',
  classInUse: (count: number) =>
    `This class has ${count} entr${count === 1 ? 'y' : 'ies'}; move or withdraw ${count === 1 ? 'it' : 'them'} before deleting the class.`,
  firmwareNotFound: 'No such firmware release in this catalogue.',
  firmwareTaken: 'The catalogue already lists this version for that unit family.',
  csvEmpty: 'The CSV file has no lines to import.',
  csvUnreadable: (detail: string) => `The CSV file could not be read: ${detail}`,
  csvColumns: 'The first line must name the columns unit_family, version and expires_on.',
  csvBadRows: (count: number) =>
    `${count} line${count === 1 ? '' : 's'} of the CSV file need${count === 1 ? 's' : ''} attention; nothing was imported.`,
  csvTooLarge: 'The CSV file is larger than 1 MB.',
  csvMediaType: 'Send the catalogue as a CSV file (text/csv), a form upload, or JSON with a csv field.',
} as const
