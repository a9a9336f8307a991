/**
 * Parametric studies and design questions on a network: the public part of src/study, for
 * `src/index.ts` to export. Browser-safe (the worker-thread runner lives in src/cli).
 *
 * @module
 */

export { studySchema } from "../input/study-schema.js";
export {
  type AnswerText,
  answerJson,
  answerStudy,
  answerText,
  type StudyAnswer,
} from "./answer-text.js";
export {
  bracketedRoot,
  type RootOutcome,
  type RootPoint,
  type RootProblem,
} from "./bracketed-root.js";
export {
  type CapacityAnswer,
  type CapacityLimit,
  type CapacityOptions,
  capacity,
} from "./capacity.js";
export {
  blockCount,
  blockRange,
  caseAt,
  caseCount,
  DEFAULT_BLOCK_SIZE,
  MAX_CASES,
  type Shard,
  type StudyCase,
  shardBlockRange,
  shardCaseRange,
} from "./cases.js";
export {
  findTarget,
  type TargetAnswer,
  type TargetOptions,
  type TargetSample,
} from "./find-target.js";
export { defaultPipeDiameters, type PipeSize } from "./pipe-diameters.js";
export {
  type ReadStudyOptions,
  readStudyDocument,
  readStudyText,
  type StudyReadResult,
} from "./read-study.js";
export {
  averageIterations,
  blockRows,
  type StudyRow,
  type StudyRunOptions,
  solveStudyBlock,
  studyRows,
} from "./run-study.js";
export { type SensitivityAnswer, type SensitivityOptions, sensitivities } from "./sensitivities.js";
export {
  type PipeChoice,
  type SizingAnswer,
  type SizingOptions,
  type SizingViolation,
  sizePipes,
} from "./size-pipes.js";
export type { CaseStatus } from "./solve-case.js";
export {
  parseShardHeaderLine,
  type ShardHeader,
  type StudyFormat,
  type StudyWriter,
  shardHeaderLine,
  studyWriter,
} from "./study-format.js";
export {
  formatStudyIssue,
  StudyError,
  type StudyIssue,
  type StudyIssueCode,
} from "./study-issues.js";
export type {
  PreparedStudy,
  ResolvedOutput,
  ResolvedParameter,
  StudyDocument,
  StudyGroupInput,
  StudyParameterInput,
  StudyQuestion,
  StudyRangeInput,
} from "./study-types.js";
