import type { NetworkDocument, NetworkLink, NetworkNode } from '../engine/network-document';

/**
 * A looped grid network for benchmarks: nx × ny tees 50 m apart on gently rolling ground, every
 * tee drawing 0.05 L/s, fed from a reservoir at each end of the first row through 200 mm mains; the
 * grid pipes alternate between 150, 100 and 80 mm so flows are uneven. Deterministic (seeded).
 *
 * @example
 * const doc = loopedGrid(100, 100); // 10,000 tees, 19,800 grid pipes
 */
export function loopedGrid(nx: number, ny: number): NetworkDocument {
  let seed = 12345;
  const random = (): number => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
  const nodes: NetworkNode[] = [];
  const links: NetworkLink[] = [];
  for (let y = 0; y < ny; y++)
    for (let x = 0; x < nx; x++) {
      nodes.push({ id: `J${x}_${y}`, kind: 'tee', elevation_m: 10 + 5 * Math.sin(x / 7) * Math.cos(y / 9) + random(), demand_m3s: 0.00005 });
    }
  const sizes = [0.15, 0.1, 0.08];
  const pipe = (id: string, from: string, to: string, d: number): void => {
    links.push({ id, kind: 'pipe', from, to, length_m: 50 + 10 * random(), diameter_m: d, roughness: 130 });
  };
  for (let y = 0; y < ny; y++)
    for (let x = 0; x < nx; x++) {
      const main = y % 10 === 0 || x % 10 === 0;
      if (x + 1 < nx) pipe(`H${x}_${y}`, `J${x}_${y}`, `J${x + 1}_${y}`, main ? 0.2 : sizes[(x + y) % 3]);
      if (y + 1 < ny) pipe(`V${x}_${y}`, `J${x}_${y}`, `J${x}_${y + 1}`, main ? 0.2 : sizes[(x + 2 * y) % 3]);
    }
  nodes.push({ id: 'R1', kind: 'source', elevation_m: 80, head_m: 80 });
  nodes.push({ id: 'R2', kind: 'source', elevation_m: 78, head_m: 78 });
  pipe('M1', 'R1', 'J0_0', 0.4);
  pipe('M2', 'R2', `J${nx - 1}_${ny - 1}`, 0.4);
  return { schema: 'runnel.network/1', headloss: 'hazen-williams', nodes, links };
}
