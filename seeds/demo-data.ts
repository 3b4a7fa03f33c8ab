// The invented demo scenario: an invented airfield, competition, people. Any likeness to a
// real person, club or glider is accidental.
import type { Role } from '../shared/constants/roles'
import { DEMO_PASSWORD } from '../shared/constants/demo'

export { DEMO_PASSWORD }

export interface DemoPerson {
  email: string
  name: string
  isAdmin?: boolean
  roles: Role[]
}

export const DEMO_COMPETITION = {
  slug: 'kestrel-moor-2027',
  name: 'Kestrel Moor Regionals 2027',
  airfieldName: 'Kestrel Moor',
  // No ICAO location indicator: the airfield is invented and must not collide with a real one.
  airfieldIcao: null,
  timeZone: 'Europe/Berlin',
  firstContestDay: '2027-07-12',
  lastContestDay: '2027-07-18',
  practiceDays: ['2027-07-10', '2027-07-11'],
  // Registration is open while the demo is shown (from late 2026 to the start of summer).
  registrationOpensOn: '2026-11-01',
  registrationClosesOn: '2027-06-30',
  lateFeeAfter: '2027-05-31',
  lateFeeMinor: 5000,
  currency: 'EUR',
  /** Named by the competition's privacy notice (invented, like every address here). */
  privacyContactEmail: 'office@kestrel-moor.example',
  rules: {
    firmwareMarginDays: 0,
    firmwareWarningDays: 30,
    igcRecencyDays: 365,
    requiredDocumentKinds: ['airworthiness', 'insurance', 'licence', 'medical'],
    recordersRequired: 1,
    acceptedApprovalLevels: ['all-flights', 'badges-up-to-diamonds'],
  },
  classes: [
    { code: 'club', name: 'Club', entryFeeMinor: 32000 },
    { code: 'standard', name: 'Standard', entryFeeMinor: 35000 },
    { code: '18m', name: '18 Metre', entryFeeMinor: 38000 },
  ],
} as const

export const DEMO_PEOPLE: DemoPerson[] = [
  { email: 'admin@gridmark.example', name: 'Ines Halloran', isAdmin: true, roles: [] },
  { email: 'organiser@gridmark.example', name: 'Tomasz Wendel', roles: ['organiser'] },
  { email: 'scrutineer@gridmark.example', name: 'Aoife Brennick', roles: ['scrutineer'] },
  { email: 'scrutineer2@gridmark.example', name: 'Jules Okafor-Lind', roles: ['scrutineer'] },
  { email: 'director@gridmark.example', name: 'Marguerite Sallow', roles: ['director'] },
  { email: 'entrant@gridmark.example', name: 'Piet van Oorschot', roles: ['entrant'] },
  { email: 'entrant2@gridmark.example', name: 'Hana Kreutzfeld', roles: ['entrant'] },
  { email: 'entrant3@gridmark.example', name: 'Dmitri Alvane', roles: ['entrant'] },
  { email: 'entrant4@gridmark.example', name: 'Sólveig Marrow', roles: ['entrant'] },
  { email: 'entrant5@gridmark.example', name: 'Benedek Tarr', roles: ['entrant'] },
  { email: 'entrant6@gridmark.example', name: 'Colm Ashgrove', roles: ['entrant'] },
  { email: 'entrant7@gridmark.example', name: 'Renske Havilland', roles: ['entrant'] },
  { email: 'entrant8@gridmark.example', name: 'Lucía Fenwright', roles: ['entrant'] },
  { email: 'entrant9@gridmark.example', name: 'Oskar Brimble', roles: ['entrant'] },
  { email: 'entrant10@gridmark.example', name: 'Yusra Calloway', roles: ['entrant'] },
]

/** The sign-ins README and `npm start` show: one per role. */
export const DEMO_SIGN_INS = [
  { role: 'site admin', email: 'admin@gridmark.example' },
  { role: 'organiser', email: 'organiser@gridmark.example' },
  { role: 'scrutineer', email: 'scrutineer@gridmark.example' },
  { role: 'scrutineer', email: 'scrutineer2@gridmark.example' },
  { role: 'director', email: 'director@gridmark.example' },
  { role: 'entrant', email: 'entrant@gridmark.example' },
].map(s => ({
  ...s,
  name: DEMO_PEOPLE.find(p => p.email === s.email)!.name,
  password: DEMO_PASSWORD,
}))
