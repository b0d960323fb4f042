/**
 * The review rules: each limit, the words shown for it and its published source, in one place
 * (marks as in REFERENCES.md: V read in the source, V2 secondary copy, C computed, M from memory).
 * Checks import their limits from here so a rule and its source can never drift apart.
 */
import { DEFAULT_WASTE_ALLOWANCE, SOLAR_STORAGE_DAYS } from '../budget/index';
import { WORKING_SHARE as PROFILE_WORKING_SHARE } from '../profile/findings';
import { PSI_PER_METRE_OF_WATER } from '../units';

export interface Rule {
  id: string;
  title: string;
  text: string;
  source: string;
}

/** Main-line velocity limit, m/s (5 ft/s). */
export const VELOCITY_LIMIT_MS = 1.5;
/** Working pressure share of the rating when surge is not analysed (the Profile's constant, one copy). */
export const WORKING_SHARE = PROFILE_WORKING_SHARE;
/** Days of storage for a solar or otherwise unreliable fill (the water budget's constant). */
export const STORAGE_DAYS_UNRELIABLE = SOLAR_STORAGE_DAYS;
/** Allowance added to the daily need for evaporation and waste (the water budget's constant). */
export const WASTE_ALLOWANCE = DEFAULT_WASTE_ALLOWANCE;
/** Trough refill: the daily need delivered within this many hours when stock drink singly. */
export const TROUGH_REFILL_HOURS = 4;
/** Outlet pressure margin below which a passing outlet is a caution, as a share of its requirement. */
export const OUTLET_MARGIN_SHARE = 0.1;
/** Static pressure above which a house or float valve wants a pressure reducer, m of water (80 psi). */
export const HIGH_STATIC_PRESSURE_M = 80 / PSI_PER_METRE_OF_WATER;
/** Static pressure above which a buried line wants 150 psi pipe, m of water (50 psi). */
export const DROP_CAUTION_PRESSURE_M = 50 / PSI_PER_METRE_OF_WATER;
/** Delivered share of the design flow below which an outlet counts as short (the engine's unmet-demand rule). */
export const DELIVERY_SHARE = 0.99;
/** Smallest rise or fall of the ground that counts as a high or low point, m (survey noise below). */
export const PROFILE_PROMINENCE_M = 0.3;
/** An air valve or drain within this distance of a high or low point serves it, m. */
export const FITTING_REACH_M = 10;

const JARRETT = 'Jarrett, Water Management, 2nd ed., 2000 (V2)';
const S376 = 'ASAE S376.1, as quoted by the Missouri Livestock Watering Systems Handbook ch. 5, 1997 (V2)';
const NRCS430 = 'NRCS Conservation Practice Standard 430 (V2)';

export const RULES = {
  'outlet-pressure': {
    id: 'outlet-pressure',
    title: 'Pressure at the outlet',
    text: "Design pressure at least the device's required pressure; a margin under 10 % of it is a caution",
    source:
      'Device requirement from the outlet (IPC 2018 Table 604.3 for house fixtures, V2; drip 10–30 psi, common practice); the 10 % margin is common practice, no published source',
  },
  'outlet-delivery': {
    id: 'outlet-delivery',
    title: 'Delivered flow',
    text: 'Delivered flow (pressure-driven solve) at least 99 % of the design flow',
    source: "Minimum design flow delivers the need (Nebraska Stockwater Pipeline Handbook, USDA-NRCS 2008, V2); 99 % is the engine's unmet-demand tolerance",
  },
  'outlet-static-high': {
    id: 'outlet-static-high',
    title: 'Static pressure at the device',
    text: 'Static pressure above 80 psi wants a pressure-reducing valve ahead of a house or a float valve',
    source: 'IPC 604.8 (M); trough float valves rated to about 80–100 psi (common practice, no source)',
  },
  'pipe-velocity': {
    id: 'pipe-velocity',
    title: 'Velocity',
    text: 'Velocity at design flow at most 1.5 m/s (5 ft/s)',
    source: JARRETT,
  },
  'pipe-static-rating': {
    id: 'pipe-static-rating',
    title: 'Static pressure against the rating',
    text: "Working (static, tanks full) pressure at the pipe's lowest point at most its rating",
    source: NRCS430,
  },
  'pipe-working-share': {
    id: 'pipe-working-share',
    title: 'Working share of the rating',
    text: 'Working pressure at most 72 % of the rating when surge is not analysed',
    source: S376,
  },
  'pipe-surge': {
    id: 'pipe-surge',
    title: 'Surge on a sudden stop',
    text: 'Static pressure plus the Joukowsky surge a·ΔV/g of stopping the design flow at once (wave speed by Korteweg from material and dimension ratio) at most the rating',
    source: `${NRCS430}; Joukowsky and Korteweg, textbook (M), checked against UFC 3-230-13A / TM 5-813-9 (V2)`,
  },
  'pipe-hgl': {
    id: 'pipe-hgl',
    title: 'HGL above the pipe',
    text: 'The hydraulic grade line at design flow stays above the pipe (ground less cover) along its profile; below it air gathers or the line siphons',
    source: "NRCS Washington Eng. Tech. Note 16, 2009 (V2); HGL linear between the pipe's end heads (common practice)",
  },
  'profile-high-point': {
    id: 'profile-high-point',
    title: 'High point: air release',
    text: 'An air-release valve at each high point of the line',
    source: 'NRCS Washington Eng. Tech. Note 16, 2009; NRCS Missouri, Watering Systems for Serious Graziers (V2)',
  },
  'profile-low-point': {
    id: 'profile-low-point',
    title: 'Low point: drain',
    text: 'A drain at each low point of the line (and lines drained in autumn where they freeze)',
    source: 'NRCS Washington Eng. Tech. Note 16, 2009 (V2); Alberta seasonal-line guidance (V2)',
  },
  'storage-days': {
    id: 'storage-days',
    title: 'Days of storage',
    text: 'Usable storage at least 3 days of the daily need when the fill is solar or otherwise unreliable',
    source: 'NRCS South Dakota Design Technical Note SD2006-1, 2010; NRCS Kansas (V2)',
  },
  'fill-daily-volume': {
    id: 'fill-daily-volume',
    title: 'Fill pump daily volume',
    text: "The fill pump's daily volume at least the worst month's daily need; under the need plus 10 % for evaporation and waste is a caution",
    source: 'Nebraska Stockwater Pipeline Handbook, USDA-NRCS 2008 (V2); daily volume = full-sun flow × sun hours (common practice)',
  },
  'trough-refill': {
    id: 'trough-refill',
    title: 'Trough refill time',
    text: "A trough's delivered flow refills the herd's daily need within 4 h (stock drinking singly)",
    source: 'Ohio State ANR-12, 2003, after Gerrish & Davis 1995 (V2)',
  },
  'safety-drop-pressure': {
    id: 'safety-drop-pressure',
    title: 'Pressure at the bottom of long drops',
    text: 'Static pressure over 50 psi: buried lines in 150 psi pipe; pressure reducers for lines far downhill',
    source: 'Illinois NRCS specification (V2); NRCS Washington Eng. Tech. Note 16, 2009 (V2). Local codes and licensed practice govern',
  },
  'safety-tank-stand': {
    id: 'safety-tank-stand',
    title: 'Heavy tanks',
    text: 'A full tank weighs its volume in tonnes: set it on a level, engineered base; a stand needs a design for that load',
    source: 'Common practice; local building codes and a licensed engineer govern stands',
  },
  'safety-backflow': {
    id: 'safety-backflow',
    title: 'Drinking and stock water on one line',
    text: 'Where the house and troughs share a line, protect the drinking water with a backflow preventer',
    source: 'Common practice (plumbing codes require backflow protection); local codes govern',
  },
  'safety-trenching': {
    id: 'safety-trenching',
    title: 'Trenching',
    text: 'Call before you dig; shore or slope trenches deeper than about 5 ft and keep spoil back from the edge',
    source: 'Common practice (trench rules of the local work-safety authority govern)',
  },
  'safety-freezing': {
    id: 'safety-freezing',
    title: 'Freezing',
    text: 'Year-round lines below local frost depth; seasonal lines shallow (about 12 in) and drained in autumn',
    source: 'Alberta (V2); an Illinois NRCS worksheet shows 4 ft (V2). Local frost depth governs',
  },
} as const satisfies Record<string, Rule>;

export type RuleId = keyof typeof RULES;
