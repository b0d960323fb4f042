/**
 * Editing on the Layout screen end to end, as its users meet it: real server (fresh PGlite, demo
 * seed), built client, Chromium driven with the mouse and keyboard. Placing from the palette and
 * drawing pipes, undo and redo, units, autosave (offline and back) and a save conflict in two
 * windows. The editor's test hook (`window.__runnelEditor`, see client/src/app/screens/layout/README.md)
 * is only read; every change goes through the screen. Server-side checks use the HTTP API with
 * the page's own session cookie and CSRF token (server/API.md).
 */
import { expect } from 'chai';
import { hwLoss, minorLoss } from '../engine/hand-formulas';
import { signIn, useBrowserApp } from './harness';
import {
  apiCall,
  asStored,
  canvasPoint,
  clickNode,
  clickWorld,
  createProject,
  dragFromPalette,
  editorHook,
  getNetwork,
  openInTwoWindows,
  openLayout,
  saveStatus,
  setProperty,
  shot,
  smallNetwork,
  snackText,
  waitForLayout,
  waitForNodeCount,
  waitSaved,
  waitSavedAfterEdit,
  waitSolved,
  type E2eDoc,
} from './layout-helpers';

describe('Layout screen: editing end to end (Chromium, real server)', function () {
  const ui = useBrowserApp({ viewport: { width: 1366, height: 800 } });

  it('a designer builds tank → tee → outlet from the palette, sees a pressure at the outlet, and the saved network survives a reload unchanged', async () => {
    const { app, page } = ui;
    await signIn(page, app.baseUrl, 'designer');
    // A new empty project, made on the projects screen (SI units).
    await page.getByTestId('new-project').click();
    await page.getByTestId('project-form-name').fill('Orchard line');
    await page.getByTestId('project-form-units-si').click();
    await page.getByTestId('project-form-save').click();
    await page.waitForURL(/\/projects\/[^/]+\/layout/);
    const projectId = new URL(page.url()).pathname.split('/')[2];
    await page.getByTestId('tab-layout').click();
    await waitForLayout(page);
    expect((await editorHook.doc(page)).nodes).to.have.length(0);
    expect(await page.getByTestId('layout-empty').isVisible()).to.equal(true);

    await dragFromPalette(page, 'tank', await canvasPoint(page, 0.2, 0.25));
    await dragFromPalette(page, 'tee', await canvasPoint(page, 0.5, 0.5));
    await dragFromPalette(page, 'outlet', await canvasPoint(page, 0.8, 0.75));
    let doc = await editorHook.doc(page);
    expect(doc.nodes.map((n) => n.kind)).to.deep.equal(['tank', 'tee', 'outlet']);
    const [tank, tee, outlet] = doc.nodes;

    // Pipe tool: click the start element, click the end element (twice).
    // Pipe tool: click the start element, click the end element (twice); the first pipe is bent
    // by a click on empty ground on the way, and its length is the drawn length through the bend.
    await page.getByTestId('tool-pipe').click();
    await clickNode(page, tank.id);
    await clickWorld(page, tee.x_m, tank.y_m);
    await clickNode(page, tee.id);
    await clickNode(page, tee.id);
    await clickNode(page, outlet.id);
    doc = await editorHook.doc(page);
    expect(doc.links.map((l) => `${l.kind}:${l.from}->${l.to}`)).to.deep.equal([`pipe:${tank.id}->${tee.id}`, `pipe:${tee.id}->${outlet.id}`]);
    expect(doc.links[0].vertices).to.have.length(1);
    expect(doc.links[1].vertices ?? []).to.have.length(0);
    const [vx, vy] = doc.links[0].vertices![0];
    const drawn = Math.hypot(vx - tank.x_m, vy - tank.y_m) + Math.hypot(tee.x_m - vx, tee.y_m - vy);
    expect(doc.links[0].length_m).to.be.closeTo(drawn, 0.01);

    // Elevations in the properties panel: tank 45 m up the hill, tee 20 m, outlet 5 m.
    await page.getByTestId('tool-select').click();
    await clickNode(page, tank.id);
    expect(await editorHook.selection(page)).to.deep.equal([tank.id]);
    await setProperty(page, 'prop-elevation', '45');
    await clickNode(page, tee.id);
    await setProperty(page, 'prop-elevation', '20');
    await clickNode(page, outlet.id);
    await setProperty(page, 'prop-elevation', '5');
    doc = await editorHook.doc(page);
    expect(doc.nodes.map((n) => n.elevation_m)).to.deep.equal([45, 20, 5]);

    // The live result at the outlet: a positive pressure with its unit (SI project: kPa). The list
    // follows the solver, so wait for the solve of the latest edit: the static head is 45 + 1.2 − 5 =
    // 41.2 m ≈ 404 kPa (conventional metre of water = 9.80665 kPa, NIST SP 811 appendix B, from
    // memory); friction takes some of that.
    const staticKPa = (45 + 1.2 - 5) * 9.80665;
    const valueOf = (t: string) => Number(/(-?[\d,.]+)\s*kPa/.exec(t)?.[1]?.replace(/,/g, '') ?? NaN);
    const value = page.getByTestId(`result-${outlet.id}`).locator('.value');
    try {
      await page.waitForFunction(
        ([id, max]) => {
          const m = /(-?[\d,.]+)\s*kPa/.exec(document.querySelector(`[data-testid=result-${id}] .value`)?.textContent ?? '');
          const v = m ? Number(m[1].replace(/,/g, '')) : NaN;
          return v > max / 2 && v <= max; // neither an earlier solve (tank at 0 m: ~10 kPa; outlet at 0 m: ~440 kPa) nor nonsense
        },
        [outlet.id, staticKPa + 1] as const,
        { timeout: 15000 },
      );
    } finally {
      await shot(page, '1-three-elements');
    }
    const kPa = valueOf((await value.textContent()) ?? '');
    // Worked by hand from the drawn document: the outlet's demand runs through both pipes (the tee draws
    // nothing), each losing Hazen-Williams friction and K·v²/2g (spec/engine/hand-formulas.ts); whole kPa shown.
    const drawnDoc = await editorHook.doc(page);
    const out = drawnDoc.nodes.find((n) => n.id === outlet.id) as unknown as { demand_m3s: number };
    const tankNow = drawnDoc.nodes.find((n) => n.id === tank.id) as unknown as { level_m: number };
    let metres = 45 + tankNow.level_m - 5;
    for (const l of drawnDoc.links as unknown as { length_m: number; diameter_m: number; roughness: number; minor_loss?: number }[])
      metres -= hwLoss(out.demand_m3s, l.length_m, l.diameter_m, l.roughness) + minorLoss(l.minor_loss ?? 0, out.demand_m3s, l.diameter_m);
    expect(metres * 9.80665).to.be.within(staticKPa * 0.5, staticKPa);
    expect(kPa).to.be.closeTo(metres * 9.80665, 0.5 + 1e-9);
    expect(await editorHook.solveMs(page), 'the worker reported its solve time').to.be.greaterThan(0);
    // The outlet's state in words, readable without hovering: on its results row and on the plan.
    expect(await page.getByTestId(`result-${outlet.id}`).locator('.state').textContent()).to.match(/^(OK|close|short) [+−±]/);
    expect((await editorHook.labels(page)).map((l) => l.id)).to.include(outlet.id);

    await waitSavedAfterEdit(page);
    const before = await editorHook.doc(page);
    const stored = await getNetwork(page, app.baseUrl, projectId);
    expect(stored.document).to.deep.equal(asStored(before));

    await page.reload();
    await waitForLayout(page);
    await waitForNodeCount(page, 3);
    const after = await editorHook.doc(page);
    expect(asStored(after)).to.deep.equal(asStored(before));
    expect(await saveStatus(page)).to.equal('Saved');
    await shot(page, '1-after-reload');
  });

  it('undo and redo restore each earlier document exactly (place, move, property, delete)', async () => {
    const { app, page } = ui;
    await signIn(page, app.baseUrl, 'designer');
    const projectId = await createProject(page, app.baseUrl, 'Undo walk');
    await openLayout(page, app.baseUrl, projectId);
    const snaps: E2eDoc[] = [await editorHook.doc(page)];
    const record = async () => {
      const d = await editorHook.doc(page);
      expect(d, `edit ${snaps.length} changed nothing`).to.not.deep.equal(snaps[snaps.length - 1]);
      snaps.push(d);
    };

    await dragFromPalette(page, 'tank', await canvasPoint(page, 0.3, 0.3));
    await record(); // 1: tank placed
    await dragFromPalette(page, 'outlet', await canvasPoint(page, 0.6, 0.6));
    await record(); // 2: outlet placed
    const outlet = snaps[2].nodes.find((n) => n.kind === 'outlet')!;
    const tank = snaps[2].nodes.find((n) => n.kind === 'tank')!;
    // Escape abandons a link being drawn: the valve tool's first click, then Escape, changes nothing.
    await page.getByTestId('tool-valve').click();
    await clickNode(page, tank.id);
    await page.keyboard.press('Escape');
    expect(await editorHook.doc(page), 'after Escape').to.deep.equal(snaps[2]);
    await page.getByTestId('tool-select').click();
    const p = await editorHook.toClient(page, outlet.x_m, outlet.y_m);
    await page.mouse.move(p.x, p.y);
    await page.mouse.down();
    for (let i = 1; i <= 12; i++) await page.mouse.move(p.x + i * 6, p.y + i * 3);
    await page.mouse.up();
    await record(); // 3: outlet moved
    const moved = snaps[3].nodes.find((n) => n.id === outlet.id)!;
    expect(moved.x_m).to.be.greaterThan(outlet.x_m);
    expect(moved.y_m).to.be.lessThan(outlet.y_m); // y up on the site, down on screen
    await setProperty(page, 'prop-name', 'Lower trough');
    await record(); // 4: renamed
    expect(snaps[4].nodes.find((n) => n.id === outlet.id)!.name).to.equal('Lower trough');
    await clickNode(page, tank.id);
    await page.keyboard.press('Delete');
    await record(); // 5: tank deleted
    expect(snaps[5].nodes.map((n) => n.id)).to.deep.equal([outlet.id]);

    for (let i = snaps.length - 2; i >= 0; i--) {
      await page.keyboard.press('Control+z');
      expect(await editorHook.doc(page), `after undo back to snapshot ${i}`).to.deep.equal(snaps[i]);
    }
    await page.waitForFunction(() => (document.querySelector('[data-testid=undo-button]') as HTMLButtonElement).disabled, null, { timeout: 3000 });
    for (let i = 1; i < snaps.length; i++) {
      await page.keyboard.press('Shift+Control+z');
      expect(await editorHook.doc(page), `after redo to snapshot ${i}`).to.deep.equal(snaps[i]);
    }
    // The toolbar buttons step the same way as the keys.
    await page.getByTestId('undo-button').click();
    expect(await editorHook.doc(page), 'after the undo button').to.deep.equal(snaps[snaps.length - 2]);
    await page.getByTestId('redo-button').click();
    expect(await editorHook.doc(page), 'after the redo button').to.deep.equal(snaps[snaps.length - 1]);
    await page.waitForFunction(() => (document.querySelector('[data-testid=redo-button]') as HTMLButtonElement).disabled, null, { timeout: 3000 });
    await waitSavedAfterEdit(page);
    expect((await getNetwork(page, app.baseUrl, projectId)).document).to.deep.equal(asStored(snaps[snaps.length - 1]));
  });

  it('two saves from the same version: the API answers 409 with the current copy; in two windows the conflict dialog asks, and Keep mine saves over it', async () => {
    const { app, page } = ui;
    await signIn(page, app.baseUrl, 'designer');
    const projectId = await createProject(page, app.baseUrl, 'Two windows');
    const path = `/api/projects/${projectId}/network`;

    // API: first save from version 0 wins; the second from version 0 is refused with `current`.
    const base = smallNetwork('first');
    const first = await apiCall(page, app.baseUrl, 'PUT', path, { version: 0, document: base });
    expect(first.status()).to.equal(200);
    const v1 = ((await first.json()) as { version: number }).version;
    const stale = await apiCall(page, app.baseUrl, 'PUT', path, { version: 0, document: { ...base, title: 'second' } });
    expect(stale.status()).to.equal(409);
    const body = (await stale.json()) as { error: { code: string }; current: { version: number; document: E2eDoc } };
    expect(body.error.code).to.equal('conflict');
    expect(body.current.version).to.equal(v1);
    expect(body.current.document).to.deep.equal(base);
    let server = await getNetwork(page, app.baseUrl, projectId);
    expect(server.version).to.equal(v1);
    expect(server.document).to.deep.equal(base); // nothing lost, nothing half-written

    // UI: the same designer in two windows, both opened at version v1 (the second context is closed after the test).
    {
      const { pageA, pageB } = await openInTwoWindows(ui, app.baseUrl, projectId);

      await clickNode(pageA, 'T1');
      await setProperty(pageA, 'prop-name', 'Ridge tank');
      await waitSavedAfterEdit(pageA);
      const savedByA = await getNetwork(pageA, app.baseUrl, projectId);
      expect(savedByA.version).to.equal(v1 + 1);
      expect(savedByA.document.nodes[0].name).to.equal('Ridge tank');

      await clickNode(pageB, 'O1');
      await setProperty(pageB, 'prop-name', 'Garden tap');
      await pageB.getByTestId('conflict-keep-mine').waitFor({ timeout: 15000 });
      expect(await saveStatus(pageB)).to.equal('Conflict');
      const dialog = ((await pageB.locator('mat-dialog-container').textContent()) ?? '').replace(/\s+/g, ' ');
      expect(dialog).to.contain(`Version ${v1 + 1} was saved by Dana Designer`);
      expect(dialog).to.contain('Your changes are still here, unsaved');
      // What differs, element by element, against the version both windows opened.
      expect(((await pageB.getByTestId('conflict-summary').textContent()) ?? '').trim()).to.equal(
        'Theirs: 1 element changed (Ridge tank); yours: 1 element changed (Garden tap).',
      );
      expect(await pageB.getByTestId('conflict-load-theirs').isVisible()).to.equal(true);
      await shot(pageB, '4-conflict-dialog');
      // The local edit is kept while the dialog is open.
      const mine = await editorHook.doc(pageB);
      expect(mine.nodes.find((n) => n.id === 'O1')!.name).to.equal('Garden tap');

      await pageB.getByTestId('conflict-keep-mine').click();
      await waitSaved(pageB);
      server = await getNetwork(pageB, app.baseUrl, projectId);
      expect(server.version).to.equal(v1 + 2);
      expect(server.document).to.deep.equal(asStored(mine));
      // What the product promises: no silent loss. Keep mine replaces A's save as a whole (no merge),
      // after the dialog said so ("Keep mine saves your version over theirs").
      expect(server.document.nodes[0].name).to.equal('T1');

      // Window A is now stale too: its next edit is not saved over B's; it is asked the same question.
      await clickNode(pageA, 'O1');
      await setProperty(pageA, 'prop-name', 'Yard tap');
      await pageA.getByTestId('conflict-load-theirs').waitFor({ timeout: 15000 });
      await pageA.getByTestId('conflict-load-theirs').click();
      await waitSaved(pageA);
      expect(asStored(await editorHook.doc(pageA))).to.deep.equal(server.document);
      const final = await getNetwork(pageA, app.baseUrl, projectId);
      expect(final.version).to.equal(v1 + 2);
    }
  });

  it('a window with nothing unsaved notices a version saved elsewhere when it regains focus, loads it and says so', async () => {
    const { app, page } = ui;
    await signIn(page, app.baseUrl, 'designer');
    const projectId = await createProject(page, app.baseUrl, 'Stale window');
    const put = await apiCall(page, app.baseUrl, 'PUT', `/api/projects/${projectId}/network`, { version: 0, document: smallNetwork('start') });
    expect(put.status()).to.equal(200);
    const { pageA, pageB } = await openInTwoWindows(ui, app.baseUrl, projectId);
    await clickNode(pageB, 'O1');
    await setProperty(pageB, 'prop-name', 'Lower tap');
    await waitSavedAfterEdit(pageB);
    const saved = await getNetwork(pageB, app.baseUrl, projectId);
    expect(await saveStatus(pageA)).to.equal('Saved');
    // Window A comes back to the front (the browser's focus event).
    await pageA.evaluate(() => window.dispatchEvent(new Event('focus')));
    expect(await snackText(pageA)).to.contain(`Reloaded version ${saved.version} saved by Dana Designer`);
    expect(asStored(await editorHook.doc(pageA))).to.deep.equal(saved.document);
    expect(await saveStatus(pageA)).to.equal('Saved');
    // A's next edit saves over B's version without a conflict.
    await clickNode(pageA, 'T1');
    await setProperty(pageA, 'prop-name', 'Hill tank');
    await waitSavedAfterEdit(pageA);
    const after = await getNetwork(pageA, app.baseUrl, projectId);
    expect(after.version).to.equal(saved.version + 1);
    expect(after.document.nodes.map((n) => n.name)).to.include.members(['Hill tank', 'Lower tap']);
  });

  it('in a US-units project: an elevation typed in feet is kept in metres and results read in psi; offline, the chip says so and the edits are saved once the network is back', async () => {
    const { app, page } = ui;
    await signIn(page, app.baseUrl, 'designer');
    const projectId = await createProject(page, app.baseUrl, 'Offline in feet', 'us');
    expect(
      (await apiCall(page, app.baseUrl, 'PUT', `/api/projects/${projectId}/network`, { version: 0, document: smallNetwork('offline') })).status(),
    ).to.equal(200);
    await openLayout(page, app.baseUrl, projectId);
    await waitSolved(page);
    await page.getByTestId('result-O1').waitFor();
    expect(await page.getByTestId('result-O1').textContent()).to.match(/psi/);

    let blocked = true;
    await page.route('**/api/projects/*/network', (route) =>
      blocked && route.request().method() === 'PUT' ? route.abort('internetdisconnected') : route.continue(),
    );
    await clickNode(page, 'T1');
    expect(await editorHook.selection(page)).to.deep.equal(['T1']);
    await setProperty(page, 'prop-elevation', '135');
    expect((await editorHook.doc(page)).nodes[0].elevation_m).to.be.closeTo(135 * 0.3048, 1e-9); // 1 ft = 0.3048 m exactly (NIST SP 811)
    await setProperty(page, 'prop-name', 'Offline edit');
    await page.waitForFunction(() => document.querySelector('[data-testid=save-status]')?.textContent?.includes('Offline'), null, { timeout: 10000 });
    blocked = false;
    await waitSaved(page);
    const after = await getNetwork(page, app.baseUrl, projectId);
    expect(after.document.nodes[0].name).to.equal('Offline edit');
    expect(after.document.nodes[0].elevation_m).to.be.closeTo(41.148, 1e-9);

    await page.reload();
    await waitForLayout(page);
    await waitForNodeCount(page, 2);
    expect(asStored(await editorHook.doc(page))).to.deep.equal(after.document);
    await page.getByTestId('result-O1').waitFor();
    expect(await page.getByTestId('result-O1').textContent()).to.match(/psi/);
  });
  it('a value may be typed in either unit system: "135 ft" in a metre field, "10 psi" in kPa, and a wrong unit is refused in words', async () => {
    const { app, page } = ui;
    await signIn(page, app.baseUrl, 'designer');
    const projectId = await createProject(page, app.baseUrl, 'Mixed units', 'si');
    expect((await apiCall(page, app.baseUrl, 'PUT', `/api/projects/${projectId}/network`, { version: 0, document: smallNetwork('mixed') })).status()).to.equal(
      200,
    );
    await openLayout(page, app.baseUrl, projectId);
    await clickNode(page, 'T1');
    await setProperty(page, 'prop-elevation', '135 ft');
    // 1 ft = 0.3048 m exactly (NIST SP 811): 135 ft = 41.148 m, shown back in the field's own unit.
    await page.waitForFunction(() => (document.querySelector('[data-testid=prop-elevation]') as HTMLInputElement).value === '41.148');
    expect((await editorHook.doc(page)).nodes[0].elevation_m).to.be.closeTo(41.148, 1e-9);
    await clickNode(page, 'O1');
    await setProperty(page, 'prop-min-pressure', '10 psi');
    // 10 psi = 68 947.57 Pa = 7.0307 m of water (1 m H2O = 9806.65 Pa).
    const o1 = (await editorHook.doc(page)).nodes.find((n) => n.id === 'O1')!;
    expect(o1.min_pressure_m).to.be.closeTo(68947.57293168 / 9806.65, 1e-5);
    expect(await page.getByTestId('prop-min-pressure').inputValue()).to.equal('68.9');
    await setProperty(page, 'prop-min-pressure', '12 kg');
    expect(await page.getByTestId('prop-min-pressure-error').innerText()).to.equal('"12 kg" is not a pressure (try psi or kPa)');
    expect((await editorHook.doc(page)).nodes.find((n) => n.id === 'O1')!.min_pressure_m).to.be.closeTo(7.0307, 1e-4);
  });
  it('a drip zone described as rows of tape: 6 rows × 25 m, an emitter every 30 cm at 1.6 L/h is 500 emitters and 800 L/h', async () => {
    const { app, page } = ui;
    await signIn(page, app.baseUrl, 'designer');
    const projectId = await createProject(page, app.baseUrl, 'Tape zone', 'si');
    const doc = smallNetwork('tape');
    Object.assign(doc.nodes[1], { outlet_type: 'drip-zone', emitters: 100, demand_m3s: 100 * (2e-3 / 3600) });
    expect((await apiCall(page, app.baseUrl, 'PUT', `/api/projects/${projectId}/network`, { version: 0, document: doc })).status()).to.equal(200);
    await openLayout(page, app.baseUrl, projectId);
    await clickNode(page, 'O1');
    await page.getByTestId('prop-drip-entry').click();
    await page.getByRole('option', { name: 'Rows of drip tape' }).click();
    await page.getByTestId('prop-tape-rows').waitFor();
    expect(await page.getByTestId('prop-emitters').count()).to.equal(0);
    await setProperty(page, 'prop-tape-rows', '6');
    await setProperty(page, 'prop-tape-row-length', '25 m');
    await setProperty(page, 'prop-tape-spacing', '30 cm');
    await setProperty(page, 'prop-emitter-flow', '1.6 L/h');
    const o1 = (await editorHook.doc(page)).nodes.find((n) => n.id === 'O1')!;
    expect(o1.drip_tape).to.deep.equal({ rows: 6, row_length_m: 25, spacing_m: 0.3 });
    expect(o1.emitters).to.equal(500);
    // C: 6 × 25 m ÷ 0.3 m = 500 emitters × 1.6 L/h = 800 L/h = 0.2222 L/s.
    expect((o1.demand_m3s as number) * 3.6e6).to.be.closeTo(800, 1e-6);
    expect(await page.getByTestId('prop-emitter-flow-hint').innerText()).to.equal('500 emitters in the zone');
  });
});
