/**
 * Public entry of the Runnel hydraulic engine: pure TypeScript (no DOM, no Node APIs), shared by
 * the server and the browser Web Worker. See engine/README.md for scenarios and file map.
 *
 * @example
 * import { solve, simulate, equalisationTime, validateDocument, hillSmallholding } from '../engine';
 * const result = solve(hillSmallholding);
 */
export * from './network-document';
export * from './units';
export type { Warning, WarningCode } from './warnings';
export { validateDocument, parseDocument, type DocumentParse, type DocumentProblem } from './validate';
export { migrateDocument, documentVersion, type Migration } from './migrations';
export { networkDocumentSchema } from './document-schema';
export { BOUNDS, MAX_ELEMENTS, boundProblem, type Bound, type BoundName } from './bounds';
export { solve, type SteadyResult, type SteadyOptions, type NodeResult, type LinkResult } from './steady';
export { LiveSolver } from './live-solve';
export { clearStructureCache } from './gradient-solver';
export { simulate, type SimulateOptions, type TimeSeriesResult, type SimulationSummary } from './simulate';
export { equalisationTime, type EqualiseOptions, type EqualiseResult } from './equalise';
export { staticHeads, DEFAULT_VELOCITY_LIMIT_MS, DEFAULT_COVER_M } from './checks';
export {
  pipeSeries,
  pipeSizes,
  findPipeSize,
  defaultRoughness,
  pressureRatingPsi,
  IPS_OD_IN,
  type PipeSeries,
  type PipeSize,
  type PipeMaterial,
} from './pipe-catalogue';
export { hazenWilliamsHeadloss, hazenWilliamsResistance, HW_OMEGA_SI, HW_OMEGA_ALTERNATIVES } from './hazen-williams';
export { darcyWeisbachHeadloss, darcyFactor } from './darcy-weisbach';
export { colebrookFactor } from './colebrook';
export { swameeJainFactor } from './swamee-jain';
export { GRAVITY_MS2, WATER_KINEMATIC_VISCOSITY_M2S } from './constants';
export { hillSmallholding, twoTankBank } from './examples/hill-smallholding';
export { sizeNetwork, applyCandidate, type SizingOptions, type SizingResult, type PipeChoice, type RegionReport } from './sizing/size-network';
export { parsePriceCatalogue, catalogueCandidate, pipeKey, type SizingCandidate, type ParsedCatalogue } from './sizing/price-catalogue';
export { partitionNetwork, type Region, type Partition } from './sizing/regions';
export { designChecks, pipeStaticPressures, type DesignCheck, type OutletCheck, type Failure } from './sizing/verify';
export { twoLoop, twoLoopPrices } from './examples/two-loop';
export { demoPipePrices, demoPriceCatalogue } from './examples/demo-prices';
export * from './takeoff/index';
export { demoPriceList, type PriceListRow } from './examples/demo-prices';
export { purchaseUnit, FITTINGS, fittingCode, nominalForDiameter, type PurchaseUnit, type FittingKind } from './pipe-catalogue';
export { evaluateDesign, summariseDesign, designDifferences, type DesignSummary, type SummaryInputs, type DesignEvaluation } from './options/compare';
export {
  serviceStates,
  outletState,
  ratingState,
  pipeWork,
  tankVolume,
  type ServiceStates,
  type NodeService,
  type LinkService,
  type OutletState,
  type RatingState,
  type PipeWork,
} from './service-state';
export { fitPumpCurve, CURVE_SAMPLES, type PumpCurveFit } from './pump-curve/index';
