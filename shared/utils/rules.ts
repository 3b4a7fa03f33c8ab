// A competition's rule settings as every part of the app reads them: what it stored, with the
// defaults for anything it has not set (or set before a rule existed).
import { competitionRulesSchema, DEFAULT_RULES, type CompetitionRules } from '../schemas/competition'

export function rulesOf(settings: unknown): CompetitionRules {
  const parsed = competitionRulesSchema.safeParse(settings ?? {})
  return parsed.success ? parsed.data : { ...DEFAULT_RULES }
}
