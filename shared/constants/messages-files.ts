// API messages of the files area; merged into MESSAGES by messages.ts.
export const FILES_MESSAGES = {
  fileMissing: 'Choose a file to upload.',
  multipartRequired: 'Send the upload as a form (multipart/form-data) with a file field named “file”.',
  documentTooLarge: 'That file is larger than 10 MB. Upload a smaller scan or photo (PDF, JPEG or PNG, up to 10 MB).',
  igcTooLarge: 'That file is larger than 5 MB. An IGC file from a flight recorder is much smaller; upload the file itself, not an archive.',
  documentWrongType: 'That file is not a PDF, JPEG or PNG. Only PDF documents and JPEG or PNG images are accepted, checked by their content rather than their name.',
  notIgc: (firstError: string, line: number) => `This is not an IGC file: ${firstError} (line ${line}).`,
  documentNotFound: 'No such document for this entry, or it is not yours.',
  queueDocumentNotFound: 'No such document in this competition.',
  igcFileNotCurrent: 'That IGC file has been replaced; name the recorder of the current file instead.',
  igcFileNotFound: 'No such IGC file for this entry, or it is not yours.',
  unitNotRecorder: 'That unit is not a flight recorder of this entry.',
  alreadyReviewed: 'This document has already been reviewed or replaced; reload the queue.',
  fileUnavailable: 'The stored file could not be read. Ask the entrant to upload it again.',
} as const
