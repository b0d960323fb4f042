/** New elements' defaults: round numbers in the project's unit system, stored SI. */
import { expect } from 'chai';
import { formatQuantity, UnitSystem } from '../../engine/units';
import { createEditor } from '../../client/src/app/screens/layout/create-editor';
import { LINK_KINDS, NODE_KINDS } from '../../client/src/app/screens/layout/kinds';

describe('Layout editor: defaults of new elements per unit system', () => {
  const cases: { units: UnitSystem; shown: Record<string, string> }[] = [
    // 1 psi = 6.894757 kPa (NIST SP 811, Appendix B); 1 US gal = 3.785411784 L; 1 ft = 0.3048 m.
    {
      units: 'si',
      shown: {
        'outlet.min_pressure_m': '70 kPa',
        'outlet.demand_m3s': '0.300 L/s',
        'tank.diameter_m': '1.6 m',
        'tank.max_level_m': '1.50 m',
        'pump.flow_m3s': '0.200 L/s',
        'valve.diameter_m': '25.0 mm',
      },
    },
    {
      units: 'us',
      shown: {
        'outlet.min_pressure_m': '10.0 psi',
        'outlet.demand_m3s': '5.00 gpm',
        'tank.diameter_m': '5 ft',
        'tank.max_level_m': '5.0 ft',
        'pump.flow_m3s': '3.00 gpm',
        'valve.diameter_m': '1.000 in',
      },
    },
  ];
  const quantity: Record<string, Parameters<typeof formatQuantity>[0]> = {
    min_pressure_m: 'pressure',
    demand_m3s: 'flow',
    diameter_m: 'length',
    max_level_m: 'head',
    flow_m3s: 'flow',
  };
  for (const c of cases) {
    it(`${c.units}: outlet, tank, pump and valve defaults read as round numbers`, () => {
      const records: Record<string, Record<string, unknown>> = {
        outlet: NODE_KINDS.outlet.create('O1', 0, 0, c.units) as never,
        tank: NODE_KINDS.tank.create('T1', 0, 0, c.units) as never,
        pump: LINK_KINDS.pump.create('Pu1', 'a', 'b', [], c.units) as never,
        valve: LINK_KINDS.valve.create('V1', 'a', 'b', [], c.units) as never,
      };
      for (const [path, text] of Object.entries(c.shown)) {
        const [kind, key] = path.split('.');
        const q = kind === 'valve' ? 'diameter' : quantity[key];
        expect(formatQuantity(q, records[kind][key] as number, c.units), path).to.equal(text);
      }
    });
  }

  it('the old SI outlet default (7 m of water) showed 68.6 kPa; the new one is 70 kPa, stored in metres of water', () => {
    expect(formatQuantity('pressure', 7, 'si', 1)).to.equal('68.6 kPa');
    const o = NODE_KINDS.outlet.create('O1', 0, 0, 'si') as { min_pressure_m: number };
    expect(o.min_pressure_m).to.be.closeTo(70 / 9.80665, 1e-12); // 1 m of water = 9.80665 kPa (standard gravity, CGPM 1901)
  });

  it('US defaults are stored as the exact SI of the round US figure (NIST SP 811: 1 psi = 6894.757 Pa, 1 gal = 3.785411784 L, 1 ft = 0.3048 m)', () => {
    const outlet = NODE_KINDS.outlet.create('O1', 0, 0, 'us') as { min_pressure_m: number; demand_m3s: number };
    const tank = NODE_KINDS.tank.create('T1', 0, 0, 'us') as { diameter_m: number; max_level_m: number };
    const valve = LINK_KINDS.valve.create('V1', 'a', 'b', [], 'us') as { diameter_m: number };
    // 10 psi = 68,947.57 Pa ÷ (1000 kg/m³ · 9.80665 m/s²) = 7.0307 m of water (C)
    expect(outlet.min_pressure_m).to.be.closeTo(68947.57293168 / 9806.65, 1e-9);
    expect(outlet.demand_m3s).to.be.closeTo((5 * 3.785411784e-3) / 60, 1e-15); // 5 gpm = 0.31545 L/s
    expect(tank.diameter_m).to.be.closeTo(5 * 0.3048, 1e-12);
    expect(tank.max_level_m).to.be.closeTo(5 * 0.3048, 1e-12);
    expect(valve.diameter_m).to.be.closeTo(0.0254, 1e-12);
  });

  it('the editor places elements with its project units', () => {
    const ed = createEditor();
    ed.units = 'us';
    const id = ed.placeNode('outlet', { x: 0, y: 0 })!;
    const o = ed.store.doc.nodes.find((n) => n.id === id) as { min_pressure_m: number };
    expect(formatQuantity('pressure', o.min_pressure_m, 'us')).to.equal('10.0 psi');
  });
});
