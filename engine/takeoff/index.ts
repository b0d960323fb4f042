/** Takeoff and estimate: quantities from the network, prices from the team's list. See engine/README.md. */
export { takeoff, DEFAULT_OTHER, type Takeoff, type TakeoffRow, type TakeoffSettings, type TakeoffGroup, type OtherItem } from './takeoff';
export { countFittings, linkSize, sizeRank, type CountedFitting } from './fittings';
export { minorLossAllowance, applyMinorLossAllowance, type Allowance } from './minor-loss-allowance';
export { soldUnit } from './sold-unit';
export { estimate, cents, DEFAULT_ESTIMATE_SETTINGS, type Estimate, type EstimateLine, type EstimateSettings } from './estimate';
