import { describe, expect, it } from 'vitest';
import { readEnergyModel, ModelFileError } from '../../src-main/design/read-model.ts';
import { pendulumModel } from './models.ts';

const good = () => JSON.parse(JSON.stringify(pendulumModel())) as Record<string, any>;
/** A recorded range as engine/learn writes it (a pendulum swung to 30 degrees, per unit inertia). */
const COVERAGE = { energyMin: 0.4, energyMax: 3.2, qMin: -0.52, qMax: 0.52, vMaxAbs: 2.5, joulesPerModelUnit: 1 };

describe('readEnergyModel', () => {
  it('returns an equal deep copy of a good model', () => {
    const src = good();
    const m = readEnergyModel(src, 'm.json');
    expect(m).toEqual(src);
    m.coefficients[0] = 9;
    expect(src.coefficients[0]).toBe(0.5);
  });

  it('reads the recorded range when present; a file without it, or with null, has none', () => {
    const withCov = { ...good(), coverage: { ...COVERAGE } };
    expect(readEnergyModel(withCov, 'c.json').coverage).toEqual(COVERAGE);
    expect('coverage' in readEnergyModel(good(), 'old.json')).toBe(false);
    expect('coverage' in readEnergyModel({ ...good(), coverage: null }, 'n.json')).toBe(false);
  });

  const cases: [string, (m: Record<string, any>) => void, RegExp][] = [
    ['wrong format', (m) => { m.format = 'ergostat-controller-design'; }, /format: expected "ergostat-energy-model"/],
    ['no energy', (m) => { m.status = 'no-energy'; m.verdict.reason = 'noise only'; }, /status: the model holds no conserved energy \("no-energy": noise only\)/],
    ['coordinate', (m) => { m.coordinate = 'polar'; }, /coordinate: expected "angle" or "linear"/],
    ['term kind', (m) => { m.library.terms[0] = { kind: 'poly' }; }, /library\.terms\[0\]\.kind/],
    ['trig on a linear model', (m) => { m.coordinate = 'linear'; }, /library\.terms\[1\]: trigonometric terms need an angle/],
    ['user term', (m) => { m.library.terms[0] = { kind: 'user', source: 'v^2 + w' }; }, /library\.terms\[0\]\.source/],
    ['coefficient count', (m) => { m.coefficients.pop(); }, /coefficients: expected 2 numbers/],
    ['coefficient value', (m) => { m.coefficients[1] = 'big'; }, /coefficients\[1\]: expected a finite number/],
    ['offset', (m) => { m.offset = null; }, /offset: expected a finite number/],
    ['units', (m) => { m.units = 'kJ'; }, /units: expected "J" or "J\/kg"/],
    ['period', (m) => { m.damping.period = 0; }, /damping\.period: expected a positive period/],
    ['mass', (m) => { m.scale.mass = -1; }, /scale\.mass: expected a positive mass or null/],
    ['well index', (m) => { m.landscape.wells[0].index = 3; }, /landscape\.wells\[0\]\.index: expected 1/],
    ['barrier well', (m) => { m.landscape.barriers[0].between = [1, 2]; }, /landscape\.barriers\[0\]\.between\[1\]/],
    ['separable flag', (m) => { m.structure.separable = 'yes'; }, /structure\.separable/],
    ['coverage kind', (m) => { m.coverage = [1, 2]; }, /coverage: expected an object, got \[1,2\]/],
    ['coverage energy', (m) => { m.coverage = { ...COVERAGE, energyMax: Infinity }; }, /coverage\.energyMax: expected a finite number, got null/],
    ['coverage order', (m) => { m.coverage = { ...COVERAGE, energyMin: 9 }; }, /coverage\.energyMax: must be at least coverage\.energyMin \(9\), got 3\.2/],
    ['coverage positions', (m) => { m.coverage = { ...COVERAGE, qMax: -1 }; }, /coverage\.qMax: must be at least coverage\.qMin \(-0\.52\), got -1/],
    ['coverage speed', (m) => { m.coverage = { ...COVERAGE, vMaxAbs: -2 }; }, /coverage\.vMaxAbs: expected a speed >= 0, got -2/],
    ['coverage missing field', (m) => { m.coverage = { ...COVERAGE, qMin: undefined }; }, /coverage\.qMin: expected a finite number, got undefined/],
    ['coverage scale', (m) => { m.coverage = { ...COVERAGE, joulesPerModelUnit: -1 }; }, /coverage\.joulesPerModelUnit: expected a positive scale, got -1/],
  ];
  for (const [name, spoil, msg] of cases) {
    it(`rejects a bad field, naming it: ${name}`, () => {
      const m = good();
      spoil(m);
      expect(() => readEnergyModel(m, 'm.json')).toThrow(ModelFileError);
      expect(() => readEnergyModel(m, 'm.json')).toThrow(msg);
    });
  }
});
