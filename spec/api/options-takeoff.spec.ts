/**
 * Options, price list, takeoff, estimate and the workbook through the API on the seeded demo:
 * two options with different mainlines differ in pressure and cost; sizing beats the largest
 * design; the exported workbook read back matches the document and price list exactly; a
 * malformed price list names row and column and imports nothing; the role rules hold.
 */
import { expect } from 'chai';
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { eq } from 'drizzle-orm';
import { priceItems } from '../../drizzle/schema';
import { countFittings, minorLossAllowance, solve, type NetworkDocument, type PipeLink } from '../../engine';
import { failingCheckCount } from '../../engine/review';
import { humpLine } from '../engine/hump-line';
import { binaryBody, startTestApp, type TestApp } from './test-app';

describe('API: options, prices, takeoff and export', () => {
  let t: TestApp;
  let base: string;
  before(async function () {
    this.timeout(90000);
    t = await startTestApp();
    base = `/api/projects/${t.seeded!.demoProjectId}`;
  });
  after(async () => {
    await t.close();
  });

  it('the two demo options with different mainline sizes show different pressures and costs', async () => {
    const owner = await t.signInAs('owner');
    const res = await owner.get(`${base}/options`).expect(200);
    const [big, small] = ['Mainline 2 in', 'Mainline 1 in'].map((n) => res.body.options.find((o: { name: string }) => o.name === n));
    expect(big.differences.pipes).to.include.members(['M1', 'M2', 'M3', 'M4']);
    // each option's lowest outlet is what the engine solves for that option's stored document, and the wider
    // main loses less head to friction, so its lowest outlet stands higher (Hazen-Williams: loss ∝ D^−4.87)
    for (const o of [big, small]) {
      const doc = (await owner.get(`${base}/options/${o.id}`).expect(200)).body.document as NetworkDocument;
      expect(o.summary.lowestOutlet.pressure_m, o.name).to.be.closeTo(solve(doc).nodes[o.summary.lowestOutlet.id].pressure_m, 1e-9);
    }
    expect(big.summary.lowestOutlet.pressure_m).to.be.above(small.summary.lowestOutlet.pressure_m);
    expect(big.summary.pipeCost).to.be.above(small.summary.pipeCost);
    expect(big.summary.total).to.be.above(small.summary.total);
    // the current design's failing review checks, counted by the engine on the stored network
    const current = (await owner.get(`${base}/network`).expect(200)).body.document as NetworkDocument;
    expect(res.body.current.summary.failingChecks).to.equal(failingCheckCount(current));
  });

  it('a designer makes an option and sizes it: every outlet passes at less than the largest-size cost', async () => {
    const designer = await t.signInAs('designer');
    const made = await designer.post(`${base}/options`, { name: 'Sized from the list' }).expect(201);
    const sized = await designer.post(`${base}/options/${made.body.id}/size`, {}).expect(200);
    expect(sized.body.feasible).to.equal(true);
    expect(sized.body.cost).to.be.below(sized.body.largestCost);
    expect(sized.body.check.outlets.every((o: { passes: boolean }) => o.passes)).to.equal(true);
    expect(sized.body.regions.map((r: { method: string }) => r.method)).to.include('exact dynamic programming');
    const option = await designer.get(`${base}/options/${made.body.id}`).expect(200);
    const changed = (option.body.document as NetworkDocument).links.filter(
      (l) =>
        l.kind === 'pipe' &&
        sized.body.choices.some((c: { pipe: string; key: string }) => c.pipe === l.id && c.key === `${(l as PipeLink).series}/${(l as PipeLink).nominal}`),
    );
    expect(changed).to.have.length(sized.body.choices.length);
  });

  it('an option can take its minor losses from the counted fittings, and move a tank', async () => {
    const designer = await t.signInAs('designer');
    const made = await designer.post(`${base}/options`, { name: 'Counted losses' }).expect(201);
    await designer.patch(`${base}/options/${made.body.id}`, { countedMinorLoss: true, tanks: [{ id: 'T1', elevation_m: 160 }] }).expect(200);
    const doc = (await designer.get(`${base}/options/${made.body.id}`).expect(200)).body.document as NetworkDocument;
    const expected = minorLossAllowance(doc, countFittings(doc, { bendAngle_deg: 30 }), 0.05);
    for (const l of doc.links) if (l.kind === 'pipe') expect((l as PipeLink).minor_loss, l.id).to.equal(expected[l.id].k);
    expect(doc.nodes.find((n) => n.id === 'T1')!.elevation_m).to.equal(160);
    const bad = await designer.patch(`${base}/options/${made.body.id}`, { pipes: [{ id: 'NOPE', series: 'pe-sidr9', nominal: '1"' }] }).expect(400);
    expect(bad.body.error.message).to.equal('pipes.0.id: NOPE is not a pipe of this option');
  });

  it('owners mark the preferred option (who and when recorded) and never edit the design; reviewers read', async () => {
    const owner = await t.signInAs('owner');
    const list = await owner.get(`${base}/options`).expect(200);
    const target = list.body.options[0];
    await owner.patch(`${base}/options/${target.id}`, { name: 'Owner rename' }).expect(403);
    await owner.put(`${base}/network`, { version: 1, document: {} }).expect(403);
    await owner.post(`${base}/options/${target.id}/prefer`).expect(200);
    const after = await owner.get(`${base}/options`).expect(200);
    const marked = after.body.options.find((o: { id: string }) => o.id === target.id);
    expect(marked).to.include({ preferred: true, preferredBy: 'Morgan Owner' });
    expect(Date.parse(marked.preferredAt)).to.be.closeTo(Date.now(), 60000);
    expect(after.body.options.filter((o: { preferred: boolean }) => o.preferred)).to.have.length(1);
    const reviewer = await t.signInAs('reviewer');
    await reviewer.get(`${base}/options`).expect(200);
    await reviewer.post(`${base}/options/${target.id}/prefer`).expect(403);
    await reviewer.patch('/api/prices/00000000-0000-0000-0000-000000000000', { price: 1 }).expect(403);
    const designer = await t.signInAs('designer');
    await designer.post('/api/prices', { code: 'other/x', price: 1 }).expect(403);
  });

  it('the owner accepts the estimate (recorded); a changed estimate is refused', async () => {
    const owner = await t.signInAs('owner');
    const takeoff = await owner.get(`${base}/takeoff`).expect(200);
    await owner.post(`${base}/estimate/accept`, { total: takeoff.body.estimate.total + 1 }).expect(409);
    const ok = await owner.post(`${base}/estimate/accept`, { total: takeoff.body.estimate.total }).expect(201);
    expect(ok.body.total).to.equal(takeoff.body.estimate.total);
    const again = await owner.get(`${base}/takeoff`).expect(200);
    expect(again.body.acceptances[0]).to.include({ acceptedBy: 'Morgan Owner', total: takeoff.body.estimate.total, design: 'Current design' });
  });

  it('a malformed price list reports row and column and imports nothing (CSV and XLSX)', async () => {
    const est = await t.signInAs('estimator');
    const count = async () => (await t.db.select().from(priceItems).where(eq(priceItems.teamId, t.seeded!.demoTeamId))).length;
    const before = await count();
    const bad = await est
      .upload('/api/prices/import', { bytes: Buffer.from('code,description,unit,price\nother/a,A,each,2\nother/b,B,each,two\n'), filename: 'p.csv' })
      .expect(400);
    expect(bad.body.error.message).to.equal('Row 3, column "price": must be a number ≥ 0 or empty (got "two"). Nothing was imported.');
    expect(bad.body.error.line).to.equal(3);
    const book = new ExcelJS.Workbook();
    const ws = book.addWorksheet('Prices');
    ws.addRows([
      ['code', 'description', 'unit', 'price'],
      ['other/c', 'C', 'each', 1],
      ['', 'no code', 'each', 4],
    ]);
    const badX = await est.upload('/api/prices/import', { bytes: Buffer.from(await book.xlsx.writeBuffer()), filename: 'p.xlsx' }).expect(400);
    expect(badX.body.error.message).to.match(/^Row 3, column "code": is empty/);
    expect(await count()).to.equal(before);
    const good = await est
      .upload('/api/prices/import', { bytes: Buffer.from('code,description,unit,price\nother/a,A,each,2\nother/b,B,each,\n'), filename: 'p.csv' })
      .expect(200);
    expect(good.body).to.deep.equal({ imported: 2, created: 2, updated: 0 });
    expect((await est.get('/api/prices').expect(200)).body.find((r: { code: string }) => r.code === 'other/b').price).to.equal(null);
  });

  it('the workbook read back has its sheets; lengths, fitting counts and totals match the document and price list exactly', async () => {
    const est = await t.signInAs('estimator');
    await est
      .put(`${base}/takeoff/settings`, {
        waste_fraction: 0.08,
        bendAngle_deg: 30,
        other: [{ code: 'other/trenching', description: 'Trenching', unit: 'm', per_pipe_m: 1 }],
        labour_hours: 24,
        labour_rate: 42.5,
        markup_fraction: 0.12,
        tax_fraction: 0.0625,
        currency: 'USD',
      })
      .expect(200);
    const takeoff = (await est.get(`${base}/takeoff`).expect(200)).body;
    const xlsx = await est.get(`${base}/export.xlsx`).buffer(true).parse(binaryBody).expect(200);
    expect(xlsx.headers['content-type']).to.match(/spreadsheetml/);
    const book = new ExcelJS.Workbook();
    await book.xlsx.load(xlsx.body);
    expect(book.worksheets.map((w) => w.name)).to.deep.equal(['Summary', 'Takeoff', 'Estimate', 'Outlets', 'Pipes', 'Tank timeline', 'Options']);
    expect(book.getWorksheet('Summary')!.getCell('B10').value).to.match(/local codes and licensed practice/);
    // pipe lengths per item equal the document's pipes (network length) and the waste rule
    const network = (await est.get(`${base}/network`).expect(200)).body.document as NetworkDocument;
    const sheet = book.getWorksheet('Takeoff')!;
    const rows = new Map<string, ExcelJS.Row>();
    sheet.eachRow((row, n) => {
      if (n > 1) rows.set(String(row.getCell(1).value), row);
    });
    const byItem = new Map<string, number>();
    for (const l of network.links) if (l.kind === 'pipe') byItem.set(`${l.series}/${l.nominal}`, (byItem.get(`${l.series}/${l.nominal}`) ?? 0) + l.length_m);
    for (const [code, length] of byItem) {
      expect(rows.get(code)!.getCell(6).value, code).to.be.closeTo(length, 1e-9);
      expect(rows.get(code)!.getCell(7).value, code).to.be.closeTo(length * 1.08, 1e-3);
    }
    // fitting counts equal the takeoff's
    for (const r of takeoff.takeoff.rows) expect(rows.get(r.code)!.getCell(4).value, r.code).to.equal(r.quantity);
    // totals: every amount is ROUND(quantity × list price, 2) from the team's list, and the total adds up
    const prices = new Map((await est.get('/api/prices').expect(200)).body.map((p: { code: string; price: number | null }) => [p.code, p.price]));
    const estimate = book.getWorksheet('Estimate')!;
    let materials = 0;
    estimate.eachRow((row, n) => {
      if (n === 1 || n > takeoff.estimate.lines.length + 1) return;
      const code = String(row.getCell(1).value);
      const price = prices.get(code) as number | null;
      const amount = (row.getCell(6).value as ExcelJS.CellFormulaValue).result as number;
      expect(amount, code).to.equal(price === null || price === undefined ? 0 : Math.round(Number(row.getCell(3).value) * price * 100 + 1e-9) / 100);
      materials += amount;
    });
    const cell = (label: string) => {
      let v = NaN;
      estimate.eachRow((row) => {
        if (row.getCell(2).value === label) v = (row.getCell(6).value as ExcelJS.CellFormulaValue).result as number;
      });
      return v;
    };
    expect(cell('Materials')).to.equal(Math.round(materials * 100) / 100);
    expect(cell('Labour')).to.equal(1020);
    expect(cell('Total')).to.equal(takeoff.estimate.total);
    expect(cell('Total')).to.equal(Math.round((cell('Materials') + cell('Labour') + cell('Markup') + cell('Tax')) * 100) / 100);
    expect(estimate.views[0]).to.include({ state: 'frozen', ySplit: 1 });
    const csv = await est.get(`${base}/takeoff.csv`).expect(200);
    expect(csv.text.split('\n')[0]).to.match(/^code,description,group,quantity,unit/);
    expect(csv.text.trim().split('\n')).to.have.length(takeoff.takeoff.rows.length + 1);
  });

  it("the workbook follows the project's units (US: ft, psi, gpm in the headers) and every money figure the price list's currency", async () => {
    const est = await t.signInAs('estimator');
    const admin = await t.signInAs('admin');
    const settings = {
      waste_fraction: 0.05,
      bendAngle_deg: 30,
      other: [{ code: 'other/trenching', description: 'Trenching', unit: 'm', per_pipe_m: 1 }],
      labour_hours: 10,
      labour_rate: 40,
      markup_fraction: 0.1,
      tax_fraction: 0.05,
    };
    const read = async () => {
      const book = new ExcelJS.Workbook();
      await book.xlsx.load((await est.get(`${base}/export.xlsx`).buffer(true).parse(binaryBody).expect(200)).body);
      return book;
    };
    const readCsv = async () =>
      Papa.parse<Record<string, string>>((await est.get(`${base}/takeoff.csv`).expect(200)).text, { header: true, skipEmptyLines: true });
    const header = (book: ExcelJS.Workbook, sheet: string) => (book.getWorksheet(sheet)!.getRow(1).values as unknown[]).slice(1).map(String);
    const column = (book: ExcelJS.Workbook, sheet: string, title: RegExp) => {
      const ws = book.getWorksheet(sheet)!;
      const i = header(book, sheet).findIndex((h) => title.test(h)) + 1;
      expect(i, `${sheet} ${title}`).to.be.above(0);
      const out = new Map<string, unknown>();
      ws.eachRow((row, n) => {
        if (n > 1 && row.getCell(1).value) out.set(String(row.getCell(1).value), row.getCell(i).value);
      });
      return out;
    };
    try {
      await est.put(`${base}/takeoff/settings`, { ...settings, currency: 'NZD' }).expect(200);
      expect((await est.get(`${base}/options`).expect(200)).body.currency).to.equal('NZD');
      const si = await read();
      const csvSi = await readCsv();
      await admin.patch(base, { units: 'us' }).expect(200);
      const us = await read();
      const csvUs = await readCsv();
      expect(header(si, 'Pipes')).to.include.members(['Length (m)', 'Inside diameter (mm)', 'Flow (L/s)', 'Velocity (m/s)', 'Static pressure (kPa)']);
      expect(header(us, 'Pipes')).to.include.members([
        'Length (ft)',
        'Inside diameter (in)',
        'Flow (gpm)',
        'Velocity (ft/s)',
        'Static pressure (psi)',
        'Rating (psi)',
      ]);
      expect(header(us, 'Outlets')).to.include.members(['Elevation (ft)', 'Design flow (gpm)', 'Needs (psi)', 'Pressure (psi)']);
      expect(header(us, 'Takeoff')).to.include.members(['Network length (ft)', 'With waste (ft)']);
      expect(header(us, 'Estimate')).to.include.members(['Unit price (NZD)', 'Amount (NZD)']);
      expect(header(us, 'Options')).to.include.members(['Pipe cost (NZD)', 'Total estimate (NZD)']);
      // 1 ft = 0.3048 m and 1 in = 25.4 mm exactly; 1 psi = 6.894757 kPa (NIST SP 811).
      const [lenSi, lenUs] = [column(si, 'Pipes', /^Length/), column(us, 'Pipes', /^Length/)];
      for (const [id, m] of lenSi) expect(lenUs.get(id), id).to.be.closeTo((m as number) / 0.3048, 1e-9);
      const [diaSi, diaUs] = [column(si, 'Pipes', /^Inside/), column(us, 'Pipes', /^Inside/)];
      for (const [id, mm] of diaSi) expect(diaUs.get(id), id).to.be.closeTo((mm as number) / 25.4, 1e-9);
      const [pSi, pUs] = [column(si, 'Outlets', /^Pressure/), column(us, 'Outlets', /^Pressure/)];
      for (const [id, kpa] of pSi) expect(pUs.get(id), id).to.be.closeTo((kpa as number) / 6.894757, 1e-4);
      // Pipe sold by the foot: quantity × 0.3048 is the metre figure, unit price ÷ 0.3048, amounts and total unchanged.
      const qty = (book: ExcelJS.Workbook) => column(book, 'Estimate', /^Quantity/);
      const price = (book: ExcelJS.Workbook) => column(book, 'Estimate', /^Unit price/);
      const amount = (book: ExcelJS.Workbook) =>
        new Map([...column(book, 'Estimate', /^Amount/)].map(([k, v]) => [k, (v as ExcelJS.CellFormulaValue).result as number]));
      const unit = column(us, 'Estimate', /^Unit$/);
      const siUnit = column(si, 'Estimate', /^Unit$/);
      let pipes = 0;
      for (const [code, q] of qty(si)) {
        if (siUnit.get(code) !== 'm') continue;
        pipes++;
        expect(unit.get(code), code).to.equal('ft');
        expect((qty(us).get(code) as number) * 0.3048, code).to.be.closeTo(q as number, 1e-9);
        if (price(si).get(code) !== null) {
          expect((price(us).get(code) as number) / 0.3048, code).to.be.closeTo(price(si).get(code) as number, 1e-9);
          expect(Math.abs((qty(us).get(code) as number) * (price(us).get(code) as number) - (amount(us).get(code) as number)), code).to.be.at.most(
            0.005 + 1e-9,
          );
        }
        expect(amount(us).get(code), code).to.equal(amount(si).get(code));
      }
      expect(pipes).to.be.above(3);
      // The CSV follows the same units: lengths in ft, pipe sold by the foot, amounts unchanged, the currency named.
      expect(csvSi.meta.fields).to.include.members(['network_length_m', 'with_waste_m', 'currency']);
      expect(csvUs.meta.fields).to.include.members(['network_length_ft', 'with_waste_ft', 'piece_length_ft']);
      let csvPipes = 0;
      csvSi.data.forEach((row, i) => {
        const usRow = csvUs.data[i];
        expect(usRow.code).to.equal(row.code);
        expect(usRow.amount, row.code).to.equal(row.amount);
        expect(usRow.currency).to.equal('NZD');
        if (row.unit !== 'm') return;
        csvPipes++;
        expect(usRow.unit).to.equal('ft');
        expect(Number(usRow.quantity) * 0.3048, row.code).to.be.closeTo(Number(row.quantity), 1e-9);
        expect(Number(usRow.network_length_ft) * 0.3048, row.code).to.be.closeTo(Number(row.network_length_m), 1e-9);
      });
      expect(csvPipes).to.equal(pipes);
      expect(us.getWorksheet('Summary')!.getCell('B11').value).to.match(/^US customary/);
      expect(si.getWorksheet('Summary')!.getCell('B11').value).to.match(/^SI/);
    } finally {
      await admin.patch(base, { units: 'si' }).expect(200);
      await est.put(`${base}/takeoff/settings`, { ...settings, currency: 'USD' }).expect(200);
    }
  });
  it("the project's default cover (Profile tab) reaches the Options summary: a pipe over a hump passes once it is laid deeper", async () => {
    // A tank (water surface 102 m) feeds an outlet over a hump at 103 m. Hazen-Williams, 0.2 L/s in 30 mm,
    // C 150, 100 m: about 0.37 m of friction (C), so the HGL at the hump is about 101.8 m. Under 0.45 m
    // of cover (the engine default) the pipe is at 102.55 m, above the HGL; under 2 m at 101 m, below it.
    const designer = await t.signInAs('designer');
    const made = await designer.post(`${base}/options`, { name: 'Over the hump' }).expect(201);
    const hump = humpLine(103);
    await designer.patch(`${base}/options/${made.body.id}`, { document: hump }).expect(200);
    const failing = async () =>
      ((await designer.get(`${base}/options`).expect(200)).body.options as { id: string; summary: { failingChecks: number } }[]).find(
        (o) => o.id === made.body.id,
      )!.summary.failingChecks;
    const shallow = await failing();
    try {
      await designer.put(`${base}/profile-settings`, { cover_m: 2 }).expect(200);
      expect(await failing()).to.equal(shallow - 1);
    } finally {
      await designer.put(`${base}/profile-settings`, { cover_m: null }).expect(200);
      await designer.delete(`${base}/options/${made.body.id}`).expect(204);
    }
  });
});
