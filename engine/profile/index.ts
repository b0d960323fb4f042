/**
 * Profile along a route: route finding over the pipes, ground / pipe / HGL / static lines against
 * distance, and findings (HGL below the pipe, static over the rating or its working share, high and
 * low points) with cautions and sources. Pure TypeScript; see engine/README.md ("Profile").
 *
 * @example
 * import { findRoutes, profileRoute } from '../engine/profile';
 * const profile = profileRoute(doc, findRoutes(doc, 'T1', 'TR4')[0]);
 */
export { findRoutes, longestSupplyRoute, supplyRoutes, RouteError, type Route } from './routes';
export { networkTurningPoints, type NetworkTurningPoint } from './network-points';
export {
  profileRoute,
  type RouteProfile,
  type ProfilePoint,
  type ProfileElement,
  type ProfileSegment,
  type ProfileOptions,
  type StaticMargin,
} from './profile-line';
export { profileFindings, WORKING_SHARE, FINDING_TEXT, type ProfileFinding, type FindingKind } from './findings';
export { pressureState, pressureText, unsuppliedIds, PRESSURE_STATE_TEXT, VACUUM_HEAD_M, type PressureState } from './pressure-state';
