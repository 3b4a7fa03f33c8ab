// The readiness words live in shared/ (the server's e-mails and exports use them too).
export { READINESS_STATES, READINESS_LABELS, READINESS_MEANINGS, READINESS_ORDER, type Readiness } from '#shared/constants/readiness'
