/**
 * The demo plan ("Hillside smallholding") as a designer first sees it, in a real browser at two
 * common laptop sizes: every element inside the canvas and clear of the scale bar, no
 * two labels printed over each other or over the overlays, and the elements that nearly touch at
 * whole-site zoom (the two ridge tanks of a bank, the well and its wellhead) each picked by a click.
 */
import { expect } from 'chai';
import type { Page } from 'playwright-core';
import { signIn, useBrowserApp } from './harness';
import { editorHook, findProject, openLayout, type LabelBox } from './layout-helpers';

type Box = Omit<LabelBox, 'id'>;

function intersect(a: Box, b: Box): boolean {
  return a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;
}

async function openDemo(page: Page, base: string): Promise<void> {
  await signIn(page, base, 'designer');
  await openLayout(page, base, await findProject(page, base, 'Hillside smallholding'));
  await page.getByTestId('results-key').waitFor();
  await page.waitForFunction(() => window.__runnelEditor!.labelBoxes().length > 10);
}

describe('Layout screen: the demo plan at first sight', function () {
  const ui = useBrowserApp();

  for (const [width, height] of [
    [1440, 900],
    [1366, 768],
  ]) {
    it(`${width}×${height}: fitted inside the canvas clear of the scale bar; labels never overlap; every outlet's state shown; near neighbours each clickable`, async () => {
      const page = await (await ui.newContext({ width, height })).newPage();
      await openDemo(page, ui.app.baseUrl);
      const canvas = (await page.getByTestId('layout-canvas').boundingBox())!;
      const scale = (await page.getByTestId('scale-bar').boundingBox())!;
      const overlays = [scale].map((b) => ({ x: b.x, y: b.y, w: b.width, h: b.height }));
      const doc = await editorHook.doc(page);
      for (const n of doc.nodes) {
        const p = await editorHook.toClient(page, n.x_m, n.y_m);
        expect(p.x, n.id).to.be.within(canvas.x + 12, canvas.x + canvas.width - 12);
        expect(p.y, n.id).to.be.within(canvas.y + 12, canvas.y + canvas.height - 12);
        for (const o of overlays) expect(intersect({ x: p.x - 12, y: p.y - 12, w: 24, h: 24 }, o), `${n.id} under an overlay`).to.equal(false);
      }
      const labels = await editorHook.labels(page);
      expect(labels.length).to.be.greaterThan(doc.nodes.length / 2);
      for (let i = 0; i < labels.length; i++) {
        for (let j = i + 1; j < labels.length; j++) expect(intersect(labels[i], labels[j]), `${labels[i].id} over ${labels[j].id}`).to.equal(false);
        for (const o of overlays) expect(intersect(labels[i], o), `${labels[i].id} under an overlay`).to.equal(false);
      }
      expect(labels.map((l) => l.id)).to.include('bank:ridge');
      // Every outlet's state reads without hovering: each outlet has its badge placed on the plan.
      const placed = new Set(labels.map((l) => l.id));
      for (const n of doc.nodes.filter((m) => m.kind === 'outlet')) expect(placed.has(n.id), `${n.id}'s badge is on the plan`).to.equal(true);
      // ...with its name under or beside the badge, not the badge alone (item 8: no outlet's name waits for a hover).
      const badgeOnly = labels.filter((b) => b.variant === 2).map((b) => b.id);
      for (const n of doc.nodes.filter((m) => m.kind === 'outlet')) expect(badgeOnly, `${n.id} shows its name`).to.not.include(n.id);
      for (const id of ['T1', 'T2', 'W', 'WH']) {
        const n = doc.nodes.find((m) => m.id === id)!;
        const p = await editorHook.toClient(page, n.x_m, n.y_m);
        await page.mouse.click(p.x, p.y);
        expect(await editorHook.selection(page), id).to.deep.equal([id]);
      }
    });
  }
});
