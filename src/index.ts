/**
 * machnet: steady compressible gas flow in pipe networks.
 *
 * The one public entry. Network functions ({@link solveNetwork}, {@link checkNetwork}), the
 * document and result types, the gas properties, the units parser and every single-pipe and
 * one-dimensional flow relation, each usable on its own. Everything not exported here is internal.
 *
 * Results are engineering estimates. Pressure and relief systems are designed and checked to the
 * applicable codes by qualified engineers.
 *
 * @packageDocumentation
 */

// Network
export { type CheckResult, checkNetwork } from "./check-network.js";
// Gas
export * from "./gas/gas.js";
export type {
  ConstantViscosity,
  Gas,
  Nasa7HeatCapacity,
  Nasa7Species,
  PengRobinsonComponent,
  PengRobinsonEquationOfState,
  SutherlandViscosity,
  ViscosityLaw,
  WilkeViscosity,
} from "./gas/gas-types.js";
export {
  emptyPengRobinsonValues,
  type PengRobinsonValues,
  pengRobinsonKappa,
} from "./gas/peng-robinson.js";
export {
  ENTHALPY_REFERENCE_TEMPERATURE,
  emptyThermoState,
  gasState,
  type ThermoState,
  temperatureFromEnthalpy,
} from "./gas/thermo.js";
// Input
export type {
  CheckedDocument,
  DesignLimits,
  EdgeInput,
  GasInput,
  NetworkDocument,
  NodeInput,
  QuantityInput,
  SettingsInput,
} from "./input/document-types.js";
export {
  FITTING_TYPES,
  type FittingType,
  fittingLossCoefficient,
  REDUCER_TYPES,
  type ReducerType,
  reducerAddedLossCoefficient,
  reducerLossCoefficient,
} from "./input/fittings.js";
export { formatIssue, InputError, type InputIssue, type InputIssueCode } from "./input/issues.js";
export { networkSchema } from "./input/network-schema.js";
export {
  catalogPipe,
  PIPE_MATERIAL_NAMES,
  PIPE_MATERIALS,
  PIPE_SCHEDULES,
  parseNominalSize,
} from "./input/pipe-catalog.js";
export {
  parseQuantity,
  type QuantityContext,
  type QuantityKind,
  type QuantityNote,
  type QuantityResult,
} from "./input/quantity.js";
export { KV_PER_CV } from "./input/read-components.js";
export {
  DEFAULT_AMBIENT,
  DEFAULT_ROUGHNESS,
  DEFAULT_SETTINGS,
  readNetworkText,
} from "./input/read-document.js";
export {
  REFERENCE_CONDITIONS,
  type ReferenceCondition,
  type ReferenceConditionName,
  referenceDensity,
} from "./input/reference-conditions.js";
// Display units
export {
  type DisplayKind,
  type DisplayUnit,
  displayGaugePressure,
  displayUnit,
  UNIT_SET_NAMES,
  type UnitSetName,
} from "./output/display-units.js";
// Visual report
export {
  type DrawOptions,
  drawNetworkSvg,
  findProfilePath,
  REPORT_CAUTION,
  type ReportOptions,
  renderReportHtml,
} from "./output/report/index.js";
export type { ComponentDetails } from "./physics/components/component-flow.js";
// Components, the pipe catalog and fittings
export {
  NOZZLE_DISCHARGE_COEFFICIENT,
  nozzleCriticalPressureRatio,
  nozzleExpansibility,
  nozzleMassFlow,
} from "./physics/components/nozzle.js";
export {
  ORIFICE_DISCHARGE_COEFFICIENT,
  orificeExpansibility,
  orificeMassFlow,
} from "./physics/components/orifice.js";
export { pressureLossRatio } from "./physics/components/restriction.js";
export {
  valveCharacteristicRatio,
  valveExpansionFactor,
  valveGasMassFlow,
} from "./physics/components/valve.js";
export * from "./physics/fanno.js";
export * from "./physics/friction.js";
// One-dimensional relations and one pipe
export * from "./physics/isentropic.js";
export * from "./physics/isothermal.js";
export {
  type Pipe,
  type PipeEndState,
  type PipeFlowResult,
  type PipeOutletResult,
  type PlenumState,
  pipeFlow,
  pipeOutlet,
} from "./physics/pipe.js";
export type {
  EdgeResult,
  NetworkBalance,
  NetworkResult,
  NodeResult,
  NoSolutionDiagnosis,
  SolverWarning,
  SolveStatus,
  WarningCode,
} from "./results/result-types.js";
export {
  InternalCheckError,
  type SolveOptions,
  SolveReuse,
  solveNetwork,
} from "./solve/solve-network.js";
export * from "./study/index.js";
