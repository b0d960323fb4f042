/**
 * Chart rendering: uPlot (the charting library of the Timeline and Profile screens) drawing four
 * series of 10,000 points each in headless Chromium at 1280 × 300 px. Reports the median time of a
 * full redraw (setData) and of a hover (cursor move and legend update); a frame at 60 Hz is
 * 16.7 ms, so both medians under that mean no dropped frames. Skips where Chromium is missing.
 * Runs alone with `npx tsx bench/chart-10k.ts`; `npm run bench` runs it last.
 */
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { chromium } from 'playwright-core';

const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export async function chart10k(): Promise<{ redraw_ms: number; hover_ms: number } | null> {
  if (!existsSync(CHROMIUM)) return null;
  const require = createRequire(import.meta.url);
  const lib = readFileSync(require.resolve('uplot/dist/uPlot.iife.min.js'), 'utf8');
  const css = readFileSync(require.resolve('uplot/dist/uPlot.min.css'), 'utf8');
  const browser = await chromium.launch({ executablePath: CHROMIUM, headless: true, args: ['--no-sandbox', '--disable-gpu'] });
  try {
    const page = await browser.newPage({ viewport: { width: 1320, height: 500 } });
    await page.setContent(`<style>${css}</style><div id="c"></div><script>${lib}</script>`);
    // plain JavaScript text: tsx's transform would add helpers the page does not have
    return (await page.evaluate(`(async () => {
      const n = 10000;
      const x = Float64Array.from({ length: n }, (_, i) => i / 60);
      const ys = [0, 1, 2, 3].map((k) => Float64Array.from({ length: n }, (_, i) => Math.sin(i / (200 + 50 * k)) + 0.1 * Math.sin(i / 7) + k));
      const colours = ['#17677a', '#a8692e', '#5b7f3a', '#7a4a8c'];
      const u = new uPlot({ width: 1280, height: 300, scales: { x: { time: false } }, series: [{}, ...ys.map((_, k) => ({ label: 's' + k, stroke: colours[k] }))] }, [x, ...ys], document.getElementById('c'));
      const median = (v) => { v.sort((a, b) => a - b); return v[v.length >> 1]; };
      const redraw = [];
      for (let r = 0; r < 15; r++) {
        const t0 = performance.now();
        u.setData([x, ...ys.map((y) => y.map((v) => v + r * 1e-3))]);
        // uPlot commits its draw in a microtask; wait for it and read a pixel so the canvas work is done
        await new Promise((res) => queueMicrotask(res));
        u.ctx.getImageData(640, 150, 1, 1);
        redraw.push(performance.now() - t0);
      }
      const hover = [];
      for (let r = 0; r < 60; r++) {
        const t0 = performance.now();
        u.setCursor({ left: 20 + r * 20, top: 100 });
        await new Promise((res) => queueMicrotask(res));
        hover.push(performance.now() - t0);
      }
      return { redraw_ms: median(redraw), hover_ms: median(hover) };
    })()`)) as { redraw_ms: number; hover_ms: number };
  } finally {
    await browser.close();
  }
}

export async function printChart10k(): Promise<void> {
  const r = await chart10k();
  if (!r) {
    console.log('\nchart rendering: skipped (no Chromium)');
    return;
  }
  console.log(
    `\nchart rendering, uPlot, 4 series × 10,000 points, 1280 × 300 px, headless Chromium: full redraw median ${r.redraw_ms.toFixed(1)} ms, hover median ${r.hover_ms.toFixed(2)} ms (a 60 Hz frame is 16.7 ms)`,
  );
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) await printChart10k();
