import type { Role } from '../constants/roles'

export interface PublicUser {
  id: string
  email: string
  name: string
  isAdmin: boolean
  /** The e-mail address was confirmed; until then the account cannot enter a glider or accept an invitation. */
  emailVerified: boolean
}

/** One competition as the signed-in user sees it on their home page. */
export interface MembershipSummary {
  competitionId: string
  slug: string
  name: string
  airfieldName: string
  firstContestDay: string | null
  lastContestDay: string | null
  roles: Role[]
}

export interface MeResponse {
  user: PublicUser
  memberships: MembershipSummary[]
}

export interface CompetitionClassSummary {
  id: string
  name: string
  code: string
  maxSpanM: number | null
  maxMtomKg: number | null
  waterBallast: boolean
}

export interface CompetitionDetail {
  id: string
  slug: string
  name: string
  airfieldName: string
  airfieldIcao: string | null
  timeZone: string
  firstContestDay: string | null
  lastContestDay: string | null
  classes: CompetitionClassSummary[]
  /** What the asking user may do here. Site administrators see organiser rights. */
  roles: Role[]
}

/** The body of every 4xx answer: h3's error JSON, with field errors for invalid input. */
export interface ApiErrorBody {
  statusCode: number
  message: string
  data?: {
    fieldErrors?: Record<string, string[]>
    formErrors?: string[]
  }
}
