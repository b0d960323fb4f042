/**
 * Colour ramp for pressure margin (pressure − minimum pressure). Our own ramp from deep blue
 * through grey-olive to warm yellow: lightness rises steadily along it, and it avoids red–green
 * contrasts, so it reads for the common colour-vision deficiencies and in greyscale (the same
 * design idea as the published cividis map, Nuñez et al. 2018, PLoS ONE 13(7) — citation from
 * memory; stops our own).
 */
const STOPS: [number, [number, number, number]][] = [
  [0.0, [18, 38, 92]],
  [0.25, [62, 76, 112]],
  [0.5, [118, 118, 120]],
  [0.75, [182, 164, 98]],
  [1.0, [250, 222, 60]],
];

/** Margin (m of water) shown at the bottom and top of the ramp. */
export const MARGIN_RANGE_M: [number, number] = [-5, 25];

/** Colour at t in [0, 1] as #rrggbb. */
export function rampColour(t: number): string {
  const x = Math.max(0, Math.min(1, Number.isFinite(t) ? t : 0));
  let i = 1;
  while (i < STOPS.length - 1 && STOPS[i][0] < x) i++;
  const [t0, c0] = STOPS[i - 1];
  const [t1, c1] = STOPS[i];
  const f = t1 === t0 ? 0 : (x - t0) / (t1 - t0);
  const hex = (k: number) => Math.round(c0[k] + f * (c1[k] - c0[k])).toString(16).padStart(2, '0');
  return '#' + hex(0) + hex(1) + hex(2);
}

/** Colour for a pressure margin in metres of water. */
export function marginColour(margin_m: number): string {
  const [lo, hi] = MARGIN_RANGE_M;
  return rampColour((margin_m - lo) / (hi - lo));
}

/** Evenly spaced legend swatches from the bottom to the top of the range. */
export function legendStops(count = 6): { margin_m: number; colour: string }[] {
  const [lo, hi] = MARGIN_RANGE_M;
  return Array.from({ length: count }, (_, i) => {
    const m = lo + ((hi - lo) * i) / (count - 1);
    return { margin_m: m, colour: marginColour(m) };
  });
}

/** Relative luminance (WCAG 2.x definition) of a #rrggbb colour, 0..1. */
export function luminance(hex: string): number {
  const v = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const lin = v.map((c) => (c <= 0.04045 ? c / 12.92 : Math.pow((c + 0.055) / 1.055, 2.4)));
  return 0.2126 * lin[0] + 0.7152 * lin[1] + 0.0722 * lin[2];
}
