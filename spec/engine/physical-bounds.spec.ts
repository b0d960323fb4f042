import { expect } from 'chai';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { solve } from '../../engine/steady';
import { validateDocument } from '../../engine/validate';

// Inputs that cannot be physical are refused at the door, naming element and field, before any
// solve (they used to give nulls and messages naming nothing). The bounds live in engine/bounds.ts.
const doc = () =>
  ({
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    nodes: [
      { id: 'S1', kind: 'source', elevation_m: 50, head_m: 50 },
      { id: 'T1', kind: 'tank', elevation_m: 40, diameter_m: 2, level_m: 1, min_level_m: 0.1, max_level_m: 2 },
      { id: 'J1', kind: 'tee', elevation_m: 10, demand_m3s: 0.001 },
      { id: 'O1', kind: 'outlet', elevation_m: 5, demand_m3s: 0.001 },
    ],
    links: [
      { id: 'P1', kind: 'pipe', from: 'S1', to: 'J1', length_m: 100, diameter_m: 0.05, roughness: 150 },
      { id: 'P2', kind: 'pipe', from: 'J1', to: 'O1', length_m: 100, diameter_m: 0.05, roughness: 150 },
      { id: 'PU', kind: 'pump', from: 'J1', to: 'T1', flow_m3s: 0.001, control: { tank: 'T1', stop_level_m: 1.9, start_level_m: 1 } },
    ],
  }) as { nodes: Record<string, unknown>[]; links: Record<string, unknown>[]; [k: string]: unknown };

type Doc = ReturnType<typeof doc>;
const messages = (d: Doc): string[] => validateDocument(d).map((w) => w.message);
const node = (d: Doc, id: string) => d.nodes.find((n) => n['id'] === id)!;
const link = (d: Doc, id: string) => d.links.find((l) => l['id'] === id)!;

describe('physical bounds (engine/bounds.ts): impossible input is refused naming element and field', () => {
  it('the base document is valid and solves', () => {
    expect(validateDocument(doc())).to.deep.equal([]);
    expect(solve(doc()).converged).to.equal(true);
  });

  const cases: [string, (d: Doc) => void, string][] = [
    [
      'pipe length 1e308',
      (d) => {
        link(d, 'P1')['length_m'] = 1e308;
      },
      'P1.length_m: must be at most 100000 m (got 1e+308)',
    ],
    [
      'demand 1e308',
      (d) => {
        node(d, 'O1')['demand_m3s'] = 1e308;
      },
      'O1.demand_m3s: must be at most 10 m³/s (got 1e+308)',
    ],
    [
      'source head 1e308',
      (d) => {
        node(d, 'S1')['head_m'] = 1e308;
      },
      'S1.head_m: must be at most 10000 m (got 1e+308)',
    ],
    [
      'pump flow 1e308',
      (d) => {
        link(d, 'PU')['flow_m3s'] = 1e308;
      },
      'PU.flow_m3s: must be at most 10 m³/s (got 1e+308)',
    ],
    [
      'elevation 1e300',
      (d) => {
        node(d, 'J1')['elevation_m'] = 1e300;
      },
      'J1.elevation_m: must be at most 9000 m (got 1e+300)',
    ],
    [
      'elevation −1e308',
      (d) => {
        node(d, 'J1')['elevation_m'] = -1e308;
      },
      'J1.elevation_m: must be at least -500 m (got -1e+308)',
    ],
    [
      'diameter 1e-300',
      (d) => {
        link(d, 'P1')['diameter_m'] = 1e-300;
      },
      'P1.diameter_m: must be at least 0.0005 m (got 1e-300)',
    ],
    [
      'diameter 1e200',
      (d) => {
        link(d, 'P1')['diameter_m'] = 1e200;
      },
      'P1.diameter_m: must be at most 5 m (got 1e+200)',
    ],
    [
      'roughness 1e308',
      (d) => {
        link(d, 'P1')['roughness'] = 1e308;
      },
      'P1.roughness: must be at most 200 (got 1e+308)',
    ],
    [
      'tank diameter 1e300',
      (d) => {
        node(d, 'T1')['diameter_m'] = 1e300;
      },
      'T1.diameter_m: must be at most 200 m (got 1e+300)',
    ],
    [
      'closed: "false" as a string',
      (d) => {
        link(d, 'P1')['closed'] = 'false';
      },
      'P1.closed: must be true or false (got "false")',
    ],
    [
      'a demand model on a tee',
      (d) => {
        node(d, 'J1')['demand_model'] = { type: 'emitter', k: 0.001, exponent: 0.5 };
      },
      'J1.demand_model: a tee has no demand model (make it an outlet)',
    ],
    [
      'a control stop level above the tank maximum',
      (d) => {
        link(d, 'PU')['control'] = { tank: 'T1', stop_level_m: 2.5, start_level_m: 1 };
      },
      "PU.control.stop_level_m: must not exceed T1's max_level_m 2 (got 2.5)",
    ],
    [
      'a bend point of junk',
      (d) => {
        link(d, 'P1')['vertices'] = [
          [0, 0],
          ['a', 1],
        ];
      },
      'P1.vertices[1][0]: must be a number (got "a")',
    ],
    [
      'Hazen-Williams C of 0.5',
      (d) => {
        link(d, 'P1')['roughness'] = 0.5;
      },
      'P1.roughness: must be at least 1 for Hazen-Williams (C) (got 0.5)',
    ],
  ];
  for (const [what, change, message] of cases) {
    it(`${what} → "${message}"`, () => {
      const d = doc();
      change(d);
      expect(messages(d)).to.deep.equal([message]);
      const result = solve(d);
      expect(result.converged).to.equal(false);
      expect(result.warnings.map((w) => w.message)).to.deep.equal([message]);
    });
  }

  it('Darcy-Weisbach roughness is millimetres: 150 mm is refused, 0.0015 mm (plastic) accepted', () => {
    const d = doc();
    d['headloss'] = 'darcy-weisbach';
    expect(messages(d)).to.deep.equal([
      'P1.roughness: must be at most 100 mm for Darcy-Weisbach (mm) (got 150)',
      'P2.roughness: must be at most 100 mm for Darcy-Weisbach (mm) (got 150)',
    ]);
    link(d, 'P1')['roughness'] = 0.0015;
    link(d, 'P2')['roughness'] = 0.0015;
    expect(messages(d)).to.deep.equal([]);
  });

  it('the CLI exits 2 naming element and field', () => {
    const dir = mkdtempSync(join(tmpdir(), 'runnel-bounds-'));
    const file = join(dir, 'bad.json');
    const d = doc();
    link(d, 'P1')['length_m'] = 1e308;
    writeFileSync(file, JSON.stringify(d));
    const run = spawnSync(process.execPath, ['--import', 'tsx', 'engine/cli.ts', file], { encoding: 'utf8', cwd: new URL('../..', import.meta.url).pathname });
    expect(run.status).to.equal(2);
    expect(run.stderr.trim()).to.equal('P1.length_m: must be at most 100000 m (got 1e+308)');
  });
});
