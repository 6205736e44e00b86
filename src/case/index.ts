/** Case files: schema, units, loading and conversion to the core model. */
export { CaseError, isCaseError, type CaseErrorCode } from './errors.js';
export { parseQuantity, UNITS, MODEL_UNIT, unitsOfKind, type QuantityKind, type QuantityResult } from './units.js';
export {
  caseSchema,
  pipeCaseSchema,
  validateCase,
  validatePipeCase,
  resolvePath,
  formatPath,
  DEFAULT_SCHEME,
  SCHEMES,
  ENTRY_LOSS,
  type Case,
  type CaseInput,
  type PipeCase,
  type PipeCaseInput,
  type CaseIssue,
  type Validation,
} from './schema.js';
export { toEngineModel, toPipeModel, cardToTheta, thetaToCard, wrap720, widenToZeroLift, profileCrossings, effectiveCard } from './to-model.js';
export {
  loadCase,
  loadPipeCase,
  parseCase,
  buildCase,
  buildPipeCase,
  parseYamlText,
  readCaseText,
  applySets,
  parseSetValue,
  MAX_CASE_BYTES,
  type LoadOptions,
  type LoadedCase,
  type LoadedPipeCase,
} from './load.js';
export { closest, didYouMean, editDistance } from './suggest.js';
