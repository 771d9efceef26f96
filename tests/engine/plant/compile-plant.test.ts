import { describe, expect, it } from 'vitest';
import { compilePlant, PlantSpecError } from '../../../src-main/engine/plant/index.ts';

const pendulum = {
  coordinate: 'angle',
  acceleration: '-(g/l)*sin(q) - c*v + u/(m*l^2)',
  params: { m: 0.5, l: 0.42, g: 9.81, c: 0.05 },
  energy: 'm*l^2*v^2/2 - m*g*l*cos(q)',
};

function specError(spec: unknown, where?: string): PlantSpecError {
  try {
    compilePlant(spec, where);
  } catch (e) {
    if (e instanceof PlantSpecError) return e;
    throw e;
  }
  throw new Error('expected a PlantSpecError');
}

describe('compilePlant', () => {
  it('computes the acceleration, input gain and energy gradient of the pendulum like hand-written code', () => {
    // Hand-written formulas: q'' as in the spec; d(q'')/du = 1/(m l^2); dH/dq = m g l sin q, dH/dv = m l^2 v.
    const p = compilePlant(pendulum);
    const { m, l, g, c } = pendulum.params;
    const out = new Float64Array(2);
    for (const [q, v, u, t] of [[0.3, -1.2, 0.4, 0], [2.9, 3.1, -0.2, 5], [-1, 0, 0, 1]]) {
      expect(p.accel(q, v, u, t)).toBeCloseTo(-(g / l) * Math.sin(q) - c * v + u / (m * l * l), 13);
      expect(p.inputGain(q, v, u, t)).toBeCloseTo(1 / (m * l * l), 13);
      expect(p.energy!(q, v)).toBeCloseTo((m * l * l * v * v) / 2 - m * g * l * Math.cos(q), 13);
      p.energyGrad!(q, v, out);
      expect(out[0]).toBeCloseTo(m * g * l * Math.sin(q), 13);
      expect(out[1]).toBeCloseTo(m * l * l * v, 13);
    }
    expect(p.controlAffine).toBe(true);
    expect(p.coordinate).toBe('angle');
  });

  it('builds a first-order rhs y = [q, v] that reads the input function u(t, y)', () => {
    const p = compilePlant({ coordinate: 'linear', acceleration: '-k*q + u*sin(t)', params: { k: 3 } });
    const seen: number[] = [];
    const rhs = p.rhs((t, y) => { seen.push(t, y[0], y[1]); return 2 * y[1]; });
    const y = Float64Array.of(0.5, -0.25), d = new Float64Array(2);
    rhs(1.2, y, d);
    expect([...d]).toEqual([-0.25, -3 * 0.5 + 2 * -0.25 * Math.sin(1.2)]);
    expect(seen).toEqual([1.2, 0.5, -0.25]);
    expect([...y]).toEqual([0.5, -0.25]);
    p.rhs()(0, y, d); // no input: u = 0
    expect(d[1]).toBe(-1.5);
  });

  it('tells a control-affine plant from one that is not', () => {
    const p = compilePlant({ coordinate: 'linear', acceleration: '-q + tanh(u)' });
    expect(p.controlAffine).toBe(false);
    expect(p.inputGain(0, 0, 0.5, 0)).toBeCloseTo(1 - Math.tanh(0.5) ** 2, 14); // d tanh(u)/du = 1 - tanh(u)^2 (elementary calculus)
    expect(p.energy).toBeUndefined();
  });

  it('keeps a frozen copy of the spec and does not modify its input', () => {
    const spec = structuredClone(pendulum);
    const p = compilePlant(spec);
    expect(spec).toEqual(pendulum);
    expect(p.spec).toEqual({ ...pendulum });
    expect(Object.isFrozen(p.spec)).toBe(true);
    expect(Object.isFrozen(p.params)).toBe(true);
  });

  it.each([
    [null, 'plant', 'expected an object with fields coordinate, acceleration, params, got null'],
    [[1], 'plant', 'expected an object with fields coordinate, acceleration, params, got an array'],
    [{ ...pendulum, colour: 'red' }, 'plant.colour', 'unknown field; expected one of name, coordinate, acceleration, params, energy'],
    [{ ...pendulum, coordinate: 'angular' }, 'plant.coordinate', 'expected "angle" or "linear", got "angular"'],
    [{ ...pendulum, coordinate: undefined }, 'plant.coordinate', 'expected "angle" or "linear", got undefined'],
    [{ ...pendulum, acceleration: undefined }, 'plant.acceleration', 'expected a formula (a string), got undefined'],
    [{ ...pendulum, acceleration: 42 }, 'plant.acceleration', 'expected a formula (a string), got 42'],
    [{ ...pendulum, params: [] }, 'plant.params', 'expected an object of name: number, got an array'],
    [{ ...pendulum, params: { ...pendulum.params, l: 'long' } }, 'plant.params.l', 'expected a finite number, got "long"'],
    [{ ...pendulum, params: { ...pendulum.params, l: null } }, 'plant.params.l', 'expected a finite number, got null'],
    [{ ...pendulum, params: { ...pendulum.params, q: 1 } }, 'plant.params.q', 'the name is reserved for the position'],
    [{ ...pendulum, params: { ...pendulum.params, t: 1 } }, 'plant.params.t', 'the name is reserved for time'],
    [{ ...pendulum, params: { ...pendulum.params, sin: 1 } }, 'plant.params.sin', 'the name is reserved (a function or constant of the formula language)'],
    [{ ...pendulum, params: { ...pendulum.params, 'a-b': 1 } }, 'plant.params.a-b', 'expected a parameter name (a letter or _, then letters, digits or _)'],
    [{ ...pendulum, name: 7 }, 'plant.name', 'expected a string, got 7'],
    [{ ...pendulum, energy: ['x'] }, 'plant.energy', 'expected a formula (a string), got an array'],
  ])('rejects %j at %s', (spec, field, detail) => {
    const e = specError(spec);
    expect(e.field).toBe(field);
    expect(e.message).toBe(`${field}: ${detail}`);
  });

  it('passes formula errors on with the field and the column', () => {
    const e = specError({ ...pendulum, acceleration: '-(g/l)*sin(q - c*v' }, 'rig.json');
    expect(e.field).toBe('rig.json.acceleration');
    expect(e.column).toBe(19);
    expect(e.message).toBe('rig.json.acceleration: column 19: expected ")" after the argument of sin, found end of formula');
    // The energy may read q, v and the parameters only: u is an unknown name there.
    const f = specError({ ...pendulum, energy: 'm*v^2/2 + u*q' });
    expect(f.field).toBe('plant.energy');
    expect(f.column).toBe(11);
    expect(f.message).toBe('plant.energy: column 11: expected a known name (q, v, m, l, g, c, pi), found unknown name "u"');
    const g = specError({ ...pendulum, acceleration: '-k*q' });
    expect(g.message).toBe('plant.acceleration: column 2: expected a known name (q, v, u, t, m, l, g, c, pi), found unknown name "k"');
  });

  it('accepts a parameter called __proto__ as a plain name', () => {
    const spec = JSON.parse('{"coordinate": "linear", "acceleration": "-__proto__*q", "params": {"__proto__": 4}}') as unknown;
    expect(compilePlant(spec).accel(0.5, 0, 0, 0)).toBe(-2);
  });
});
