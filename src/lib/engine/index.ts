/**
 * Framefork's traversal engine: every path through a character's strings and stance
 * cancels, with its frame outcome, block class, guards and guesses. Pure TypeScript:
 * callers validate with the schemas here before exploring.
 */
export { explorePaths, explorePathsLimited, iteratePaths, countPaths } from "./walk";
export { topPaths, rankings, type TopOptions } from "./top";
export { diffGraphs } from "./diff";
export { compileGraph, type CompiledGraph, EngineInputError } from "./compile";
export {
  classifyBlock,
  blockClassTrend,
  classifyFrames,
  followUp,
  framesSaved,
  gapAtAdvantage,
  combosAtAdvantage,
  afterCancel,
  punishersFor,
  canActFrom,
  hitsFirstInGap,
  guardsFor,
  defenderStanceAfter,
  outcomeFrames,
  GUARDS,
  DEFAULT_FASTEST,
  DEFAULT_LAUNCH_AT,
  type PunisherMove,
} from "./frames";
export {
  effectiveLaunchAt,
  punishWindow,
  byDamageThenSpeed,
  gapJails,
  advantageSide,
  compareOutcome,
  formatFrames,
  formatOutcome,
  explainAdvantage,
  explainOnHit,
  BLOCK_CLASS_WORD,
  blockClassRange,
  blockClassMeaning,
  explainBlockClass,
  explainOnBlock,
  framesSavedLabel,
  explainFramesSaved,
  gapAtAdvantageSum,
  explainGap,
  FOLLOW_UP_WORD,
  explainFollowUp,
  explainPunisher,
  turnsPunishableSafe,
  explainComboAfterCancel,
  explainAfterCancel,
  explainAutoGuard,
  compareBlockClass,
  compareStartup,
  startupWithin,
  type AdvantageSide,
  type BlockRules,
} from "./frames";
export { solveMatrixGame, type MatrixGameSolution } from "./solver";
export { stanceSheet, type StanceSheet, type StanceWayIn, type StanceMove, type StanceGridCell } from "./stance-sheet";
export { solveBoard, bestReplyTo, bestAnswerTo, BoardInputError, MAX_BOARD_OPTIONS } from "./board";
export { DEFAULT_VALUE_TABLE, cellPayoff, outcomeValue, explainCell, formatPayoff } from "./board-values";
export {
  fillSituation,
  pressColumn,
  isPressColumn,
  STAND_GUARD,
  CROUCH_GUARD,
  STOP,
  type FillOptions,
  type OpponentMove,
} from "./board-fill";
export { graphSchema, optionsSchema, exploreRequestSchema, parseGraph, LEVELS } from "./schema";
export type * from "./types";
export {
  RANGE_KINDS,
  parseRange,
  rangeProblem,
  reachesAt,
  formatRange,
  explainRange,
  type RangeKind,
  type RangeScale,
} from "./range";
