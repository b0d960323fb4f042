import type { NetworkDocument } from '../../engine';

/**
 * A ridge tank (water surface 102 m) feeding one outlet 100 m away over a hump at `hump_m`
 * mid-way: 0.2 L/s in 30 mm, Hazen-Williams C 150, about 0.37 m of friction (C), so the HGL at the
 * hump stands near 101.8 m. Whether the pipe clears the hump depends only on its cover there.
 * Shared by the cover checks of the engine and the API.
 */
export function humpLine(hump_m: number, ownCover?: number): NetworkDocument {
  return {
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    nodes: [
      { id: 'T', kind: 'tank', elevation_m: 100, diameter_m: 2, level_m: 2, min_level_m: 0.2, max_level_m: 2 },
      { id: 'O', kind: 'outlet', elevation_m: 40, demand_m3s: 0.0002, min_pressure_m: 10, outlet_type: 'hose-bib' },
    ],
    links: [
      {
        id: 'P',
        kind: 'pipe',
        from: 'T',
        to: 'O',
        length_m: 100,
        diameter_m: 0.03,
        roughness: 150,
        ...(ownCover === undefined ? {} : { cover_m: ownCover }),
        profile: [
          [0, 100],
          [50, hump_m],
          [100, 40],
        ],
      },
    ],
  };
}
