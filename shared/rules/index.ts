export {
  ACTIONS,
  FORMATS,
  TARGETS,
  TIE_BREAKERS,
  WITHDRAWAL_RULES,
  freezeRuleSet,
  hitValue,
  parseRuleSet,
  ruleSetSchema,
} from './ruleset'
export type {
  Action,
  FieldProblem,
  FirstHitRuleSet,
  Format,
  ParsedRuleSet,
  PointsRuleSet,
  RuleSet,
  RuleSetInput,
  Target,
  TieBreaker,
  WithdrawalRule,
} from './ruleset'
export { PRESETS, firstHitThreeBouts, pointsToSeven, presetCopy } from './presets'
export type { PresetId } from './presets'
export { CARD_COLOURS, SIDES, VOID_REASONS, checkEntry, hitSchema, matchEntrySchema, otherSide } from './entries'
export type { CardColour, EntryKind, Hit, MatchEntry, Side, VoidReason } from './entries'
export { deriveMatch, previewEntry } from './match'
export type {
  CardEffect,
  CardRecord,
  CardsInForce,
  EndReason,
  EntryStatus,
  IgnoredReason,
  MatchResult,
  MatchState,
  SideState,
  TimelineItem,
} from './match'
export { computeStandings } from './standings'
export type {
  FighterCards,
  MatchCount,
  MatchOutcome,
  Pool,
  PoolFighter,
  PoolMatch,
  Separation,
  StandingRow,
  Standings,
} from './standings'
export { assessQualification, survivalNeed } from './qualification'
export type { CutStatus, FighterOutlook, QualificationOutlook, TopNBasis } from './qualification'
export { drawLot, hashString, mulberry32 } from './lot'
export type { LotDraw } from './lot'
export { SAFETY_CAUTIONS, describeRules } from './summary'
export type { RuleSummary, SummarySection, SummarySectionId } from './summary'
