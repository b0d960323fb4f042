import type { NetworkDocument, PipeLink } from '../network-document';
import { defaultRoughness, findPipeSize } from '../pipe-catalogue';

/**
 * Demo networks (invented scenarios; no real farm, person or brand).
 *
 * `hillSmallholding`: a hill smallholding with a flock of sheep and a cider orchard on a site plan
 * of about 600 m × 400 m (x east, y north, metres). A drilled well near the yard (water surface
 * 38 m below ground) has a solar pump (constant 0.75 L/s by daylight) lifting through a check valve
 * and a PE rising main to two linked 8,600 L tanks on the ridge, 57 m above the farmhouse (same bank, 4 m header). The pump
 * stops when the tanks reach 1.80 m and restarts at 1.40 m. A gravity main runs down the slope with
 * tees to the farmhouse and garden, the lambing shed and yard hydrant, two orchard drip blocks
 * behind a pressure-reducing valve (one emitter block, one pressure-dependent block) and four
 * paddock troughs with float valves; the south trough line crosses a dip and rises again (its
 * ground profile feeds the HGL / air-lock check; its high point has no air valve and its line runs
 * near its rating at the bottom of the dip, both review cautions). Pipe sizes come from ./pipe-catalogue.
 *
 * `twoTankBank`: two 1 m² tanks joined through a 0.001 m² orifice (Cd = 1), 1 m apart in level:
 * the worked equalisation example of REFERENCES.md (T = 225.8 s).
 *
 * @example
 * solve(hillSmallholding).nodes['TR4'].pressure_m
 */

const G = 1 / 1000; // L/s → m³/s

function pipe(id: string, name: string, from: string, to: string, length_m: number, series: string, nominal: string, extra: Partial<PipeLink> = {}): PipeLink {
  const size = findPipeSize(series, nominal);
  if (!size) throw new Error(`demo: no ${nominal} in ${series}`);
  const material = series.startsWith('pe') ? 'pe' : 'pvc';
  return {
    id,
    name,
    kind: 'pipe',
    from,
    to,
    length_m,
    diameter_m: size.id_m,
    roughness: defaultRoughness(material, 'hazen-williams'),
    minor_loss: 1,
    material,
    series,
    nominal,
    rating_m: size.rating_m,
    ...extra,
  };
}

const SOLAR_DAY = [0, 0, 0, 0, 0, 0, 0, 0.2, 0.5, 0.8, 1, 1, 1, 1, 1, 0.8, 0.5, 0.2, 0, 0, 0, 0, 0, 0];

export const hillSmallholding: NetworkDocument = {
  schema: 'runnel.network/1',
  headloss: 'hazen-williams',
  title: 'Hill smallholding: sheep and cider orchard (demo)',
  // Where the plan's origin lies (an invented hillside; plan north is true north), for GPS walks and GeoJSON.
  layout: { geo: { lat: 44.2183, lon: -122.8417, x0_m: 0, y0_m: 0, rotation_rad: 0, scale: 1, source: 'demo' } },
  patterns: {
    house: [0.02, 0.02, 0.02, 0.02, 0.02, 0.05, 0.3, 0.35, 0.2, 0.08, 0.06, 0.06, 0.1, 0.08, 0.05, 0.05, 0.06, 0.12, 0.2, 0.15, 0.1, 0.06, 0.03, 0.02],
    stock: [0.05, 0.05, 0.05, 0.05, 0.05, 0.1, 0.2, 0.3, 0.3, 0.25, 0.25, 0.3, 0.3, 0.25, 0.25, 0.3, 0.3, 0.25, 0.15, 0.1, 0.05, 0.05, 0.05, 0.05],
    shed: [0.05, 0.05, 0.05, 0.05, 0.05, 0.1, 0.3, 0.3, 0.2, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.2, 0.3, 0.2, 0.1, 0.05, 0.05, 0.05, 0.05],
    drip: [0, 0, 0, 0, 0, 1, 1, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0],
    garden: [0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 0.5, 0, 0, 0, 0],
  },
  nodes: [
    { id: 'W', name: 'Drilled well', kind: 'source', source_type: 'well', elevation_m: 96, head_m: 58, x_m: 110, y_m: 70 },
    { id: 'WH', name: 'Wellhead', kind: 'tee', elevation_m: 96.5, demand_m3s: 0, x_m: 116, y_m: 74 },
    { id: 'WH2', name: 'Wellhead check', kind: 'tee', elevation_m: 96.5, demand_m3s: 0, x_m: 122, y_m: 78 },
    {
      id: 'T1',
      name: 'Ridge tank 1',
      kind: 'tank',
      elevation_m: 158,
      diameter_m: 2.44,
      level_m: 1.3,
      min_level_m: 0.15,
      max_level_m: 1.85,
      bank: 'ridge',
      x_m: 300,
      y_m: 372,
    },
    {
      id: 'T2',
      name: 'Ridge tank 2',
      kind: 'tank',
      elevation_m: 158,
      diameter_m: 2.44,
      level_m: 1.3,
      min_level_m: 0.15,
      max_level_m: 1.85,
      bank: 'ridge',
      x_m: 308,
      y_m: 372,
    },
    { id: 'J0', name: 'Tank outlet', kind: 'tee', elevation_m: 157, demand_m3s: 0, x_m: 312, y_m: 362 },
    { id: 'J1', name: 'Upper tee', kind: 'tee', elevation_m: 144, demand_m3s: 0, x_m: 300, y_m: 300 },
    { id: 'J2a', name: 'Main bend', kind: 'tee', elevation_m: 134, demand_m3s: 0, x_m: 270, y_m: 262 },
    { id: 'J2', name: 'Yard tee', kind: 'tee', elevation_m: 124, demand_m3s: 0.00002, x_m: 240, y_m: 220 },
    { id: 'J3', name: 'House tee', kind: 'tee', elevation_m: 108, demand_m3s: 0, x_m: 180, y_m: 140 },
    { id: 'J8', name: 'Garden tee', kind: 'tee', elevation_m: 105, demand_m3s: 0, x_m: 150, y_m: 118 },
    {
      id: 'HOUSE',
      name: 'Farmhouse',
      kind: 'outlet',
      outlet_type: 'house',
      elevation_m: 101,
      demand_m3s: 0.2 * G,
      min_pressure_m: 14,
      pattern: 'house',
      x_m: 140,
      y_m: 96,
    },
    {
      id: 'GARDEN',
      name: 'Kitchen garden bib',
      kind: 'outlet',
      outlet_type: 'hose-bib',
      elevation_m: 103,
      demand_m3s: 0.15 * G,
      min_pressure_m: 10,
      pattern: 'garden',
      x_m: 112,
      y_m: 132,
    },
    {
      id: 'SHED',
      name: 'Lambing shed',
      kind: 'outlet',
      outlet_type: 'other',
      elevation_m: 116,
      demand_m3s: 0.15 * G,
      min_pressure_m: 10,
      pattern: 'shed',
      x_m: 172,
      y_m: 232,
    },
    {
      id: 'HYD',
      name: 'Yard hydrant',
      kind: 'outlet',
      outlet_type: 'hose-bib',
      elevation_m: 118,
      demand_m3s: 0.1 * G,
      min_pressure_m: 10,
      pattern: 'garden',
      x_m: 200,
      y_m: 250,
    },
    { id: 'J4v', name: 'Orchard valve', kind: 'tee', elevation_m: 138, demand_m3s: 0, x_m: 340, y_m: 286 },
    { id: 'J4', name: 'Orchard tee', kind: 'tee', elevation_m: 126, demand_m3s: 0, x_m: 400, y_m: 250 },
    { id: 'J5', name: 'Orchard PRV outlet', kind: 'tee', elevation_m: 126, demand_m3s: 0, x_m: 406, y_m: 246 },
    {
      id: 'ORCH-N',
      name: 'Orchard north drip block',
      kind: 'outlet',
      outlet_type: 'drip-zone',
      elevation_m: 121,
      demand_m3s: 0.3 * G,
      min_pressure_m: 7,
      pattern: 'drip',
      demand_model: { type: 'emitter', k: (0.3 * G) / Math.sqrt(20), exponent: 0.5 },
      x_m: 470,
      y_m: 290,
      // Laid as tape (editor wording): 8 rows of 30 m with an emitter every 30 cm.
      drip_tape: { rows: 8, row_length_m: 30, spacing_m: 0.3 },
      emitters: 800,
    },
    {
      id: 'ORCH-S',
      name: 'Orchard south drip block',
      kind: 'outlet',
      outlet_type: 'drip-zone',
      elevation_m: 114,
      demand_m3s: 0.3 * G,
      min_pressure_m: 10,
      pattern: 'drip',
      demand_model: { type: 'pressure-dependent', required_pressure_m: 14, zero_pressure_m: 4 },
      x_m: 470,
      y_m: 190,
    },
    { id: 'J6v', name: 'West paddocks valve', kind: 'tee', elevation_m: 124, demand_m3s: 0, x_m: 200, y_m: 230 },
    { id: 'J6', name: 'West paddocks tee', kind: 'tee', elevation_m: 127, demand_m3s: 0, x_m: 120, y_m: 262 },
    {
      id: 'TR1',
      name: 'North-west trough',
      kind: 'outlet',
      outlet_type: 'trough',
      float_valve: true,
      elevation_m: 134,
      demand_m3s: 0.1 * G,
      min_pressure_m: 3.5,
      pattern: 'stock',
      x_m: 50,
      y_m: 322,
    },
    {
      id: 'TR2',
      name: 'West trough',
      kind: 'outlet',
      outlet_type: 'trough',
      float_valve: true,
      elevation_m: 119,
      demand_m3s: 0.1 * G,
      min_pressure_m: 3.5,
      pattern: 'stock',
      x_m: 58,
      y_m: 198,
    },
    { id: 'J7a', name: 'East line bend', kind: 'tee', elevation_m: 142, demand_m3s: 0, x_m: 390, y_m: 330 },
    { id: 'J7', name: 'East paddock tee', kind: 'tee', elevation_m: 144, demand_m3s: 0, x_m: 470, y_m: 342 },
    {
      id: 'TR3',
      name: 'East trough',
      kind: 'outlet',
      outlet_type: 'trough',
      float_valve: true,
      elevation_m: 146,
      demand_m3s: 0.1 * G,
      min_pressure_m: 3.5,
      pattern: 'stock',
      x_m: 560,
      y_m: 372,
    },
    {
      id: 'TR4',
      name: 'South trough (across the dip)',
      kind: 'outlet',
      outlet_type: 'trough',
      float_valve: true,
      elevation_m: 104,
      demand_m3s: 0.1 * G,
      min_pressure_m: 3.5,
      pattern: 'stock',
      x_m: 430,
      y_m: 58,
    },
  ],
  links: [
    {
      id: 'PU1',
      name: 'Solar well pump',
      kind: 'pump',
      from: 'W',
      to: 'WH',
      flow_m3s: 0.75 * G,
      schedule: SOLAR_DAY,
      control: { tank: 'T1', stop_level_m: 1.8, start_level_m: 1.4 },
    },
    {
      id: 'CV1',
      name: 'Pump check valve',
      kind: 'valve',
      valve_type: 'check',
      from: 'WH',
      to: 'WH2',
      diameter_m: findPipeSize('pe-sidr9', '1"')?.id_m ?? 0.0266,
      minor_loss: 2,
    },
    pipe('R1', 'Rising main', 'WH2', 'T1', 360, 'pe-sidr9', '1"', {
      vertices: [
        [180, 160],
        [260, 300],
      ],
      profile: [
        [0, 96.5],
        [80, 106],
        [180, 122],
        [280, 142],
        [360, 158],
      ],
    }),
    pipe('HD1', 'Tank header', 'T1', 'T2', 4, 'pvc-sch40', '2"', { minor_loss: 1.5 }),
    {
      id: 'V0',
      name: 'Tank outlet valve',
      kind: 'valve',
      valve_type: 'shutoff',
      from: 'T2',
      to: 'J0',
      diameter_m: findPipeSize('pvc-sch40', '1-1/2"')?.id_m ?? 0.04,
      open: true,
      minor_loss: 0.5,
    },
    pipe('M1', 'Main, ridge', 'J0', 'J1', 75, 'pe-dr11-pe4710', '1-1/2"'),
    pipe('M2', 'Main, upper slope', 'J1', 'J2a', 50, 'pe-dr11-pe4710', '1-1/2"'),
    pipe('M3', 'Main, lower slope', 'J2a', 'J2', 55, 'pe-dr11-pe4710', '1-1/4"'),
    pipe('M4', 'Main to the house', 'J2', 'J3', 110, 'pe-dr11-pe4710', '1-1/4"'),
    pipe('L-J8', 'House and garden line', 'J3', 'J8', 40, 'pvc-sch40', '1"'),
    pipe('L-HOUSE', 'House service', 'J8', 'HOUSE', 25, 'pvc-sch40', '1"'),
    pipe('L-GARDEN', 'Garden line', 'J8', 'GARDEN', 40, 'pvc-sch40', '3/4"'),
    pipe('L-SHED', 'Shed line', 'J2', 'SHED', 70, 'pvc-sch40', '3/4"'),
    pipe('L-HYD', 'Hydrant line', 'J2', 'HYD', 50, 'pvc-sch40', '3/4"'),
    {
      id: 'V-ORCH',
      name: 'Orchard shut-off',
      kind: 'valve',
      valve_type: 'shutoff',
      from: 'J1',
      to: 'J4v',
      diameter_m: findPipeSize('pe-dr11-pe4710', '1-1/4"')?.id_m ?? 0.03,
      open: true,
    },
    pipe('L-ORCH', 'Orchard line', 'J4v', 'J4', 70, 'pe-dr11-pe4710', '1-1/4"'),
    {
      id: 'PRV1',
      name: 'Orchard pressure reducer',
      kind: 'valve',
      valve_type: 'prv',
      from: 'J4',
      to: 'J5',
      diameter_m: findPipeSize('pe-dr11-pe4710', '1"')?.id_m ?? 0.026,
      setting_m: 21,
    },
    pipe('L-ON', 'North block lateral feed', 'J5', 'ORCH-N', 80, 'pe-sidr15', '1"'),
    pipe('L-OS', 'South block lateral feed', 'J5', 'ORCH-S', 85, 'pe-sidr15', '1"'),
    {
      id: 'V-WEST',
      name: 'West paddocks shut-off',
      kind: 'valve',
      valve_type: 'shutoff',
      from: 'J2',
      to: 'J6v',
      diameter_m: findPipeSize('pe-sidr9', '1"')?.id_m ?? 0.026,
      open: true,
    },
    pipe('L-WEST', 'West paddocks line', 'J6v', 'J6', 90, 'pe-sidr9', '1"'),
    pipe('L-TR1', 'North-west trough line', 'J6', 'TR1', 100, 'pe-sidr9', '3/4"'),
    pipe('L-TR2', 'West trough line', 'J6', 'TR2', 90, 'pe-sidr9', '3/4"'),
    pipe('L-EAST1', 'East line', 'J1', 'J7a', 95, 'pe-sidr9', '1"'),
    pipe('L-EAST2', 'East line, far half', 'J7a', 'J7', 85, 'pe-sidr9', '1"'),
    pipe('L-TR3', 'East trough line', 'J7', 'TR3', 95, 'pe-sidr9', '3/4"'),
    // SIDR 11.5 (same bore as SIDR 9): at the bottom of the dip it works above 72 % of its rating, a review caution.
    pipe('L-TR4', 'South trough line (crosses the dip)', 'J3', 'TR4', 270, 'pe-sidr11.5', '3/4"', {
      vertices: [
        [260, 100],
        [350, 70],
      ],
      profile: [
        [0, 108],
        [60, 100],
        [110, 93],
        [150, 92],
        [200, 99],
        [240, 106],
        [270, 104],
      ],
    }),
  ],
};

const ORIFICE_D = Math.sqrt((4 * 0.001) / Math.PI);
const TANK_D = Math.sqrt(4 / Math.PI);

export const twoTankBank: NetworkDocument = {
  schema: 'runnel.network/1',
  headloss: 'hazen-williams',
  title: 'Two 1 m² tanks joined through a 0.001 m² orifice',
  nodes: [
    { id: 'TA', name: 'Tank A', kind: 'tank', elevation_m: 10, diameter_m: TANK_D, level_m: 1.5, min_level_m: 0, max_level_m: 2, bank: 'pair', x_m: 0, y_m: 0 },
    { id: 'TB', name: 'Tank B', kind: 'tank', elevation_m: 10, diameter_m: TANK_D, level_m: 0.5, min_level_m: 0, max_level_m: 2, bank: 'pair', x_m: 3, y_m: 0 },
  ],
  links: [{ id: 'OR', name: 'Orifice (Cd = 1)', kind: 'valve', valve_type: 'shutoff', from: 'TA', to: 'TB', diameter_m: ORIFICE_D, minor_loss: 1, open: true }],
};
